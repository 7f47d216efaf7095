import { HC_EV_NM } from '../constants';
import type { ExcitonicPeak } from '../peaks/findExcitonicPeaks';
import type { DerivedReport, DispersionReport, MaterialName, Technique, TransitionReport } from '../types';
import { MATERIALS } from './materials';
import { SIZING_CURVES, type SizingCurve } from './sizingCurves';
import { beerLambertConcentration, particleMolarMass } from './concentration';

/**
 * Diameter, extinction, concentration and particle molar mass from the first exciton, using the
 * material's sizing curve (CdSe: Yu 2003 by default, Jasieniak 2009 on request).
 */
export function deriveQuantities(p: {
  material?: MaterialName | undefined;
  sizingModel?: 'yu2003' | 'jasieniak2009' | undefined;
  technique: Technique;
  firstExciton: ExcitonicPeak | null;
  /** All features of the spectrum (for the higher transitions). */
  peaks?: readonly ExcitonicPeak[];
  energy: Float64Array;
  smoothed: Float64Array;
  pathLengthCm: number | null;
}): { report: DerivedReport; warnings: string[] } {
  const empty: DerivedReport = {
    material: p.material ?? null,
    diameterNm: null,
    concentrationMolPerL: null,
    extinctionPerMPerCm: null,
    molarMassGPerMol: null,
    sizingSource: null,
    sizeDispersion: null,
    alternativeSizing: null,
    higherTransitions: [],
    firstExcitonPeakToValley: null,
  };
  const warnings: string[] = [];
  if (p.technique === 'absorption' && p.firstExciton) {
    empty.higherTransitions = higherTransitions(p.firstExciton, p.peaks ?? []);
    empty.firstExcitonPeakToValley = peakToValley(p.firstExciton, p.peaks ?? [], p.energy, p.smoothed);
  }
  if (!p.material) return { report: empty, warnings };
  const info = MATERIALS[p.material];
  if (!info) throw new RangeError(`unknown material ${p.material}`);
  if (!p.firstExciton) {
    warnings.push('no first exciton found: size and concentration not derived');
    return { report: empty, warnings };
  }
  if (p.technique === 'pl')
    warnings.push(
      'size derived from the emission peak, which lies below the absorption first exciton (Stokes shift): diameter is overestimated',
    );
  const id = p.material === 'CdSe' && p.sizingModel === 'jasieniak2009' ? 'cdse-jasieniak2009' : info.defaultSizing;
  const curve = SIZING_CURVES[id];
  const fx = p.firstExciton;
  const hwhm = fx.fwhmMeV ? fx.fwhmMeV / 2000 : undefined;
  const res = curve.size(fx.wavelengthNm, hwhm ? { hwhmEv: hwhm } : {});
  warnings.push(...res.warnings);
  const report: DerivedReport = {
    ...empty,
    material: p.material,
    diameterNm: res.diameterNm,
    concentrationMolPerL: null,
    extinctionPerMPerCm: res.extinctionPerMPerCm,
    molarMassGPerMol: res.diameterNm > 0 ? particleMolarMass(res.diameterNm, info.densityGPerCm3) : null,
    sizingSource: res.source,
  };
  if (p.technique === 'absorption') {
    if (p.pathLengthCm && p.pathLengthCm > 0) {
      let A: number | null = fx.height;
      if (res.extinctionAt === '400nm') {
        warnings.push(
          `the extinction at 400 nm (${res.source}) depends on the solvent through the local-field factor: it holds for the solvent of the source; in another solvent the concentration is off by the ratio of the local-field factors`,
        );
        const e = HC_EV_NM / 400;
        const n = p.energy.length;
        if (e < p.energy[0]! || e > p.energy[n - 1]!) {
          A = null;
          warnings.push('400 nm lies outside the data: concentration (Moreels, ε at 400 nm) not derived');
        } else {
          const step = (p.energy[n - 1]! - p.energy[0]!) / (n - 1);
          A = p.smoothed[Math.round((e - p.energy[0]!) / step)]!;
        }
      }
      if (A !== null && A > 0) report.concentrationMolPerL = beerLambertConcentration(A, res.extinctionPerMPerCm, p.pathLengthCm);
    } else {
      warnings.push('path length unknown: concentration not derived');
    }
  }
  if (hwhm && res.diameterNm > 0) report.sizeDispersion = sizeDispersion(curve, fx.wavelengthNm, hwhm, res.diameterNm);
  if (p.material === 'CdSe') {
    const otherId = id === 'cdse-yu2003' ? 'cdse-jasieniak2009' : 'cdse-yu2003';
    const other = SIZING_CURVES[otherId].size(fx.wavelengthNm, hwhm ? { hwhmEv: hwhm } : {});
    const sizeGap = Math.abs(other.diameterNm - res.diameterNm) / (0.5 * (other.diameterNm + res.diameterNm));
    const epsGap = Math.abs(Math.log(other.extinctionPerMPerCm / res.extinctionPerMPerCm));
    const agrees = sizeGap <= CDSE_SIZE_AGREEMENT && epsGap <= CDSE_EXTINCTION_AGREEMENT;
    report.alternativeSizing = {
      source: other.source,
      diameterNm: other.diameterNm,
      extinctionPerMPerCm: other.extinctionPerMPerCm,
      agrees,
    };
    if (!agrees) {
      warnings.push(
        `the two CdSe sizing models disagree beyond their stated uncertainty (size ±5–10 %, ε ±10–15 % each): ${res.source.split(',')[0]} gives D ${res.diameterNm.toFixed(2)} nm, ε ${res.extinctionPerMPerCm.toExponential(2)}; ${other.source.split(',')[0]} gives D ${other.diameterNm.toFixed(2)} nm, ε ${other.extinctionPerMPerCm.toExponential(2)} M⁻¹cm⁻¹`,
      );
    }
  }
  return { report, warnings };
}

/**
 * Agreement limits for the two CdSe models: each states size to ±5–10 % and ε to ±10–15 % (Yu 2003,
 * secondary); two independent estimates then agree within about √2·7 % ≈ 10 % in size and
 * √2·15 % ≈ 21 % in ε (as a log ratio).
 */
const CDSE_SIZE_AGREEMENT = 0.1;
const CDSE_EXTINCTION_AGREEMENT = 0.21;

/**
 * Size dispersion from the first exciton's width (DOMAIN.md §3; Guyot-Sionnest chapter, confirmed):
 * σ_E = HWHM/√(2 ln 2) of a Gaussian fitted to the low-energy half, σ_D = σ_E/|dE/dD| with dE/dD
 * from the sizing curve (central difference over ±0.5 nm of wavelength).
 */
function sizeDispersion(curve: SizingCurve, lambdaNm: number, hwhmEv: number, diameterNm: number): DispersionReport | null {
  const h = 0.5;
  const d1 = curve.size(lambdaNm + h).diameterNm;
  const d0 = curve.size(lambdaNm - h).diameterNm;
  const dDdl = (d1 - d0) / (2 * h);
  const dEdl = -HC_EV_NM / (lambdaNm * lambdaNm);
  if (!(Math.abs(dDdl) > 0)) return null;
  const dEdD = dEdl / dDdl;
  const sigmaE = hwhmEv / Math.sqrt(2 * Math.LN2);
  const sigmaD = sigmaE / Math.abs(dEdD);
  return { hwhmMeV: hwhmEv * 1000, sigmaEnergyMeV: sigmaE * 1000, sigmaDiameterNm: sigmaD, relative: sigmaD / diameterNm };
}

/** Features above the first exciton (the next excitonic transitions), lowest first, at most four. */
function higherTransitions(fx: ExcitonicPeak, peaks: readonly ExcitonicPeak[]): TransitionReport[] {
  return peaks
    .filter((q) => q.energyEv > fx.energyEv + 1e-9)
    .slice(0, 4)
    .map((q) => ({ energyEv: q.energyEv, wavelengthNm: q.wavelengthNm, kind: q.kind }));
}

/**
 * First-exciton peak-to-valley ratio: its absorbance over the lowest absorbance between it and the
 * next feature above it (a sharper, narrower size distribution gives a deeper valley; common
 * practice). Maxima only, and only when a real valley (a minimum below the peak) lies in between.
 */
function peakToValley(fx: ExcitonicPeak, peaks: readonly ExcitonicPeak[], energy: Float64Array, smoothed: Float64Array): number | null {
  if (fx.kind !== 'maximum' || !(fx.height > 0)) return null;
  const next = peaks.find((q) => q.energyEv > fx.energyEv + 1e-9);
  if (!next) return null;
  let valley = Infinity;
  for (let i = fx.index + 1; i < next.index; i++) valley = Math.min(valley, smoothed[i]!);
  if (!(valley > 0) || !(valley < fx.height)) return null;
  void energy;
  return fx.height / valley;
}
