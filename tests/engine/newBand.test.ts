import { describe, expect, it } from 'vitest';
import { analyzeSpectrum, parseSpectrumFile } from '../../lib/engine/index';
import { absorptionCsv, midIrCsv } from '../../lib/demo/synthetic';
import { absorbanceSpectrum, PARENT_BANDS } from './synthetic';

// One broad band in the difference must give one new-band flag at its top, however many noise
// wiggles ride on it (prominence-based merging; scipy.signal.peak_prominences definition).
const enc = (t: string) => new TextEncoder().encode(t);
const newBands = (r: ReturnType<typeof analyzeSpectrum>) => r.flags.filter((f) => f.kind === 'new-band');

describe('new bands: one broad band gives one flag', () => {
  // Case from lib/demo/synthetic.ts midIrCsv: ligand C–H bands only vs the same plus a Gaussian
  // intraband band at 0.27 eV (σ 0.04 eV, 0.12 absorbance, noise 0.0015; 4000→1000 cm⁻¹, step
  // 2 cm⁻¹). 0.27 eV ≈ 2180 cm⁻¹: 1Se→1Pe of CdSe with E₁ ≈ 2.0 eV (Guyot-Sionnest 2004, confirmed).
  for (const seed of [3, 4, 5, 6]) {
    it(`mid-IR intraband band, noise seed ${seed}: exactly one flag within 0.01 eV of 0.27 eV, intraband`, () => {
      const ref = parseSpectrumFile('parent-ir.csv', enc(midIrCsv({ seed: seed + 100 }, 'parent')));
      const smp = parseSpectrumFile('charged-ir.csv', enc(midIrCsv({ intrabandEv: 0.27, height: 0.12, noise: 0.0015, seed }, 'charged')));
      const r = analyzeSpectrum(smp, { reference: ref });
      expect(r.technique).toBe('ir');
      const nb = newBands(r);
      expect(nb).toHaveLength(1);
      expect(Math.abs(nb[0]!.energyEv! - 0.27)).toBeLessThan(0.01);
      expect(nb[0]!.intraband).toBe(true);
      // height: truth 0.12 absorbance; the derivative-window smoothing (8 meV ≪ σ = 40 meV) keeps it within 10 %
      expect(Math.abs(nb[0]!.magnitude - 0.12)).toBeLessThan(0.012);
    });
  }
  it('mid-IR parent against another noisy parent: no new band (noise only)', () => {
    const ref = parseSpectrumFile('parent-ir.csv', enc(midIrCsv({ seed: 103 }, 'parent')));
    const other = parseSpectrumFile('parent2-ir.csv', enc(midIrCsv({ seed: 104 }, 'parent')));
    expect(newBands(analyzeSpectrum(other, { reference: ref }))).toEqual([]);
  });
  it('absorption: a broad sub-gap band (1.80 eV, σ 0.10 eV) gives one flag within 0.02 eV, not intraband', () => {
    const ref = parseSpectrumFile('parent.csv', enc(absorptionCsv({ firstExcitonEv: 2.1, seed: 1 }, 'parent')));
    for (const seed of [2, 5, 9]) {
      const smp = parseSpectrumFile(
        'charged.csv',
        enc(absorptionCsv({ firstExcitonEv: 2.1, seed, newBand: { centreEv: 1.8, height: 0.05, sigmaEv: 0.1 } }, 'charged')),
      );
      const nb = newBands(analyzeSpectrum(smp, { reference: ref }));
      expect(nb).toHaveLength(1);
      expect(Math.abs(nb[0]!.energyEv! - 1.8)).toBeLessThan(0.02);
      expect(nb[0]!.intraband).toBe(false);
    }
  });
  it('two separate sub-gap bands (1.70 and 1.95 eV, σ 0.03 eV) stay two flags (merging does not swallow a real band)', () => {
    const noise = 0.002;
    const ref = absorbanceSpectrum({ bands: PARENT_BANDS, noise, seed: 1 });
    const smp = absorbanceSpectrum({
      bands: [...PARENT_BANDS, { e: 1.7, sigma: 0.03, a: 0.05 }],
      noise,
      seed: 31,
      newBand: { e: 1.95, sigma: 0.03, a: 0.05 },
    });
    const nb = newBands(analyzeSpectrum(smp, { reference: ref }));
    expect(nb).toHaveLength(2);
    expect(Math.abs(nb[0]!.energyEv! - 1.7)).toBeLessThan(0.015);
    expect(Math.abs(nb[1]!.energyEv! - 1.95)).toBeLessThan(0.015);
  });
});
