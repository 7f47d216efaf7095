import { withActor } from "@/lib/http/respond";
import { COLUMNS_MEDIA_TYPE } from "@/lib/spectrum-view/columnsFormat";
import { dataPayload, dataQuerySchema, findViewRun, parseViewQuery } from "@/lib/spectrum-view/viewData";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/**
 * GET /api/v1/spectra/{id}/data?axis=nm|ev|cm-1[&run=RUN_ID][&format=json|binary] — the curves of
 * the latest finished analysis (or of the run named) as columnar arrays: JSON {x, series: {raw,
 * smoothed, reference, difference}}, or the same in the binary columns format (columnsFormat.ts).
 */
export const GET = withActor<{ params: Promise<{ id: string }> }>(async (request, { actor, params }) => {
  const { id } = await params;
  const query = parseViewQuery(dataQuerySchema, request.url);
  const { spectrum, run } = await findViewRun(actor, id, query.run);
  const etag = `"${run.id}-${query.axis}-${query.format}-v1"`;
  const headers = { ETag: etag, "Cache-Control": "private, no-cache", Vary: "Authorization, Cookie" };
  if (request.headers.get("if-none-match") === etag) return new Response(null, { status: 304, headers });
  const { body, cache } = await dataPayload(spectrum, run, query.axis, query.format);
  const contentType = query.format === "binary" ? COLUMNS_MEDIA_TYPE : "application/json; charset=utf-8";
  return new Response(body as Uint8Array<ArrayBuffer>, {
    status: 200,
    headers: { ...headers, "Content-Type": contentType, "Content-Length": String(body.length), "X-Bandkeep-Cache": cache },
  });
});
