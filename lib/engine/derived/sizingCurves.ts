import { HC_EV_NM } from '../constants';
import type { SizingModelId } from './materials';

export interface SizingResult {
  diameterNm: number;
  /** Molar extinction coefficient, M⁻¹cm⁻¹, at `extinctionAt` ('first-exciton' or 400 nm). */
  extinctionPerMPerCm: number;
  extinctionAt: 'first-exciton' | '400nm';
  source: string;
  warnings: string[];
}

export interface SizingCurve {
  id: SizingModelId;
  source: string;
  /** Valid first-exciton wavelength range, nm. */
  validNm: [number, number];
  size(firstExcitonNm: number, options?: { hwhmEv?: number }): SizingResult;
}

function rangeWarning(lambda: number, [lo, hi]: [number, number], src: string): string[] {
  return lambda < lo || lambda > hi
    ? [`first exciton ${lambda.toFixed(1)} nm is outside the ${lo}–${hi} nm range of ${src}; size and extinction are extrapolated`]
    : [];
}

/** Solves E0(d) = e for d on [lo, hi] by bisection (E0 decreasing in d). */
function solveDiameter(e0: (d: number) => number, e: number, lo = 0.5, hi = 50): number {
  let a = lo;
  let b = hi;
  if (e >= e0(a)) return a;
  if (e <= e0(b)) return b;
  for (let k = 0; k < 100; k++) {
    const m = 0.5 * (a + b);
    if (e0(m) > e) a = m;
    else b = m;
  }
  return 0.5 * (a + b);
}

/** Yu, Qu, Guo & Peng, Chem. Mater. 2003, 15, 2854: CdSe diameter and ε = 5857·D^2.65. */
export const cdseYu2003: SizingCurve = {
  id: 'cdse-yu2003',
  source: 'Yu, Qu, Guo, Peng, Chem. Mater. 2003, 15, 2854 (CdSe)',
  validNm: [450, 650],
  size(l) {
    const D = 1.6122e-9 * l ** 4 - 2.6575e-6 * l ** 3 + 1.6242e-3 * l ** 2 - 0.4277 * l + 41.57;
    return {
      diameterNm: D,
      extinctionPerMPerCm: 5857 * D ** 2.65,
      extinctionAt: 'first-exciton',
      source: this.source,
      warnings: rangeWarning(l, this.validNm, 'Yu 2003 (CdSe)'),
    };
  },
};

/** Yu et al. 2003: CdTe diameter and ε = 10043·D^2.12. */
export const cdteYu2003: SizingCurve = {
  id: 'cdte-yu2003',
  source: 'Yu, Qu, Guo, Peng, Chem. Mater. 2003, 15, 2854 (CdTe)',
  validNm: [500, 750],
  size(l) {
    const D = 9.8127e-7 * l ** 3 - 1.7147e-3 * l ** 2 + 1.0064 * l - 194.84;
    return {
      diameterNm: D,
      extinctionPerMPerCm: 10043 * D ** 2.12,
      extinctionAt: 'first-exciton',
      source: this.source,
      warnings: rangeWarning(l, this.validNm, 'Yu 2003 (CdTe)'),
    };
  },
};

/** Yu et al. 2003: CdS diameter and ε = 21536·D^2.3. */
export const cdsYu2003: SizingCurve = {
  id: 'cds-yu2003',
  source: 'Yu, Qu, Guo, Peng, Chem. Mater. 2003, 15, 2854 (CdS)',
  validNm: [350, 480],
  size(l) {
    const D = -6.6521e-8 * l ** 3 + 1.9557e-4 * l ** 2 - 9.2352e-2 * l + 13.29;
    return {
      diameterNm: D,
      extinctionPerMPerCm: 21536 * D ** 2.3,
      extinctionAt: 'first-exciton',
      source: this.source,
      warnings: rangeWarning(l, this.validNm, 'Yu 2003 (CdS)'),
    };
  },
};

/**
 * Jasieniak, Smith, van Embden, Mulvaney & Califano, J. Phys. Chem. C 2009, 113, 19468: CdSe
 * diameter (valid ~2–8 nm) and ε₁S = 155507 + 6.67054e13·exp(−E₁S/0.10551), scaled by
 * 0.060 eV / HWHM when the low-energy half width at half maximum is known (HWHM convention from
 * memory).
 */
export const cdseJasieniak2009: SizingCurve = {
  id: 'cdse-jasieniak2009',
  source: 'Jasieniak, Smith, van Embden, Mulvaney, Califano, J. Phys. Chem. C 2009, 113, 19468 (CdSe)',
  validNm: [465, 640],
  size(l, options = {}) {
    const D = 59.60816 - 0.54736 * l + 1.8873e-3 * l ** 2 - 2.85743e-6 * l ** 3 + 1.62974e-9 * l ** 4;
    const E = HC_EV_NM / l;
    let eps = 155507 + 6.67054e13 * Math.exp(-E / 0.10551);
    const warnings: string[] = [];
    if (options.hwhmEv && options.hwhmEv > 0) eps *= 0.06 / options.hwhmEv;
    else warnings.push('first-exciton HWHM unknown: Jasieniak extinction not width-scaled');
    if (D < 2 || D > 8) warnings.push(`diameter ${D.toFixed(2)} nm is outside the ~2–8 nm range of Jasieniak 2009; extrapolated`);
    return { diameterNm: D, extinctionPerMPerCm: eps, extinctionAt: 'first-exciton', source: this.source, warnings };
  },
};

/** Moreels et al., ACS Nano 2009, 3, 3023: PbS E₀ = 0.41 + 1/(0.0252d² + 0.283d) eV; ε₄₀₀ = 0.0233·d³ µM⁻¹cm⁻¹. */
export function pbsBandGapEv(d: number): number {
  return 0.41 + 1 / (0.0252 * d * d + 0.283 * d);
}
export const pbsMoreels2009: SizingCurve = {
  id: 'pbs-moreels2009',
  source: 'Moreels et al., ACS Nano 2009, 3, 3023 (PbS)',
  validNm: [HC_EV_NM / pbsBandGapEv(2.3), HC_EV_NM / pbsBandGapEv(10)],
  size(l) {
    const d = solveDiameter(pbsBandGapEv, HC_EV_NM / l);
    const warnings =
      d < 2.3 || d > 10 ? [`diameter ${d.toFixed(2)} nm is outside the ~2.3–10 nm range of Moreels 2009 (range from memory)`] : [];
    return { diameterNm: d, extinctionPerMPerCm: 0.0233e6 * d ** 3, extinctionAt: '400nm', source: this.source, warnings };
  },
};

/** Moreels et al., Chem. Mater. 2007, 19, 6101: PbSe E₀ = 0.278 + 1/(0.016d² + 0.209d + 0.45) eV; ε₄₀₀ = 0.0277·d³ µM⁻¹cm⁻¹. */
export function pbseBandGapEv(d: number): number {
  return 0.278 + 1 / (0.016 * d * d + 0.209 * d + 0.45);
}
export const pbseMoreels2007: SizingCurve = {
  id: 'pbse-moreels2007',
  source: 'Moreels et al., Chem. Mater. 2007, 19, 6101 (PbSe)',
  validNm: [HC_EV_NM / pbseBandGapEv(3), HC_EV_NM / pbseBandGapEv(9)],
  size(l) {
    const d = solveDiameter(pbseBandGapEv, HC_EV_NM / l);
    const warnings = d < 3 || d > 9 ? [`diameter ${d.toFixed(2)} nm is outside the ~3–9 nm range of Moreels 2007 (range from memory)`] : [];
    return { diameterNm: d, extinctionPerMPerCm: 0.0277e6 * d ** 3, extinctionAt: '400nm', source: this.source, warnings };
  },
};

export const SIZING_CURVES: Readonly<Record<SizingModelId, SizingCurve>> = {
  'cdse-yu2003': cdseYu2003,
  'cdse-jasieniak2009': cdseJasieniak2009,
  'cdte-yu2003': cdteYu2003,
  'cds-yu2003': cdsYu2003,
  'pbs-moreels2009': pbsMoreels2009,
  'pbse-moreels2007': pbseMoreels2007,
};
