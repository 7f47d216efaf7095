import { QueryTypes } from "sequelize";
import { sequelize } from "@/lib/db";
import type { AnalysisParameters } from "@/lib/ingest/parameters";
import type { ReadChoice, Technique } from "@/lib/engine";

/** A run with what the worker needs of its spectrum and of its reference, read in one query. */
export type RunToAnalyse = {
  runId: string;
  spectrumId: string;
  status: "queued" | "running" | "done" | "failed";
  parameters: AnalysisParameters | null;
  referenceSpectrumId: string | null;
  spectrum: { fileName: string; technique: Technique; objectKey: string };
  /** Null when the run names a reference that no longer exists. */
  reference: {
    fileName: string;
    technique: Technique;
    objectKey: string;
    columnChoice: string | null;
    readOptions: ReadChoice | null;
  } | null;
};

type Row = {
  run_id: string;
  spectrum_id: string;
  status: RunToAnalyse["status"];
  parameters: AnalysisParameters | null;
  reference_spectrum_id: string | null;
  file_name: string;
  technique: Technique;
  object_key: string;
  ref_file_name: string | null;
  ref_technique: Technique | null;
  ref_object_key: string | null;
  ref_column_choice: string | null;
  ref_read_options: ReadChoice | null;
};

export async function loadRun(runId: string): Promise<RunToAnalyse | null> {
  const rows = await sequelize().query<Row>(
    `SELECT r.id AS run_id, r.spectrum_id, r.status, r.parameters, r.reference_spectrum_id,
            s.file_name, s.technique, s.object_key,
            ref.file_name AS ref_file_name, ref.technique AS ref_technique, ref.object_key AS ref_object_key, ref.column_choice AS ref_column_choice,
            ref.read_options AS ref_read_options
       FROM analysis_runs r
       JOIN spectra s ON s.id = r.spectrum_id
       LEFT JOIN spectra ref ON ref.id = r.reference_spectrum_id
      WHERE r.id = $1`,
    { bind: [runId], type: QueryTypes.SELECT },
  );
  const row = rows[0];
  if (!row) return null;
  return {
    runId: row.run_id,
    spectrumId: row.spectrum_id,
    status: row.status,
    parameters: row.parameters,
    referenceSpectrumId: row.reference_spectrum_id,
    spectrum: { fileName: row.file_name, technique: row.technique, objectKey: row.object_key },
    reference: row.ref_object_key
      ? {
          fileName: row.ref_file_name!,
          technique: row.ref_technique!,
          objectKey: row.ref_object_key,
          columnChoice: row.ref_column_choice,
          readOptions: row.ref_read_options,
        }
      : null,
  };
}

/** Marks the run running and its spectrum analysing, in one statement. */
export async function markRunning(runId: string, spectrumId: string, startedAt: Date): Promise<void> {
  await sequelize().query(
    `WITH run AS (
       UPDATE analysis_runs SET status = 'running', started_at = $3, updated_at = now()
        WHERE id = $1 AND status IN ('queued', 'running')
     )
     UPDATE spectra SET status = 'analysing', updated_at = now()
      WHERE id = $2 AND status IN ('received', 'queued', 'analysing')`,
    { bind: [runId, spectrumId, startedAt] },
  );
}
