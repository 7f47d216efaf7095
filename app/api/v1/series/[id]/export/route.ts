import { notFound, withActor } from "@/lib/http/respond";
import { getSeriesDetail } from "@/lib/queries/series-detail";
import { seriesCsv } from "@/lib/queries/seriesCsv";
import { isUuid } from "@/lib/ids";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

/** GET /api/v1/series/{id}/export — the series table and its fits as CSV. */
export const GET = withActor<{ params: Promise<{ id: string }> }>(async (_request, { actor, params }) => {
  const { id } = await params;
  const series = isUuid(id) ? await getSeriesDetail(actor, id) : null;
  if (!series) throw notFound(`series ${id.slice(0, 80)}`);
  const slug =
    series.name
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-|-$/g, "") || "series";
  return new Response(seriesCsv(series), {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="${slug}.csv"`,
      "Cache-Control": "no-store",
    },
  });
});
