/**
 * Factor that turns integrated emission into emission per photon absorbed by the dots, for a
 * right-angle cell viewed at its centre, with ONE model of the inner filter:
 *
 *   F_per_absorbed ∝ F_obs · 10^((A_ex + A_em)/2) / A_dots
 *
 * 10^(A_ex/2) undoes the attenuation of the excitation beam on its way to the centre of the cell
 * (primary inner filter) and 10^(A_em/2) that of the emission on its way out (secondary);
 * Lakowicz, Principles of Fluorescence Spectroscopy, 3rd ed., Springer 2006, §2.12, eq. 2.1
 * (secondary). In the viewed slice, the light the dots absorb is proportional to their own
 * absorbance A_dots (≤ the total A_ex when a quencher or titrant also absorbs at the excitation;
 * only the dots' share excites them, common practice). The absorbed fraction 1 − 10^(−A_ex) is the
 * light absorbed anywhere in the cell: it must NOT be multiplied in as well (that would count the
 * primary inner filter twice).
 *
 * Holds to a few % for absorbances up to ~0.1 (warned above) and poorly above ~0.3, where it is
 * refused (not applied) unless forced (from memory; DOMAIN.md §4).
 */
export const INNER_FILTER_WARN_ABOVE = 0.1;
export const INNER_FILTER_REFUSE_ABOVE = 0.3;

export interface EmissionAbsorbances {
  /** Total absorbance at the excitation wavelength. */
  excitation: number;
  /** Absorbance at the emission band (0 when not given). */
  emission: number;
  /** Absorbance of the dots alone at the excitation (default: `excitation`). */
  dotsAtExcitation?: number | undefined;
}

export type EmissionCorrection = { applied: true; factor: number; warnings: string[] } | { applied: false; reason: string };

export function emissionPerAbsorbedPhoton(a: EmissionAbsorbances, force = false): EmissionCorrection {
  const dots = a.dotsAtExcitation ?? a.excitation;
  for (const [name, v] of [
    ['absorbance at the excitation', a.excitation],
    ['absorbance at the emission', a.emission],
    ["dots' absorbance at the excitation", dots],
  ] as const) {
    if (!Number.isFinite(v) || v < 0) throw new RangeError(`${name} must be a non-negative number`);
  }
  if (!(dots > 0)) return { applied: false, reason: "the dots' absorbance at the excitation is 0: no light absorbed by the dots" };
  if (dots > a.excitation * (1 + 1e-9))
    throw new RangeError("the dots' absorbance at the excitation cannot exceed the total absorbance there");
  const worst = Math.max(a.excitation, a.emission);
  if (worst > INNER_FILTER_REFUSE_ABOVE && !force) {
    return {
      applied: false,
      reason: `absorbance ${worst.toFixed(3)} is above ${INNER_FILTER_REFUSE_ABOVE}, where the inner-filter correction no longer holds; dilute to A ≤ 0.1`,
    };
  }
  const warnings =
    worst > INNER_FILTER_WARN_ABOVE
      ? [`absorbance ${worst.toFixed(3)} is above ${INNER_FILTER_WARN_ABOVE}: the inner-filter correction is approximate`]
      : [];
  return { applied: true, factor: 10 ** ((a.excitation + a.emission) / 2) / dots, warnings };
}
