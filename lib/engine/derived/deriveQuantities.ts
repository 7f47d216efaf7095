import { HC_EV_NM } from '../constants';
import type { ExcitonicPeak } from '../peaks/findExcitonicPeaks';
import type { DerivedReport, MaterialName, Technique } from '../types';
import { MATERIALS } from './materials';
import { SIZING_CURVES } from './sizingCurves';
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
  };
  const warnings: string[] = [];
  if (!p.material) return { report: empty, warnings };
  const info = MATERIALS[p.material];
  if (!info) throw new RangeError(`unknown material ${p.material}`);
  if (!p.firstExciton) {
    warnings.push('no first exciton found: size and concentration not derived');
    return { report: empty, warnings };
  }
  if (p.technique === 'pl') warnings.push('size derived from the emission peak, which lies below the absorption first exciton (Stokes shift): diameter is overestimated');
  const id = p.material === 'CdSe' && p.sizingModel === 'jasieniak2009' ? 'cdse-jasieniak2009' : info.defaultSizing;
  const curve = SIZING_CURVES[id];
  const fx = p.firstExciton;
  const hwhm = fx.fwhmMeV ? fx.fwhmMeV / 2000 : undefined;
  const res = curve.size(fx.wavelengthNm, hwhm ? { hwhmEv: hwhm } : {});
  warnings.push(...res.warnings);
  const report: DerivedReport = {
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
  return { report, warnings };
}
