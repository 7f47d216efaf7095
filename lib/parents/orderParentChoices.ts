import { checkReferenceMatch, type MatchSide, type MatchVerdict } from "@/lib/engine/compare/checkReferenceMatch";
import type { Technique } from "@/lib/engine";
import { sampleSideAgainst, type SampleBands } from "./sampleBands";

/** An analysed spectrum that could serve as a parent reference (failed or unreadable uploads never are). */
export type ParentCandidate = {
  id: string;
  fileName: string;
  technique: Technique;
  sampleId: string | null;
  sampleName: string | null;
  material: string | null;
  createdAt: string;
  /** From its newest finished analysis; null where none was found. */
  firstExcitonEv: number | null;
  fwhmMeV: number | null;
  rangeEv: [number, number] | null;
};

/** The spectrum the parent is chosen for, as far as it is known (before an upload: its sample and technique only). */
export type ParentTarget = {
  technique: Technique;
  sample: { id: string; name: string; material: string; parentIds: readonly string[] } | null;
  /** Known once the file is analysed (the re-run form): its range and first exciton. */
  side: MatchSide | null;
  /** Before an upload: what the engine found in the file about to be stored (the preview); the side is then worked out per parent. */
  bands?: SampleBands | null;
  /** The spectrum itself, never its own parent. */
  spectrumId?: string;
};

export type ParentChoice = ParentCandidate & { verdict: MatchVerdict };
export type ParentChoiceGroups = {
  /** Spectra of the sample's registered parent samples, same technique. */
  registered: ParentChoice[];
  /** Other spectra of the same technique and material (of the same technique, when no sample is chosen). */
  related: ParentChoice[];
};

/**
 * The engine's validity rule (checkReferenceMatch) for one candidate. Before the sample's own
 * file is analysed only the technique can be checked; the candidate's range and first exciton
 * are compared once the sample's are known.
 */
export function parentVerdict(
  target: ParentTarget,
  candidate: Pick<ParentCandidate, "technique" | "rangeEv" | "firstExcitonEv" | "fwhmMeV">,
): MatchVerdict {
  if (candidate.technique !== target.technique) {
    return {
      ok: false,
      reason: `the reference does not match this sample: the sample is ${target.technique}, the reference ${candidate.technique}`,
    };
  }
  const side = target.bands ? sampleSideAgainst(target.bands, candidate.firstExcitonEv) : target.side;
  if (!side || !candidate.rangeEv) return { ok: true, toleranceMeV: null };
  return checkReferenceMatch(side, {
    technique: candidate.technique,
    rangeEv: candidate.rangeEv,
    bandEv: candidate.firstExcitonEv,
    fwhmMeV: candidate.fwhmMeV,
  });
}

/**
 * Orders the choices of a parent picker: first the spectra of the sample's registered parents with
 * the same technique, then other spectra of the same technique and material, newest first in
 * each; never the spectrum itself, never another technique. Each carries the validity verdict.
 */
export function orderParentChoices(candidates: readonly ParentCandidate[], target: ParentTarget): ParentChoiceGroups {
  const parentIds = new Set(target.sample?.parentIds ?? []);
  const usable = candidates
    .filter((c) => c.technique === target.technique && c.id !== target.spectrumId)
    .sort((a, b) => b.createdAt.localeCompare(a.createdAt))
    .map((c) => ({ ...c, verdict: parentVerdict(target, c) }));
  const registered = usable.filter((c) => c.sampleId !== null && parentIds.has(c.sampleId));
  const material = target.sample?.material.trim().toLowerCase() ?? null;
  const related = usable.filter(
    (c) => !registered.includes(c) && (material === null || (c.material ?? "").trim().toLowerCase() === material),
  );
  return { registered, related };
}
