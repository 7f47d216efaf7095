import { selectRows } from "@/lib/db";
import type { Actor } from "@/lib/auth/actor";
import { canReadSeries, canWrite, memberGroupIds } from "@/lib/auth/access";
import type { AnalysisReport } from "@/lib/engine";
import { analyseSeries, type SeriesFits } from "@/lib/series/analyseSeries";
import { pointMetrics } from "@/lib/series/pointMetrics";
import { CURRENT_SIGNATURE } from "@/lib/review/counts";
import { Project, Series } from "@/models";

export type SeriesPoint = {
  spectrumId: string;
  fileName: string;
  value: number | null;
  status: string;
  technique: string;
  bleachFraction: number | null;
  quenchFraction: number | null;
  shiftMeV: number | null;
  newBandArea: number | null;
  newBandCount: number;
  /** Flags of the newest run awaiting review; null where the reader is not a member of the owning group. */
  awaitingReview: number | null;
};

export type SeriesDetail = {
  id: string;
  name: string;
  kind: string;
  variableName: string;
  variableUnit: string;
  projectId: string;
  projectName: string;
  groupId: string;
  mayWrite: boolean;
  points: SeriesPoint[];
  fits: SeriesFits;
};

/**
 * One row per spectrum of a series (numbers from each spectrum's latest finished run),
 * ordered by the variable. No access check: callers decide who may see the series
 * (getSeriesDetail below for members and collaborators, lib/stewardship/shareLinks.ts for links).
 */
export async function getSeriesPoints(seriesId: string, options: { withReview: boolean }): Promise<SeriesPoint[]> {
  const rows = await selectRows<{
    id: string;
    file_name: string;
    series_value: number | null;
    status: string;
    technique: string;
    reference_spectrum_id: string | null;
    report: Pick<AnalysisReport, "flags" | "peaks" | "firstExciton" | "referenceFirstExciton"> | null;
    awaiting: string;
  }>(
    `SELECT s.id, s.file_name, s.series_value, s.status, s.technique, s.reference_spectrum_id,
       CASE WHEN run.report IS NULL THEN NULL ELSE jsonb_build_object('flags', run.report->'flags', 'peaks', run.report->'peaks',
         'firstExciton', run.report->'firstExciton', 'referenceFirstExciton', run.report->'referenceFirstExciton') END AS report,
       (SELECT count(*) FROM signatures g WHERE g.spectrum_id = s.id AND ${CURRENT_SIGNATURE} AND g.review_state = 'awaiting') AS awaiting
     FROM spectra s
     LEFT JOIN LATERAL (SELECT r.id, r.report FROM analysis_runs r WHERE r.spectrum_id = s.id AND r.status = 'done' ORDER BY r.created_at DESC LIMIT 1) run ON true
     WHERE s.series_id = :id
     ORDER BY s.series_value NULLS LAST, s.created_at`,
    { id: seriesId },
  );
  const referenced = new Set(rows.map((r) => r.reference_spectrum_id).filter(Boolean));
  return rows.map((r) => ({
    spectrumId: r.id,
    fileName: r.file_name,
    value: r.series_value,
    status: r.status,
    technique: r.technique,
    ...pointMetrics(r.report, r.reference_spectrum_id === null && referenced.has(r.id), r.technique),
    awaitingReview: options.withReview ? Number(r.awaiting) : null,
  }));
}

/** A series with one row per spectrum (numbers from each spectrum's latest run), ordered by the variable, and its fits. */
export async function getSeriesDetail(actor: Actor, id: string): Promise<SeriesDetail | null> {
  const series = await Series.findByPk(id);
  if (!series || !(await canReadSeries(actor, series))) return null;
  const project = await Project.findByPk(series.projectId);
  const points = await getSeriesPoints(series.id, { withReview: project !== null && memberGroupIds(actor).includes(project.groupId) });
  return {
    id: series.id,
    name: series.name,
    kind: series.kind,
    variableName: series.variableName,
    variableUnit: series.variableUnit,
    projectId: series.projectId,
    projectName: project?.name ?? "",
    groupId: project?.groupId ?? "",
    mayWrite: project ? canWrite(actor, project.groupId) : false,
    points,
    fits: analyseSeries(points),
  };
}
