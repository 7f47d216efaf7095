import { NextResponse } from "next/server";
import { isJson } from "@/lib/http/mediaType";
import { revalidatePath } from "next/cache";
import { notFound, withActor } from "@/lib/http/respond";
import { Refusal } from "@/lib/errors";
import { getSignatureReview } from "@/lib/queries/review";
import { decideSignatures, undoDecisions } from "@/lib/review/decide";
import { decisionSchema } from "@/lib/review/schemas";
import { z } from "zod";
import { isUuid } from "@/lib/ids";

const undoBodySchema = z
  .object({ undo: z.string().trim().uuid("undo must be the id (UUID) of a decision in this signature's history") })
  .strict();

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string }> };

/** GET /api/v1/signatures/{id}/decisions — the signature's state and its decision history, newest first. */
export const GET = withActor<Ctx>(async (_request, { actor, params }) => {
  const { id } = await params;
  const review = isUuid(id) ? await getSignatureReview(actor, id) : null;
  if (!review) throw notFound(`signature ${id.slice(0, 80)}`);
  return NextResponse.json(
    { id: review.id, reviewState: review.reviewState, supersededBy: review.supersededBy, history: review.history },
    { headers: { "Cache-Control": "no-store" } },
  );
});

/**
 * POST /api/v1/signatures/{id}/decisions — a group lead confirms or dismisses (or revises) with a
 * comment, or sends {"undo": reviewId} to take back the latest decision. A decision equal to the
 * current state records nothing (200, unchanged); a flag replaced by a newer run is refused (409).
 */
export const POST = withActor<Ctx>(async (request, { actor, params }) => {
  const { id } = await params;
  // The caller first: another group's id is not found, a member who is not its lead is refused.
  const review = isUuid(id) ? await getSignatureReview(actor, id) : null;
  if (!review) throw notFound(`signature ${id.slice(0, 80)}`);
  if (review.supersededBy) {
    throw new Refusal(
      409,
      "conflict",
      `This flag was replaced by a newer analysis (run ${review.supersededBy.runId.slice(0, 8)}); decide on ${review.supersededBy.matchId ? `signature ${review.supersededBy.matchId}` : "the newer run's flags"}.`,
    );
  }
  if (!review.mayDecide)
    throw new Refusal(403, "forbidden", "Only a lead of the group that owns the spectrum can confirm or dismiss its signatures.");
  if (!isJson(request)) {
    throw new Refusal(415, "unsupported-media-type", 'Send the decision as JSON: {"decision": "confirmed" | "dismissed", "comment": "…"}.');
  }
  let body: unknown;
  try {
    body = await request.json();
  } catch {
    throw new Refusal(400, "invalid", "The body is not valid JSON.");
  }
  const undo = undoBodySchema.safeParse(body ?? {});
  if (undo.success) {
    if (!review.history.some((h) => h.id === undo.data.undo))
      throw new Refusal(404, "not-found", `decision ${undo.data.undo} of signature ${id} was not found`, "undo");
    const { outcomes, mailed } = await undoDecisions(actor, [undo.data.undo]);
    revalidatePath("/review", "layout");
    const o = outcomes[0]!;
    return NextResponse.json({ ...o, reviewState: o.decision, uploaderMailed: mailed > 0 }, { status: 201 });
  }
  const input = decisionSchema.parse(body ?? {});
  const { outcomes, mailed } = await decideSignatures(actor, [id], input.decision, input.comment);
  revalidatePath("/review", "layout");
  const o = outcomes[0]!;
  // A decision equal to the current state records nothing: 200 with unchanged = true.
  return NextResponse.json({ ...o, reviewState: o.decision, uploaderMailed: mailed > 0 }, { status: o.unchanged ? 200 : 201 });
});
