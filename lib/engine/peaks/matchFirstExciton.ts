import type { ExcitonicPeak } from './findExcitonicPeaks';

/**
 * The sample's first exciton when a parent reference is known: the sample feature
 * nearest the parent's first-exciton energy, within `windowEv`. A charged or reacted
 * sample can show a new band below the gap; that band must not be taken for the first
 * exciton (it would also wreck the sizing curves). Returns null when no feature lies in
 * the window. Common practice: the same transition is followed across a series by its
 * energy, and a Stark or size shift stays far below 0.15 eV.
 */
export function matchFirstExciton<P extends Pick<ExcitonicPeak, 'energyEv'>>(
  samplePeaks: readonly P[],
  referenceFirstEv: number,
  windowEv = 0.15,
): P | null {
  if (!(windowEv > 0)) throw new RangeError('windowEv must be positive');
  let best: P | null = null;
  for (const p of samplePeaks) {
    const d = Math.abs(p.energyEv - referenceFirstEv);
    if (d <= windowEv && (!best || d < Math.abs(best.energyEv - referenceFirstEv))) best = p;
  }
  return best;
}
