/**
 * Half width at half maximum of a band on its low-energy side, in the units of `energy`: the
 * distance from the band's top (index `top`) down to where the signal first falls to half the
 * top's value, linearly interpolated between grid points. The signal must sit on a zero baseline
 * (absorbance with its offset removed). For a first exciton the low-energy half is the one free
 * of the higher transitions, so 2·HWHM_low is its FWHM (common practice; the half Jasieniak et al.,
 * J. Phys. Chem. C 2009, 113, 19468, scale the extinction with). Null when the signal does not
 * fall to half before the start of the data, or the top is not positive.
 */
export function lowEnergyHalfWidth(energy: ArrayLike<number>, signal: ArrayLike<number>, top: number): number | null {
  const peak = signal[top]!;
  if (!(peak > 0) || top <= 0) return null;
  const half = peak / 2;
  for (let i = top - 1; i >= 0; i--) {
    const v = signal[i]!;
    if (v <= half) {
      const above = signal[i + 1]!;
      const f = above === v ? 0 : (above - half) / (above - v);
      const eHalf = energy[i + 1]! - f * (energy[i + 1]! - energy[i]!);
      return energy[top]! - eHalf;
    }
  }
  return null;
}
