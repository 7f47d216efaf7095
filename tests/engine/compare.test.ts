import { describe, expect, it } from 'vitest';
import { analyzeSpectrum } from '../../lib/engine/index';
import { absorbanceSpectrum, plSpectrum, PARENT_BANDS, HC } from './synthetic';

// Source of every expected value: the known truth of the synthetic generator (tests/engine/synthetic.ts);
// the tolerances are common practice for a noise level of 0.002 absorbance.

// Synthetic pairs with known truth. Tolerances are stated beside each check; flags must carry
// magnitude, uncertainty and significance.
const noise = 0.002;
const ref = absorbanceSpectrum({ bands: PARENT_BANDS, noise, seed: 1 });
const kinds = (r: ReturnType<typeof analyzeSpectrum>) => r.flags.map((f) => f.kind).sort();

describe('absorption vs parent', () => {
  it('noise-only pair: nothing flagged (several noise seeds)', () => {
    for (const seed of [2, 20, 21, 22, 23]) {
      const r = analyzeSpectrum(absorbanceSpectrum({ bands: PARENT_BANDS, noise, seed }), { reference: ref });
      expect(r.flags).toEqual([]);
    }
  });
  it('bleach of 30 % of the first exciton: fraction within ±0.03, no shift or new band', () => {
    // truth: band 1 (a = 0.5) scaled to 0.7; the other bands add ~0.012 at 2.2 eV, so the
    // expected fraction is 0.15/0.512 ≈ 0.293
    const s = absorbanceSpectrum({ bands: PARENT_BANDS.map((b, i) => (i === 0 ? { ...b, a: b.a * 0.7 } : b)), noise, seed: 3 });
    const r = analyzeSpectrum(s, { reference: ref });
    expect(kinds(r)).toEqual(['bleach']);
    const f = r.flags[0]!;
    expect(f.fraction!).toBeGreaterThan(0.263);
    expect(f.fraction!).toBeLessThan(0.323);
    expect(f.energyEv!).toBeCloseTo(2.2, 2);
    expect(f.significance).toBeGreaterThan(5);
    expect(f.uncertainty).toBeGreaterThan(0);
  });
  it('pure red shift of 20 meV: a shift within ±2 meV, NOT a bleach + new band', () => {
    const s = absorbanceSpectrum({ bands: PARENT_BANDS.map((b, i) => (i === 0 ? { ...b, e: b.e - 0.02 } : b)), noise, seed: 4 });
    const r = analyzeSpectrum(s, { reference: ref });
    expect(kinds(r)).toEqual(['shift']);
    expect(r.flags[0]!.shiftMeV!).toBeGreaterThan(-22);
    expect(r.flags[0]!.shiftMeV!).toBeLessThan(-18);
  });
  it('whole spectrum blue-shifted by 10 meV: one shift flag, +10 ± 1.5 meV', () => {
    const s = absorbanceSpectrum({ bands: PARENT_BANDS.map((b) => ({ ...b, e: b.e + 0.01 })), noise, seed: 5 });
    const r = analyzeSpectrum(s, { reference: ref });
    expect(kinds(r)).toEqual(['shift']);
    expect(Math.abs(r.flags[0]!.shiftMeV! - 10)).toBeLessThan(1.5);
  });
  it('broadening (σ 45 → 50 meV, area kept): FWHM change +11.8 ± 3 meV, no bleach', () => {
    const s = absorbanceSpectrum({
      bands: PARENT_BANDS.map((b, i) => (i === 0 ? { ...b, sigma: 0.05, a: (b.a * 0.045) / 0.05 } : b)),
      noise,
      seed: 6,
    });
    const r = analyzeSpectrum(s, { reference: ref });
    expect(kinds(r)).toEqual(['broadening']);
    const truth = (0.05 - 0.045) * 2.3548200450309493 * 1000;
    expect(Math.abs(r.flags[0]!.fwhmChangeMeV! - truth)).toBeLessThan(3);
  });
  it('new band at 1.85 eV below the gap: energy within ±15 meV, not intraband', () => {
    const s = absorbanceSpectrum({ bands: PARENT_BANDS, noise, seed: 7, newBand: { e: 1.85, sigma: 0.05, a: 0.06 } });
    const r = analyzeSpectrum(s, { reference: ref });
    expect(kinds(r)).toEqual(['new-band']);
    expect(Math.abs(r.flags[0]!.energyEv! - 1.85)).toBeLessThan(0.015);
    expect(r.flags[0]!.intraband).toBe(false);
  });
  it('normalisation by concentration undoes a dilution; unscaled (mode none) it reads as a bleach; auto reports the ratio', () => {
    const diluted = absorbanceSpectrum({
      bands: PARENT_BANDS.map((b) => ({ ...b, a: b.a * 0.5 })),
      noise: noise / 2,
      seed: 8,
      background: 0.025,
    });
    expect(kinds(analyzeSpectrum(diluted, { reference: ref, normalization: { mode: 'none' } }))).toContain('bleach');
    const r = analyzeSpectrum(diluted, {
      reference: ref,
      normalization: { mode: 'concentration', sampleConcentration: 0.5, referenceConcentration: 1 },
    });
    expect(r.flags).toEqual([]);
    // truth: the whole spectrum ×0.5 (generator), so the concentration ratio is 0.5
    const auto = analyzeSpectrum(diluted, { reference: ref });
    expect(kinds(auto)).toEqual(['concentration']);
    expect(Math.abs(auto.flags[0]!.magnitude - 0.5)).toBeLessThan(0.02);
  });
  it('thresholds can be set: a 30 % bleach is not flagged with minBleachFraction 0.5', () => {
    const s = absorbanceSpectrum({ bands: PARENT_BANDS.map((b, i) => (i === 0 ? { ...b, a: b.a * 0.7 } : b)), noise, seed: 3 });
    expect(analyzeSpectrum(s, { reference: ref, thresholds: { minBleachFraction: 0.5 } }).flags).toEqual([]);
  });
});

describe('mid-IR new band is called intraband', () => {
  it('a band at 2180 cm⁻¹ (0.27 eV, Guyot-Sionnest 2004) appears against the parent', () => {
    const mk = (seed: number, extra: boolean) => {
      const n = 1500;
      const x = Float64Array.from({ length: n }, (_, i) => 1000 + (3000 * i) / (n - 1));
      let a = seed;
      const rnd = () => ((a = (a * 16807) % 2147483647) / 2147483647 - 0.5) * 0.002;
      const y = x.map(
        (w) => 0.2 * Math.exp(-0.5 * ((w - 2900) / 15) ** 2) + (extra ? 0.05 * Math.exp(-0.5 * ((w - 2180) / 150) ** 2) : 0) + rnd(),
      );
      return {
        fileName: `ir${seed}.csv`,
        format: 'delimited' as const,
        x,
        y,
        xUnit: 'cm-1' as const,
        yUnit: 'absorbance' as const,
        xOrderInFile: 'ascending' as const,
        technique: 'ir' as const,
        columnName: 'A',
        columnIndex: 1,
        availableColumns: ['A'],
        metadata: {},
        warnings: [],
      };
    };
    const r = analyzeSpectrum(mk(11, true), { reference: mk(12, false) });
    expect(kinds(r)).toEqual(['new-band']);
    expect(Math.abs(r.flags[0]!.energyEv! * 8065.54394 - 2180)).toBeLessThan(30);
    expect(r.flags[0]!.intraband).toBe(true);
  });
});

describe('PL vs parent (energy axis, excitation line excluded)', () => {
  const pr = plSpectrum({ e: 2.1, sigma: 0.05, area: 2000, noise: 0.5, seed: 11, laserNm: 400 });
  it('noise-only pair: nothing flagged', () => {
    const r = analyzeSpectrum(plSpectrum({ e: 2.1, sigma: 0.05, area: 2000, noise: 0.5, seed: 12, laserNm: 400 }), {
      reference: pr,
      excitationNm: 400,
    });
    expect(r.flags).toEqual([]);
    expect(r.firstExciton!.energyEv).toBeCloseTo(2.1, 2);
  });
  it('40 % quench recovered within ±0.02', () => {
    const r = analyzeSpectrum(plSpectrum({ e: 2.1, sigma: 0.05, area: 1200, noise: 0.5, seed: 13, laserNm: 400 }), {
      reference: pr,
      excitationNm: 400,
    });
    expect(kinds(r)).toEqual(['pl-quench']);
    expect(Math.abs(r.flags[0]!.fraction! - 0.4)).toBeLessThan(0.02);
  });
  it('quench per absorbed photon: equal PL from a sample absorbing twice as much is a quench', () => {
    const aS = 0.08;
    const aR = 0.04;
    const r = analyzeSpectrum(plSpectrum({ e: 2.1, sigma: 0.05, area: 2000, noise: 0.5, seed: 14, laserNm: 400 }), {
      reference: pr,
      excitationNm: 400,
      sampleAbsorbanceAtExcitation: aS,
      referenceAbsorbanceAtExcitation: aR,
    });
    // one inner-filter model (right-angle cell viewed at its centre; Lakowicz 2006 §2.12, secondary):
    // emission per absorbed photon ∝ F·10^(A_ex/2)/A_ex, so 1 − (A_R/A_S)·10^((A_S − A_R)/2) (no
    // absorbed fraction 1 − 10^−A on top, which would count the primary inner filter twice)
    const expected = 1 - (aR / aS) * 10 ** ((aS - aR) / 2);
    expect(kinds(r)).toEqual(['pl-quench']);
    expect(Math.abs(r.flags[0]!.fraction! - expected)).toBeLessThan(0.02);
  });
  it('emission red shift of 15 meV recovered within ±2 meV, no quench', () => {
    const r = analyzeSpectrum(plSpectrum({ e: 2.085, sigma: 0.05, area: 2000, noise: 0.5, seed: 15, laserNm: 400 }), {
      reference: pr,
      excitationNm: 400,
    });
    expect(kinds(r)).toEqual(['shift']);
    expect(Math.abs(r.flags[0]!.shiftMeV! + 15)).toBeLessThan(2);
  });
  it('the excitation line is not reported as the emission peak', () => {
    const r = analyzeSpectrum(pr, { excitationNm: 400 });
    expect(r.firstExciton!.wavelengthNm).toBeGreaterThan(HC / 2.2);
  });
});
