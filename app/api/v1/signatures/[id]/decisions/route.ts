import { NextResponse } from "next/server";
import { isJson } from "@/lib/http/mediaType";
import { revalidatePath } from "next/cache";
import { ApiError, notFound, withActor } from "@/lib/http/respond";
import { getSignatureReview } from "@/lib/queries/review";
import { reviewApiError } from "@/lib/review/apiErrors";
import { decideSignatures } from "@/lib/review/decide";
import { decisionSchema } from "@/lib/review/schemas";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
type Ctx = { params: Promise<{ id: string }> };

/** GET /api/v1/signatures/{id}/decisions — the signature's state and its decision history, newest first. */
export const GET = withActor<Ctx>(async (_request, { actor, params }) => {
  const { id } = await params;
  const review = UUID.test(id) ? await getSignatureReview(actor, id) : null;
  if (!review) throw notFound(`signature ${id.slice(0, 80)}`);
  return NextResponse.json({ id: review.id, reviewState: review.reviewState, history: review.history }, { headers: { "Cache-Control": "no-store" } });
});

/** POST /api/v1/signatures/{id}/decisions — a group lead confirms or dismisses (or revises) with a comment. */
export const POST = withActor<Ctx>(async (request, { actor, params }) => {
  const { id } = await params;
  // The caller first: another group's id is not found, a member who is not its lead is refused.
  const review = UUID.test(id) ? await getSignatureReview(actor, id) : null;
  if (!review) throw notFound(`signature ${id.slice(0, 80)}`);
  if (!review.mayDecide) throw new ApiError(403, "forbidden", "Only a lead of the group that owns the spectrum can confirm or dismiss its signatures.");
  if (!isJson(request)) {
    throw new ApiError(415, "unsupported-media-type", "Send the decision as JSON: {\"decision\": \"confirmed\" | \"dismissed\", \"comment\": \"…\"}.");
  }
  let body: unknown;
  try {
    body = await request.json();
  } catch {
    throw new ApiError(400, "invalid", "The body is not valid JSON.");
  }
  const input = decisionSchema.parse(body ?? {});
  try {
    const { outcomes, mailed } = await decideSignatures(actor, [id], input.decision, input.comment);
    revalidatePath("/review");
    revalidatePath(`/review/${id}`);
    const o = outcomes[0]!;
    return NextResponse.json({ ...o, reviewState: o.decision, uploaderMailed: mailed > 0 }, { status: 201 });
  } catch (error) {
    throw reviewApiError(error);
  }
});
