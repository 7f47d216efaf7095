import { selectRows } from "@/lib/db";
import type { Actor } from "@/lib/auth/actor";
import { canReadSeries } from "@/lib/auth/access";
import { Project, Series, models } from "@/models";

export type SeriesPoint = {
  spectrumId: string; fileName: string; value: number | null; status: string;
  bleachFraction: number | null; quenchFraction: number | null; shiftMeV: number | null; newBandCount: number;
};

export type SeriesDetail = { id: string; name: string; kind: string; variableName: string; variableUnit: string; projectName: string; points: SeriesPoint[] };

/** A series with one row per spectrum: the flags of each spectrum's latest run, ordered by the variable. */
export async function getSeriesDetail(actor: Actor, id: string): Promise<SeriesDetail | null> {
  models();
  const series = await Series.findByPk(id);
  if (!series || !(await canReadSeries(actor, series))) return null;
  const project = await Project.findByPk(series.projectId);
  const rows = await selectRows<{
    id: string; file_name: string; series_value: number | null; status: string;
    bleach: number | null; quench: number | null; shift: number | null; new_bands: string;
  }>(
    `SELECT s.id, s.file_name, s.series_value, s.status,
       max(g.fraction) FILTER (WHERE g.kind = 'bleach') AS bleach,
       max(g.fraction) FILTER (WHERE g.kind = 'pl-quench') AS quench,
       max(g.shift_mev) FILTER (WHERE g.kind = 'shift') AS shift,
       count(g.id) FILTER (WHERE g.kind = 'new-band') AS new_bands
     FROM spectra s
     LEFT JOIN LATERAL (SELECT r.id FROM analysis_runs r WHERE r.spectrum_id = s.id AND r.status = 'done' ORDER BY r.created_at DESC LIMIT 1) run ON true
     LEFT JOIN signatures g ON g.run_id = run.id
     WHERE s.series_id = :id
     GROUP BY s.id ORDER BY s.series_value NULLS LAST, s.created_at`, { id },
  );
  return {
    id: series.id, name: series.name, kind: series.kind, variableName: series.variableName, variableUnit: series.variableUnit,
    projectName: project?.name ?? "",
    points: rows.map((r) => ({
      spectrumId: r.id, fileName: r.file_name, value: r.series_value, status: r.status,
      bleachFraction: r.bleach, quenchFraction: r.quench, shiftMeV: r.shift, newBandCount: Number(r.new_bands),
    })),
  };
}
