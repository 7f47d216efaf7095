import { bandRangeEv } from "./bandRangeEv";
import type { BandKind, SpectrumSearch } from "./spectrumSearchQuery";

/**
 * SQL conditions (on `spectra s`, and `samples sm` joined on s.sample_id) for a search's filters,
 * with their named replacements. Every user value travels as a replacement, never as SQL text.
 * Bands, flags and sizes are those of the spectrum's latest finished analysis, which
 * migrations/0012 keeps on the spectrum row (latest_run_id, first_exciton_ev, emission_ev,
 * diameter_nm): a re-analysis replaces the flags and peaks of the earlier one.
 */
export type FilterSql = { conditions: string[]; params: Record<string, unknown>; needsSample: boolean };

/** A flag's size in its own unit (fraction, meV or signal), as the engine wrote it. */
export const SIGNATURE_MAGNITUDE_SQL = "abs(coalesce(g.magnitude, (g.details->>'magnitude')::float8))";

/** Where each band kind's energy is: a summary column (index-only range per project) or any peak of the latest run. */
const BAND_CONDITION: Record<BandKind, string> = {
  "first-exciton": "s.first_exciton_ev BETWEEN :bandMinEv AND :bandMaxEv",
  // the emission maximum: the highest peak of a PL spectrum's latest run
  emission: "s.emission_ev BETWEEN :bandMinEv AND :bandMaxEv",
  band: "(SELECT 1 FROM peaks k WHERE k.run_id = s.latest_run_id AND k.energy_ev BETWEEN :bandMinEv AND :bandMaxEv LIMIT 1) IS NOT NULL",
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
  if (s.q) {
    params.pattern = containsPattern(s.q);
    // the ARRAY(...) of matching samples lets PostgreSQL combine the two trigram indexes (BitmapOr)
    conditions.push(`((s.file_name || ' ' || s.metadata::text) ILIKE :pattern
      OR s.sample_id = ANY (ARRAY(SELECT x.id FROM samples x WHERE (x.name || ' ' || x.notes) ILIKE :pattern)))`);
  }
  if (s.project) {
    conditions.push("s.project_id = :project");
    params.project = s.project;
  }
  if (s.sample) {
    conditions.push("s.sample_id = :sample");
    params.sample = s.sample;
  }
  if (s.material) {
    needsSample = true;
    conditions.push("(lower(s.material) = lower(:material) OR (s.material IS NULL AND lower(sm.material) = lower(:material)))");
    params.material = s.material;
  }
  if (s.technique) {
    conditions.push("s.technique = :technique");
    params.technique = s.technique;
  }
  if (s.uploader) {
    conditions.push("s.uploaded_by = :uploader");
    params.uploader = s.uploader;
  }
  if (s.from) {
    conditions.push("s.created_at >= CAST(:from AS date)");
    params.from = s.from;
  }
  if (s.to) {
    conditions.push("s.created_at < CAST(:to AS date) + 1");
    params.to = s.to;
  }
  if (s.status) {
    conditions.push("s.status = :status");
    params.status = s.status;
  }
  if (s.flag || s.review) {
    const flag: string[] = ["g.run_id = s.latest_run_id"];
    if (s.flag) {
      flag.push("g.kind = :flag");
      params.flag = s.flag;
    }
    if (s.flagMin !== undefined) {
      flag.push(`${SIGNATURE_MAGNITUDE_SQL} >= :flagMin`);
      params.flagMin = s.flagMin;
    }
    if (s.flagSig !== undefined) {
      flag.push("g.significance >= :flagSig");
      params.flagSig = s.flagSig;
    }
    if (s.review) {
      flag.push("g.review_state = :review");
      params.review = s.review;
    }
    conditions.push(someRow(`FROM signatures g WHERE ${flag.join(" AND ")}`));
  }
  if (s.band && s.bandMin !== undefined && s.bandMax !== undefined) {
    const { minEv, maxEv } = bandRangeEv(s.bandMin, s.bandMax, s.bandUnit);
    Object.assign(params, { bandMinEv: minEv, bandMaxEv: maxEv });
    conditions.push(BAND_CONDITION[s.band]);
  }
  if (s.sizeMin !== undefined) {
    conditions.push("s.diameter_nm >= :sizeMin");
    params.sizeMin = s.sizeMin;
  }
  if (s.sizeMax !== undefined) {
    conditions.push("s.diameter_nm <= :sizeMax");
    params.sizeMax = s.sizeMax;
  }
  return { conditions, params, needsSample };
}
