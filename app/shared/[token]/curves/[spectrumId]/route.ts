import { z } from "zod";
import { Refusal } from "@/lib/errors";
import { DISPLAY_AXES } from "@/lib/spectrum-view/axis";
import { COLUMNS_MEDIA_TYPE } from "@/lib/spectrum-view/columnsFormat";
import { exportFile } from "@/lib/spectrum-view/exportFile";
import { dataPayload, getRunReport, viewArraysOf } from "@/lib/spectrum-view/viewData";
import { resolveShareLink, spectrumThroughLink } from "@/lib/stewardship/shareLinks";
import { AnalysisRun } from "@/models";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

// GET /shared/{token}/curves/{spectrumId}?format=binary|csv|jcamp[&axis=nm|ev|cm-1][&series=…] —
// the processed curves of a spectrum's latest finished analysis through a read-only share link:
// the chart's data (binary columns) and the processed downloads (CSV of every curve, one curve
// as JCAMP-DX), written by the same code as the signed-in downloads. The link must be in force
// and the spectrum within it (its series or project, or a supernatant of a shared point);
// anything else is the same 404 as the raw route. No analysis report, no review state.

const PRIVATE = {
  "Cache-Control": "private, no-store",
  "X-Robots-Tag": "noindex, nofollow",
  "Referrer-Policy": "no-referrer",
  "X-Content-Type-Options": "nosniff",
};

const querySchema = z.object({
  format: z.enum(["binary", "csv", "jcamp"], { error: "format must be binary, csv or jcamp" }).default("binary"),
  axis: z.enum(DISPLAY_AXES, { error: "axis must be nm, ev or cm-1" }).default("nm"),
  series: z
    .enum(["raw", "smoothed", "reference", "difference"], { error: "series must be raw, smoothed, reference or difference" })
    .default("smoothed"),
});

function refused(status: number, code: string, message: string): Response {
  return Response.json({ error: { code, message } }, { status, headers: PRIVATE });
}

export async function GET(request: Request, { params }: { params: Promise<{ token: string; spectrumId: string }> }): Promise<Response> {
  const { token, spectrumId } = await params;
  const parsed = querySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!parsed.success) return refused(400, "invalid", parsed.error.issues[0]!.message);
  const query = parsed.data;
  try {
    const link = await resolveShareLink(token);
    const spectrum = link ? await spectrumThroughLink(link, spectrumId) : null;
    if (!spectrum)
      return refused(
        404,
        "not_found",
        "This link is not valid for that spectrum: it was revoked, it expired, it never existed, or the spectrum is not part of what it shares.",
      );
    const run = await AnalysisRun.findOne({
      where: { spectrumId: spectrum.id, status: "done" },
      order: [["createdAt", "DESC"]],
      attributes: ["id", "status", "parameters", "referenceSpectrumId", "engineVersion", "errorMessage"],
    });
    if (!run) return refused(409, "not-ready", "This spectrum has no finished analysis.");
    if (query.format === "binary") {
      const { body } = await dataPayload(spectrum, run, query.axis, "binary");
      return new Response(body as Uint8Array<ArrayBuffer>, {
        status: 200,
        headers: { ...PRIVATE, "Content-Type": COLUMNS_MEDIA_TYPE, "Content-Length": String(body.length) },
      });
    }
    const file = exportFile({
      format: query.format,
      spectrum,
      runId: run.id,
      report: await getRunReport(run.id),
      axis: query.axis,
      series: query.series,
      view: await viewArraysOf(spectrum, run),
    });
    return new Response(file.body, {
      status: 200,
      headers: { ...PRIVATE, "Content-Type": file.contentType, "Content-Disposition": file.disposition },
    });
  } catch (error) {
    if (error instanceof Refusal) return refused(error.status, error.code, error.message);
    console.error("shared curves failed:", error instanceof Error ? error.message : error);
    return refused(503, "unavailable", "The curves could not be read just now; try again in a minute.");
  }
}
