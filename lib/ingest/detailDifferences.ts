import type { Spectrum } from "@/models";
import type { IngestContext } from "./prepareIngest";

/** A detail sent with a re-upload that differs from what the stored spectrum holds. */
export type DetailDifference = { field: DetailField; label: string; stored: string | null; sent: string };

/** The details of a stored spectrum that a re-upload of its bytes may state differently (and update, when asked). */
export const DETAIL_FIELDS = [
  "technique",
  "sampleId",
  "seriesId",
  "seriesValue",
  "referenceSpectrumId",
  "pathLengthCm",
  "excitationNm",
  "solvent",
  "material",
  "xUnit",
  "yKind",
] as const;
export type DetailField = (typeof DETAIL_FIELDS)[number];

const show = (v: unknown): string | null => (v === null || v === undefined || v === "" ? null : String(v));

/**
 * The details a re-upload of already-stored bytes states differently from the stored spectrum.
 * Only fields the person actually sent are compared (an empty field means "not said"). Column,
 * block, pair and sheet are not details: they pick the trace, and a duplicate is the same trace
 * (lib/ingest/traceKey.ts), however it was named.
 */
export function detailDifferences(context: IngestContext, existing: Spectrum): DetailDifference[] {
  const m = context.metadata;
  const read = existing.readOptions ?? {};
  const candidates: Array<[DetailField, string, unknown, unknown]> = [
    ["technique", "technique", existing.technique, m.technique],
    ["sampleId", "sample", existing.sampleId, m.sampleId],
    ["seriesId", "series", existing.seriesId, m.seriesId],
    ["seriesValue", "series value", existing.seriesValue, m.seriesValue],
    ["referenceSpectrumId", "parent reference", existing.referenceSpectrumId, m.referenceSpectrumId],
    ["pathLengthCm", "path length (cm)", existing.pathLengthCm, m.pathLengthCm],
    ["excitationNm", "excitation (nm)", existing.excitationNm, m.excitationNm],
    ["solvent", "solvent", existing.solvent, m.solvent],
    ["material", "material", existing.material, m.material],
    ["xUnit", "X unit", read.xUnit, m.xUnit],
    ["yKind", "signal kind", read.yKind, m.yKind],
  ];
  const out: DetailDifference[] = [];
  for (const [field, label, stored, sent] of candidates) {
    const s = show(sent);
    if (s === null) continue;
    const was = show(stored);
    const same = was !== null && (typeof sent === "number" ? Number(was) === sent : was === s);
    if (!same) out.push({ field, label, stored: was, sent: s });
  }
  return out;
}
