import { NextResponse } from "next/server";
import { isJson } from "@/lib/http/mediaType";
import { revalidatePath } from "next/cache";
import { notFound, withActor } from "@/lib/http/respond";
import { seriesForLinking, setSupernatantLink } from "@/lib/series/supernatantLinks";
import { getSupernatantReadings } from "@/lib/queries/supernatantReadings";
import { linkBodySchema, readingsQuerySchema } from "@/lib/series/supernatantSchemas";
import { parseViewQuery } from "@/lib/spectrum-view/viewData";
import { isUuid } from "@/lib/ids";
import { Refusal } from "@/lib/errors";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string }> };

/** GET /api/v1/series/{id}/supernatants?nmA=&nmX=[&pureA=&pureX=] — each point's linked supernatant read at the two wavelengths. */
export const GET = withActor<Ctx>(async (request, { actor, params }) => {
  const { id } = await params;
  if (!isUuid(id)) throw notFound(`series ${id.slice(0, 80)}`);
  const query = parseViewQuery(readingsQuerySchema, request.url);
  const readings = await getSupernatantReadings(actor, id, query);
  if (!readings) throw notFound(`series ${id}`);
  return NextResponse.json(readings, { headers: { "Cache-Control": "no-store" } });
});

/** POST /api/v1/series/{id}/supernatants — link a supernatant spectrum to a point of the series, or unlink it (pointSpectrumId null). */
export const POST = withActor<Ctx>(async (request, { actor, params }) => {
  const { id } = await params;
  if (!isUuid(id)) throw notFound(`series ${id.slice(0, 80)}`);
  await seriesForLinking(actor, id);
  if (!isJson(request)) {
    throw new Refusal(415, "unsupported-media-type", 'Send JSON: {"supernatantSpectrumId": "…", "pointSpectrumId": "…" | null}.');
  }
  let body: unknown;
  try {
    body = await request.json();
  } catch {
    throw new Refusal(400, "invalid", "The body is not valid JSON.");
  }
  const input = linkBodySchema.parse(body ?? {});
  const outcome = await setSupernatantLink(actor, id, input);
  if (outcome.changed) revalidatePath(`/series/${id}`);
  return NextResponse.json(outcome, { status: 200 });
});
