/**
 * Inner-filter correction factor for 1 cm right-angle geometry: F_corr = F_obs·10^((A_ex + A_em)/2)
 * (Lakowicz, Principles of Fluorescence Spectroscopy, 3rd ed., 2006, §2.12; secondary).
 * Good to a few % for A ≲ 0.1; poor above ~0.3 (from memory): a warning above 0.1, and above 0.3
 * the factor is returned as 1 (not applied) unless `force` is set.
 */
export function innerFilterFactor(
  absorbanceExcitation: number,
  absorbanceEmission: number,
  force = false,
): { factor: number; applied: boolean; warnings: string[] } {
  const a = Math.max(absorbanceExcitation, absorbanceEmission);
  const warnings: string[] = [];
  if (a > 0.3 && !force) {
    warnings.push(
      `absorbance ${a.toFixed(3)} is above 0.3: the inner-filter correction is unreliable and was NOT applied (set forceInnerFilterCorrection to apply it)`,
    );
    return { factor: 1, applied: false, warnings };
  }
  if (a > 0.1) warnings.push(`absorbance ${a.toFixed(3)} is above 0.1: inner-filter correction is approximate`);
  return { factor: 10 ** ((absorbanceExcitation + absorbanceEmission) / 2), applied: true, warnings };
}
