import { bandRangeEv } from "./bandRangeEv";
import type { BandKind, SpectrumSearch } from "./spectrumSearchQuery";

/**
 * SQL conditions (on `spectra s` and `samples sm`, joined on s.sample_id) for a search's filters,
 * with their named replacements. Every user value travels as a replacement, never as SQL text.
 */
export type FilterSql = { conditions: string[]; params: Record<string, unknown>; needsSample: boolean };

/** A finished run that no later finished run of the same spectrum replaces. */
export const latestDoneRun = (run: string) =>
  `${run}.status = 'done' AND NOT EXISTS (SELECT 1 FROM analysis_runs later WHERE later.spectrum_id = ${run}.spectrum_id
     AND later.status = 'done' AND later.created_at > ${run}.created_at)`;

/** A flag's size in its own unit (fraction, meV or signal), as the engine wrote it. */
export const SIGNATURE_MAGNITUDE_SQL = "abs((g.details->>'magnitude')::float8)";

const BAND_PEAK: Record<BandKind, string> = {
  "first-exciton": "k.is_first_exciton",
  // the emission maximum: the highest peak of a PL spectrum's run
  emission: "s.technique = 'pl' AND NOT EXISTS (SELECT 1 FROM peaks higher WHERE higher.run_id = k.run_id AND higher.height > k.height)",
  band: "TRUE",
};

/** `%text%` for ILIKE, with the user's own % _ and \ taken literally. */
export const containsPattern = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

export function spectrumFilterSql(s: SpectrumSearch): FilterSql {
  const conditions: string[] = [];
  const params: Record<string, unknown> = {};
  let needsSample = false;
  if (s.q) {
    params.pattern = containsPattern(s.q);
    // the ARRAY(...) of matching samples lets PostgreSQL combine the two trigram indexes (BitmapOr)
    conditions.push(`((s.file_name || ' ' || s.metadata::text) ILIKE :pattern
      OR s.sample_id = ANY (ARRAY(SELECT x.id FROM samples x WHERE (x.name || ' ' || x.notes) ILIKE :pattern)))`);
  }
  if (s.project) { conditions.push("s.project_id = :project"); params.project = s.project; }
  if (s.sample) { conditions.push("s.sample_id = :sample"); params.sample = s.sample; }
  if (s.material) {
    needsSample = true;
    conditions.push("(lower(s.material) = lower(:material) OR (s.material IS NULL AND lower(sm.material) = lower(:material)))");
    params.material = s.material;
  }
  if (s.technique) { conditions.push("s.technique = :technique"); params.technique = s.technique; }
  if (s.uploader) { conditions.push("s.uploaded_by = :uploader"); params.uploader = s.uploader; }
  if (s.from) { conditions.push("s.created_at >= CAST(:from AS date)"); params.from = s.from; }
  if (s.to) { conditions.push("s.created_at < CAST(:to AS date) + 1"); params.to = s.to; }
  if (s.status) { conditions.push("s.status = :status"); params.status = s.status; }
  if (s.flag || s.review) {
    const flag: string[] = ["g.spectrum_id = s.id", latestDoneRun("r")];
    if (s.flag) { flag.push("g.kind = :flag"); params.flag = s.flag; }
    if (s.flagMin !== undefined) { flag.push(`${SIGNATURE_MAGNITUDE_SQL} >= :flagMin`); params.flagMin = s.flagMin; }
    if (s.flagSig !== undefined) { flag.push("g.significance >= :flagSig"); params.flagSig = s.flagSig; }
    if (s.review) { flag.push("g.review_state = :review"); params.review = s.review; }
    conditions.push(`EXISTS (SELECT 1 FROM signatures g JOIN analysis_runs r ON r.id = g.run_id WHERE ${flag.join(" AND ")})`);
  }
  if (s.band && s.bandMin !== undefined && s.bandMax !== undefined) {
    const { minEv, maxEv } = bandRangeEv(s.bandMin, s.bandMax, s.bandUnit);
    Object.assign(params, { bandMinEv: minEv, bandMaxEv: maxEv });
    conditions.push(`EXISTS (SELECT 1 FROM analysis_runs r JOIN peaks k ON k.run_id = r.id
      WHERE r.spectrum_id = s.id AND ${latestDoneRun("r")} AND k.energy_ev BETWEEN :bandMinEv AND :bandMaxEv AND ${BAND_PEAK[s.band]})`);
  }
  if (s.sizeMin !== undefined || s.sizeMax !== undefined) {
    const size = ["r.spectrum_id = s.id", latestDoneRun("r"), "r.report->'derived'->>'diameterNm' IS NOT NULL"];
    if (s.sizeMin !== undefined) { size.push("(r.report->'derived'->>'diameterNm')::float8 >= :sizeMin"); params.sizeMin = s.sizeMin; }
    if (s.sizeMax !== undefined) { size.push("(r.report->'derived'->>'diameterNm')::float8 <= :sizeMax"); params.sizeMax = s.sizeMax; }
    conditions.push(`EXISTS (SELECT 1 FROM analysis_runs r WHERE ${size.join(" AND ")})`);
  }
  return { conditions, params, needsSample };
}
