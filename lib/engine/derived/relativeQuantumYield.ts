/**
 * Relative photoluminescence quantum yield against a reference dye:
 * Φ = Φ_R·(F/F_R)·(f_R/f)·(n²/n_R²), f = 1 − 10^(−A_ex) (IUPAC; Resch-Genger & Rurack, Pure Appl.
 * Chem. 2013, 85, 2005). F: integrated emission; A_ex: absorbance at the excitation wavelength;
 * n: refractive index of the solvent.
 */
export function relativeQuantumYield(p: {
  integratedEmission: number;
  absorbanceAtExcitation: number;
  refractiveIndex: number;
  referenceIntegratedEmission: number;
  referenceAbsorbanceAtExcitation: number;
  referenceRefractiveIndex: number;
  referenceQuantumYield: number;
}): { quantumYield: number; warnings: string[] } {
  const f = 1 - 10 ** -p.absorbanceAtExcitation;
  const fR = 1 - 10 ** -p.referenceAbsorbanceAtExcitation;
  if (!(f > 0) || !(fR > 0)) throw new RangeError('absorbances at the excitation wavelength must be positive');
  if (!(p.referenceIntegratedEmission > 0)) throw new RangeError('reference integrated emission must be positive');
  const warnings: string[] = [];
  if (p.absorbanceAtExcitation > 0.1 || p.referenceAbsorbanceAtExcitation > 0.1) {
    warnings.push('absorbance at the excitation wavelength above 0.1: inner-filter effects bias the yield');
  }
  const quantumYield =
    p.referenceQuantumYield *
    (p.integratedEmission / p.referenceIntegratedEmission) *
    (fR / f) *
    (p.refractiveIndex ** 2 / p.referenceRefractiveIndex ** 2);
  return { quantumYield, warnings };
}
