import { bandRangeEv } from "./bandRangeEv";
import type { BandKind, SpectrumSearch } from "./spectrumSearchQuery";

/**
 * SQL conditions (on `spectra s`, `samples sm` joined on s.sample_id, and `lr`, the spectrum's
 * latest finished run) for a search's filters, with their named replacements. Every user value
 * travels as a replacement, never as SQL text.
 */
export type FilterSql = { conditions: string[]; params: Record<string, unknown>; needsSample: boolean; needsLatestRun: boolean };

/**
 * The latest finished run of each spectrum `s` as `lr` (one probe of analysis_runs_done_idx): only
 * the newest analysis counts, a re-analysis replaces the flags and peaks of the earlier one. Inner
 * join: a spectrum with no finished analysis has no band, flag or size to match.
 */
export const LATEST_RUN_JOIN = `CROSS JOIN LATERAL (SELECT r.id AS run_id FROM analysis_runs r WHERE r.spectrum_id = s.id AND r.status = 'done'
  ORDER BY r.created_at DESC, r.id DESC LIMIT 1) lr`;

/** A flag's size in its own unit (fraction, meV or signal), as the engine wrote it. */
export const SIGNATURE_MAGNITUDE_SQL = "abs(coalesce(g.magnitude, (g.details->>'magnitude')::float8))";

const BAND_PEAK: Record<BandKind, string> = {
  "first-exciton": "k.is_first_exciton",
  // the emission maximum: the highest peak of a PL spectrum's run
  emission: "s.technique = 'pl' AND NOT EXISTS (SELECT 1 FROM peaks higher WHERE higher.run_id = k.run_id AND higher.height > k.height)",
  band: "TRUE",
};

/**
 * "Some row of this subquery exists", written as a correlated scalar subquery rather than EXISTS:
 * PostgreSQL turns EXISTS into a semi-join that hashes every matching peak or flag of the whole
 * table before the first row; a scalar subquery is probed per spectrum while the keyset index is
 * walked, so a page stops after its 51 rows (docs/search.md, "Band search and the planner").
 */
const someRow = (fromWhere: string) => `(SELECT 1 ${fromWhere} LIMIT 1) IS NOT NULL`;

/** `%text%` for ILIKE, with the user's own % _ and \ taken literally. */
export const containsPattern = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

export function spectrumFilterSql(s: SpectrumSearch): FilterSql {
  const conditions: string[] = [];
  const params: Record<string, unknown> = {};
  let needsSample = false;
  let needsLatestRun = false;
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
    needsLatestRun = true;
    const flag: string[] = ["g.run_id = lr.run_id"];
    if (s.flag) { flag.push("g.kind = :flag"); params.flag = s.flag; }
    if (s.flagMin !== undefined) { flag.push(`${SIGNATURE_MAGNITUDE_SQL} >= :flagMin`); params.flagMin = s.flagMin; }
    if (s.flagSig !== undefined) { flag.push("g.significance >= :flagSig"); params.flagSig = s.flagSig; }
    if (s.review) { flag.push("g.review_state = :review"); params.review = s.review; }
    conditions.push(someRow(`FROM signatures g WHERE ${flag.join(" AND ")}`));
  }
  if (s.band && s.bandMin !== undefined && s.bandMax !== undefined) {
    const { minEv, maxEv } = bandRangeEv(s.bandMin, s.bandMax, s.bandUnit);
    Object.assign(params, { bandMinEv: minEv, bandMaxEv: maxEv });
    needsLatestRun = true;
    conditions.push(someRow(`FROM peaks k WHERE k.run_id = lr.run_id AND k.energy_ev BETWEEN :bandMinEv AND :bandMaxEv AND ${BAND_PEAK[s.band]}`));
  }
  if (s.sizeMin !== undefined || s.sizeMax !== undefined) {
    needsLatestRun = true;
    const size = ["r.id = lr.run_id", "r.report->'derived'->>'diameterNm' IS NOT NULL"];
    if (s.sizeMin !== undefined) { size.push("(r.report->'derived'->>'diameterNm')::float8 >= :sizeMin"); params.sizeMin = s.sizeMin; }
    if (s.sizeMax !== undefined) { size.push("(r.report->'derived'->>'diameterNm')::float8 <= :sizeMax"); params.sizeMax = s.sizeMax; }
    conditions.push(someRow(`FROM analysis_runs r WHERE ${size.join(" AND ")}`));
  }
  return { conditions, params, needsSample, needsLatestRun };
}
