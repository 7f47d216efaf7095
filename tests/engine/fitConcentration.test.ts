import { describe, expect, it } from 'vitest';
import { fitConcentration } from '@/lib/engine/compare/fitConcentration';
import { makeRng } from './synthetic';
import { scipy } from './scipy';

// fitConcentration against numpy.linalg.lstsq on the same arrays, and against the known truth of a
// noise-free model S = k·R + b₀ + b₁·E + c·(E/E_c)^4.
const n = 600;
const E = Float64Array.from({ length: n }, (_, i) => 1.6 + (2.0 * i) / (n - 1));
const R = E.map((e) => 0.5 * Math.exp(-0.5 * ((e - 2.2) / 0.05) ** 2) + 0.3 * Math.max(0, e - 2.4) ** 1.5);
const R1 = new Float64Array(n);
for (let i = 1; i < n - 1; i++) R1[i] = (R[i + 1]! - R[i - 1]!) / (E[i + 1]! - E[i - 1]!);
const mask = Uint8Array.from(E, (e) => (e <= 2.0 || e >= 2.7 ? 1 : 0));
const none = new Uint8Array(n);

describe('fitConcentration', () => {
  it('recovers k, offset, slope and a λ⁻⁴ (E⁴) scattering term of a noise-free model exactly', () => {
    const centre = 0.5 * (1.6 + 3.6);
    const S = E.map((e, i) => 0.7 * R[i]! + 0.01 + 0.02 * e + 0.004 * (e / centre) ** 4);
    // noise-free: a tiny σ, so the 25σ² rule keeps the scattering term the data need
    const f = fitConcentration(E, S, R, R1, mask, {
      sigmaSample: 1e-7,
      sigmaReference: 0,
      clipWindow: 9,
      allowSlopeAndScatter: true,
      clippable: none,
    })!;
    expect(f.ratio).toBeCloseTo(0.7, 6);
    expect(f.scatterPower).toBe(4);
    expect(f.offset).toBeCloseTo(0.01, 6);
    expect(f.slope).toBeCloseTo(0.02, 6);
    expect(f.scatter).toBeCloseTo(0.004, 6);
  });
  it('equals numpy.linalg.lstsq on a noisy pair (offset and slope model, no clipping)', () => {
    const rng = makeRng(5);
    const S = E.map((_e, i) => 0.8 * R[i]! + 0.003 + 0.002 * rng());
    const f = fitConcentration(E, S, R, R1, mask, {
      sigmaSample: 0.002,
      sigmaReference: 0,
      clipWindow: 9,
      allowSlopeAndScatter: true,
      clippable: none,
    })!;
    const idx = [...mask.keys()].filter((i) => mask[i]);
    const lo = 1.6;
    const hi = 3.6;
    const c = 0.5 * (lo + hi);
    const h = 0.5 * (hi - lo);
    const cols = [idx.map((i) => R[i]!), idx.map((i) => R1[i]!), idx.map(() => 1), idx.map((i) => (E[i]! - c) / h)];
    const coef = scipy<number[]>({ op: 'lstsq', columns: cols, y: idx.map((i) => S[i]!) });
    if (f.scatterPower === null) {
      expect(f.ratio).toBeCloseTo(coef[0]!, 8);
      expect(f.slope).toBeCloseTo(coef[3]! / h, 8);
    } else {
      // a scattering term was kept: then k must still be within its uncertainty of the simpler fit
      expect(Math.abs(f.ratio - coef[0]!)).toBeLessThan(3 * f.sigmaRatio);
    }
  });
});
