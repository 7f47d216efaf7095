import { z } from "zod";
import { withActor } from "@/lib/http/respond";
import { DISPLAY_AXES } from "@/lib/spectrum-view/axis";
import { exportFile } from "@/lib/spectrum-view/exportFile";
import { findViewRun, getRunReport, parseViewQuery, viewArraysOf } from "@/lib/spectrum-view/viewData";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

const exportQuerySchema = z.object({
  format: z.enum(["csv", "jcamp", "json"], { error: "format must be csv, jcamp or json" }),
  axis: z.enum(DISPLAY_AXES, { error: "axis must be nm, ev or cm-1" }).default("nm"),
  series: z
    .enum(["raw", "smoothed", "reference", "difference"], { error: "series must be raw, smoothed, reference or difference" })
    .default("smoothed"),
  run: z.string().uuid("run must be an analysis run id (UUID)").optional(),
});

/**
 * GET /api/v1/spectra/{id}/export?format=csv|jcamp|json[&axis=nm|ev|cm-1][&series=…][&run=RUN_ID] —
 * the processed curves as CSV, one curve as JCAMP-DX 4.24, or the stored analysis report as JSON.
 */
export const GET = withActor<{ params: Promise<{ id: string }> }>(async (request, { actor, params }) => {
  const { id } = await params;
  const query = parseViewQuery(exportQuerySchema, request.url);
  const { spectrum, run } = await findViewRun(actor, id, query.run);
  const report = await getRunReport(run.id);
  const file =
    query.format === "json"
      ? exportFile({ format: "json", spectrum, runId: run.id, report })
      : exportFile({
          format: query.format,
          spectrum,
          runId: run.id,
          report,
          axis: query.axis,
          series: query.series,
          view: await viewArraysOf(spectrum, run),
        });
  return new Response(file.body, {
    status: 200,
    headers: {
      "Content-Type": file.contentType,
      "Content-Disposition": file.disposition,
      "Cache-Control": "private, no-store",
      "X-Content-Type-Options": "nosniff",
    },
  });
});
