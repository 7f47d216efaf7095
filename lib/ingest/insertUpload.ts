import { QueryTypes } from "sequelize";
import { sequelize } from "@/lib/db";
import { ENGINE_VERSION } from "@/lib/engine/version";
import type { IngestContext } from "./prepareIngest";
import { readChoiceOf, type AnalysisParameters } from "./parameters";

/** What spectra.read_options holds: the read choice without the column (kept in column_choice). */
export function storedReadOptions(parameters: AnalysisParameters) {
  const { column: _column, ...rest } = readChoiceOf(parameters);
  return rest;
}

/*
 * The spectrum, its first analysis run and the audit event of the upload, in one statement:
 * one round trip, and atomic like a transaction (a unique-key clash on (project, sha256, trace) undoes
 * all three and surfaces as Sequelize's UniqueConstraintError).
 */
const INSERT_UPLOAD_SQL = `
WITH spectrum AS (
  INSERT INTO spectra (project_id, sample_id, series_id, series_value, reference_spectrum_id, technique, file_name, object_key,
                       sha256, size_bytes, content_type, column_choice, path_length_cm, excitation_nm, solvent, material,
                       status, uploaded_by, read_options, trace_key)
  VALUES ($1, $2, $3, $4, $5, $6::text, $7, $8, $9, $10, $11, $12, $13, $14, $15, $16, 'queued', $17, $23::jsonb, $24)
  RETURNING id
),
run AS (
  INSERT INTO analysis_runs (spectrum_id, reference_spectrum_id, engine_version, parameter_hash, parameters, status, requested_by)
  SELECT spectrum.id, $5, $18, $19, $20::jsonb, 'queued', $17 FROM spectrum
  RETURNING id, spectrum_id
),
audit AS (
  INSERT INTO audit_events (actor_id, actor_label, group_id, action, target_type, target_id, details)
  SELECT $17, $21, $22, 'spectrum.upload', 'spectrum', run.spectrum_id::text,
         jsonb_build_object('fileName', $7::text, 'sha256', $9::text, 'sizeBytes', $10::bigint, 'contentType', $11::text, 'runId', run.id, 'traceKey', $24::text)
    FROM run
)
SELECT spectrum_id AS "spectrumId", id AS "runId" FROM run`;

export type UploadRow = {
  context: IngestContext;
  fileName: string;
  objectKey: string;
  sha256: string;
  sizeBytes: number;
  contentType: string;
  parameterHash: string;
  /** Which trace of the file (lib/ingest/traceKey.ts); '' for the default reading. */
  traceKey: string;
};

/** Writes the rows of one stored upload; returns the new spectrum's and run's ids. */
export async function insertUpload(row: UploadRow): Promise<{ spectrumId: string; runId: string }> {
  const { context } = row;
  const { metadata, parameters } = context;
  const [ids] = await sequelize().query<{ spectrumId: string; runId: string }>(INSERT_UPLOAD_SQL, {
    bind: [
      context.project.id,
      context.sample?.id ?? null,
      context.series?.id ?? null,
      metadata.seriesValue ?? null,
      context.reference?.id ?? null,
      metadata.technique,
      row.fileName,
      row.objectKey,
      row.sha256,
      row.sizeBytes,
      row.contentType,
      parameters.column === undefined ? null : String(parameters.column),
      metadata.pathLengthCm ?? null,
      metadata.excitationNm ?? null,
      context.solvent,
      parameters.material ?? context.sample?.material ?? null,
      context.actor.id,
      ENGINE_VERSION,
      row.parameterHash,
      JSON.stringify(parameters),
      context.actor.email,
      context.project.groupId,
      JSON.stringify(storedReadOptions(parameters)),
      row.traceKey,
    ],
    type: QueryTypes.SELECT,
  });
  if (!ids) throw new Error("the upload's rows were not written");
  return ids;
}
