import { describe, expect, it } from 'vitest';
import { SIZING_CURVES, pbsBandGapEv, pbseBandGapEv } from '../../lib/engine/derived/sizingCurves';
import { beerLambertConcentration, particleMolarMass } from '../../lib/engine/derived/concentration';
import { relativeQuantumYield } from '../../lib/engine/derived/relativeQuantumYield';
import { innerFilterFactor } from '../../lib/engine/derived/innerFilterFactor';
import { MATERIALS } from '../../lib/engine/derived/materials';

// Check values computed from the papers' formulas, DOMAIN.md §3 (formulas: secondary).
describe('sizing curves', () => {
  it('Yu 2003 CdSe: 550 nm → 3.040 nm, ε 1.115e5; 600 nm → 4.583 nm, ε 3.309e5 (Chem. Mater. 2003, 15, 2854)', () => {
    const a = SIZING_CURVES['cdse-yu2003'].size(550);
    expect(a.diameterNm).toBeCloseTo(3.04, 3);
    expect(a.extinctionPerMPerCm / 1e5).toBeCloseTo(1.115, 3);
    const b = SIZING_CURVES['cdse-yu2003'].size(600);
    expect(b.diameterNm).toBeCloseTo(4.583, 3);
    expect(b.extinctionPerMPerCm / 1e5).toBeCloseTo(3.309, 3);
    expect(a.warnings).toHaveLength(0);
  });
  it('Yu 2003 CdTe 650 nm → 4.341 nm, ε 2.257e5; CdS 400 nm → 3.383 nm, ε 3.553e5', () => {
    const t = SIZING_CURVES['cdte-yu2003'].size(650);
    expect(t.diameterNm).toBeCloseTo(4.341, 3);
    expect(t.extinctionPerMPerCm / 1e5).toBeCloseTo(2.257, 3);
    const s = SIZING_CURVES['cds-yu2003'].size(400);
    expect(s.diameterNm).toBeCloseTo(3.383, 3);
    expect(s.extinctionPerMPerCm / 1e5).toBeCloseTo(3.553, 3);
  });
  it('Jasieniak 2009 CdSe: 550 nm → 3.195 nm, 600 nm → 4.630 nm (J. Phys. Chem. C 2009, 113, 19468)', () => {
    expect(SIZING_CURVES['cdse-jasieniak2009'].size(550, { hwhmEv: 0.06 }).diameterNm).toBeCloseTo(3.195, 3);
    expect(SIZING_CURVES['cdse-jasieniak2009'].size(600, { hwhmEv: 0.06 }).diameterNm).toBeCloseTo(4.63, 3);
  });
  it('Moreels PbS d = 3 nm → E0 1.3395 eV (ACS Nano 2009, 3, 3023); PbSe d = 5 nm → 0.8057 eV (Chem. Mater. 2007, 19, 6101)', () => {
    expect(pbsBandGapEv(3)).toBeCloseTo(1.3395, 4);
    expect(pbseBandGapEv(5)).toBeCloseTo(0.8057, 4);
    // inverse: the sizing curve recovers d from the first-exciton wavelength
    expect(SIZING_CURVES['pbs-moreels2009'].size(1239.841984 / pbsBandGapEv(3)).diameterNm).toBeCloseTo(3, 6);
    expect(SIZING_CURVES['pbse-moreels2007'].size(1239.841984 / pbseBandGapEv(5)).diameterNm).toBeCloseTo(5, 6);
  });
  it('warns outside the valid range', () => {
    expect(SIZING_CURVES['cdse-yu2003'].size(700).warnings.length).toBeGreaterThan(0);
    expect(SIZING_CURVES['cds-yu2003'].size(520).warnings.length).toBeGreaterThan(0);
  });
});

describe('concentration, molar mass, quantum yield, inner filter', () => {
  it('Beer–Lambert c = A/(εl)', () => {
    expect(beerLambertConcentration(0.5, 1e5, 1)).toBeCloseTo(5e-6, 15);
    expect(() => beerLambertConcentration(0.5, 0, 1)).toThrow(RangeError);
  });
  it('particle molar mass M = N_A·ρ·πD³/6 (CODATA N_A; density from memory)', () => {
    // 4 nm CdSe: π/6·(4e-7 cm)³·5.82 g/cm³·6.02214076e23 = 1.1745e5 g/mol (hand calculation)
    expect(particleMolarMass(4, MATERIALS.CdSe.densityGPerCm3) / 1e5).toBeCloseTo(1.1745, 3);
  });
  it('relative QY Φ = Φ_R (F/F_R)(f_R/f)(n²/n_R²), f = 1 − 10^−A (IUPAC; Resch-Genger & Rurack 2013)', () => {
    const r = relativeQuantumYield({
      integratedEmission: 2,
      absorbanceAtExcitation: 0.05,
      refractiveIndex: 1.496,
      referenceIntegratedEmission: 1,
      referenceAbsorbanceAtExcitation: 0.05,
      referenceRefractiveIndex: 1.333,
      referenceQuantumYield: 0.546,
    });
    expect(r.quantumYield).toBeCloseTo(0.546 * 2 * (1.496 / 1.333) ** 2, 10);
    const half = relativeQuantumYield({
      integratedEmission: 1,
      absorbanceAtExcitation: 0.1,
      refractiveIndex: 1,
      referenceIntegratedEmission: 1,
      referenceAbsorbanceAtExcitation: 0.05,
      referenceRefractiveIndex: 1,
      referenceQuantumYield: 1,
    });
    expect(half.quantumYield).toBeCloseTo((1 - 10 ** -0.05) / (1 - 10 ** -0.1), 12);
  });
  it('inner filter F_corr = F·10^((A_ex+A_em)/2); warns above 0.1, not applied silently above 0.3 (secondary; thresholds from memory)', () => {
    expect(innerFilterFactor(0.05, 0.02).factor).toBeCloseTo(10 ** 0.035, 12);
    expect(innerFilterFactor(0.05, 0.02).warnings).toHaveLength(0);
    expect(innerFilterFactor(0.2, 0).warnings).toHaveLength(1);
    const high = innerFilterFactor(0.5, 0.1);
    expect(high.applied).toBe(false);
    expect(high.warnings[0]).toMatch(/NOT applied/);
    expect(innerFilterFactor(0.5, 0.1, true).factor).toBeCloseTo(10 ** 0.3, 12);
  });
});
