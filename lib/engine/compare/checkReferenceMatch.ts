import type { Technique } from '../types';
import { TECHNIQUE_SPECS } from '../../registry/techniques';

/** What the match check needs to know of one spectrum (sample or its parent reference). */
export interface MatchSide {
  technique: Technique;
  /** Measured range on the energy axis, eV (either order). */
  rangeEv: readonly [number, number];
  /** First exciton (absorption), emission maximum (PL) or main band (IR), eV; null when none was found. */
  bandEv: number | null;
  /** FWHM of that band, meV; null when unknown. */
  fwhmMeV: number | null;
}

export type MatchVerdict = { ok: true; toleranceMeV: number | null } | { ok: false; reason: string };

/**
 * Smallest tolerance on the first-exciton (or emission-maximum) distance, meV. A charged or
 * reacted dot shifts its first exciton by a few to a few tens of meV (quantum-confined Stark
 * effect, ligand exchange); a different batch of another size sits hundreds of meV away
 * (common practice).
 */
export const MIN_BAND_TOLERANCE_MEV = 40;

/** Overlap of the two ranges needed before anything is compared, as a fraction of the narrower range (common practice). */
export const MIN_RANGE_OVERLAP = 0.5;

const sorted = (r: readonly [number, number]): [number, number] => (r[0] <= r[1] ? [r[0], r[1]] : [r[1], r[0]]);

/**
 * Decides whether a reference may be compared with a sample at all, before any band flag:
 * same technique, ranges that overlap, and first excitons (or emission maxima) no further apart
 * than the wider of the two bands' FWHM (at least MIN_BAND_TOLERANCE_MEV). A refusal carries one
 * sentence that names both positions, for the run's output and for the parent pickers.
 */
export function checkReferenceMatch(sample: MatchSide, reference: MatchSide): MatchVerdict {
  if (sample.technique !== reference.technique) {
    return {
      ok: false,
      reason: `the reference does not match this sample: the sample is ${sample.technique}, the reference ${reference.technique}`,
    };
  }
  const [s0, s1] = sorted(sample.rangeEv);
  const [r0, r1] = sorted(reference.rangeEv);
  const overlap = Math.min(s1, r1) - Math.max(s0, r0);
  const narrower = Math.min(s1 - s0, r1 - r0);
  if (!(overlap > 0) || !(narrower > 0) || overlap / narrower < MIN_RANGE_OVERLAP) {
    return {
      ok: false,
      reason: `the reference does not match this sample: their ranges overlap too little (${s0.toFixed(3)}–${s1.toFixed(3)} eV vs ${r0.toFixed(3)}–${r1.toFixed(3)} eV)`,
    };
  }
  if (sample.bandEv === null || reference.bandEv === null) return { ok: true, toleranceMeV: null };
  const widest = Math.max(sample.fwhmMeV ?? 0, reference.fwhmMeV ?? 0);
  const toleranceMeV = Math.max(widest, MIN_BAND_TOLERANCE_MEV);
  const distanceMeV = Math.abs(sample.bandEv - reference.bandEv) * 1000;
  if (distanceMeV > toleranceMeV) {
    const what = TECHNIQUE_SPECS[sample.technique].firstBandsWord;
    return {
      ok: false,
      reason: `the reference does not match this sample: ${what} ${sample.bandEv.toFixed(3)} eV vs ${reference.bandEv.toFixed(3)} eV (${distanceMeV.toFixed(0)} meV apart, more than ${toleranceMeV.toFixed(0)} meV)`,
    };
  }
  return { ok: true, toleranceMeV };
}
