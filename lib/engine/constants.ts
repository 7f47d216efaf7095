/**
 * Physical constants, CODATA 2018 (exact where the SI fixes them).
 * Source: CODATA 2018 recommended values (Tiesinga et al., Rev. Mod. Phys. 2021, 93, 025010).
 */
/** h·c in eV·nm. */
export const HC_EV_NM = 1239.841984;
/** Wavenumbers per electronvolt, cm⁻¹/eV. */
export const CM1_PER_EV = 8065.54394;
/** Avogadro constant, mol⁻¹ (exact). */
export const AVOGADRO = 6.02214076e23;
/** Scale factor turning a median absolute deviation into a Gaussian standard deviation: 1/Φ⁻¹(3/4). */
export const MAD_TO_SIGMA = 1.482602218505602;
/** 2·sqrt(2·ln 2): FWHM of a Gaussian per standard deviation. */
export const FWHM_PER_SIGMA = 2 * Math.sqrt(2 * Math.LN2);
