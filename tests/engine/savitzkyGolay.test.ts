import { beforeAll, describe, expect, it } from 'vitest';
import { savitzkyGolayFilter } from '../../lib/engine/signal/savitzkyGolayFilter';
import { savitzkyGolayWeights } from '../../lib/engine/signal/savitzkyGolayWeights';
import { makeRng } from './synthetic';
import { scipy } from './scipy';

// Source: Savitzky & Golay, Anal. Chem. 1964, 36, 1627, with Steinier, Termonia & Deltour,
// Anal. Chem. 1972, 44, 1906 corrections, as tabulated in DOMAIN.md §2 (smoothing rows confirmed
// against a published table; derivative rows computed, equal to scipy savgol_coeffs use='dot').
const TABLE: Array<{ w: number; p: number; d: number; weights: number[]; norm: number }> = [
  { w: 5, p: 2, d: 0, weights: [-3, 12, 17, 12, -3], norm: 35 },
  { w: 5, p: 3, d: 0, weights: [-3, 12, 17, 12, -3], norm: 35 },
  { w: 7, p: 2, d: 0, weights: [-2, 3, 6, 7, 6, 3, -2], norm: 21 },
  { w: 9, p: 2, d: 0, weights: [-21, 14, 39, 54, 59, 54, 39, 14, -21], norm: 231 },
  { w: 11, p: 2, d: 0, weights: [-36, 9, 44, 69, 84, 89, 84, 69, 44, 9, -36], norm: 429 },
  { w: 5, p: 2, d: 1, weights: [-2, -1, 0, 1, 2], norm: 10 },
  { w: 7, p: 2, d: 1, weights: [-3, -2, -1, 0, 1, 2, 3], norm: 28 },
  { w: 5, p: 2, d: 2, weights: [2, -1, -2, -1, 2], norm: 7 },
  { w: 7, p: 2, d: 2, weights: [5, 0, -3, -4, -3, 0, 5], norm: 42 },
];

describe('Savitzky–Golay convolution weights', () => {
  for (const row of TABLE) {
    it(`w=${row.w} p=${row.p} d=${row.d} equals the published table (Savitzky & Golay 1964; Steinier 1972)`, () => {
      const w = savitzkyGolayWeights(row.w, row.p, row.d);
      row.weights.forEach((v, i) => expect(w[i]).toBeCloseTo(v / row.norm, 12));
    });
    it(`w=${row.w} p=${row.p} d=${row.d}: the filter applied to a unit impulse reproduces the table (h = 1)`, () => {
      // Convolving an impulse gives the weights reversed; table is left-to-right 'dot' order.
      const n = 41;
      const y = new Float64Array(n);
      y[20] = 1;
      const out = savitzkyGolayFilter(y, 1, { windowSize: row.w, polynomial: row.p, derivative: row.d });
      const half = (row.w - 1) / 2;
      for (let k = -half; k <= half; k++) expect(out[20 - k]).toBeCloseTo(row.weights[k + half]! / row.norm, 12);
    });
  }
  it('weights match scipy.signal.savgol_coeffs(use="dot") for a wider window (scipy 1.17)', () => {
    const ref = scipy<number[]>({ op: 'coeffs', window: 21, poly: 4, deriv: 2 });
    const w = savitzkyGolayWeights(21, 4, 2);
    ref.forEach((v, i) => expect(w[i]).toBeCloseTo(v, 10));
  });
  it('rejects bad windows with RangeError', () => {
    expect(() => savitzkyGolayFilter(new Float64Array(20), 1, { windowSize: 4 })).toThrow(RangeError);
    expect(() => savitzkyGolayFilter(new Float64Array(20), 1, { windowSize: 7, polynomial: 7 })).toThrow(RangeError);
    expect(() => savitzkyGolayFilter(new Float64Array(4), 1, { windowSize: 5 })).toThrow('windowSize must not exceed the data length');
  });
});

describe('Savitzky–Golay filter vs scipy.signal.savgol_filter(mode="interp")', () => {
  // Edge treatment: polynomial fit to the first/last window, as scipy mode='interp' (stated in
  // savitzkyGolayFilter.ts). Interior from sliding moments (p ≤ 3) or savitzkyGolayWeights (p = 4).
  const rng = makeRng(42);
  const n = 300;
  const h = 0.0037;
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) y[i] = Math.exp(-(((i - 140) / 25) ** 2)) + 0.3 * Math.sin(i / 17) + 0.02 * rng();
  const yCopy = Float64Array.from(y);
  const cases = [
    { w: 5, p: 2, d: 0 },
    { w: 11, p: 2, d: 0 },
    { w: 15, p: 3, d: 0 },
    { w: 11, p: 2, d: 1 },
    { w: 21, p: 3, d: 1 },
    { w: 15, p: 2, d: 2 },
    { w: 25, p: 4, d: 2 },
  ];
  let refs: number[][] = [];
  beforeAll(() => {
    refs = scipy<number[][]>({
      op: 'batch',
      requests: cases.map((c) => ({ op: 'savgol', y: Array.from(y), window: c.w, poly: c.p, deriv: c.d, delta: h })),
    });
  });
  for (const [ci, c] of cases.entries()) {
    it(`w=${c.w} p=${c.p} deriv=${c.d}: interior and both edges agree`, () => {
      const ours = savitzkyGolayFilter(y, h, { windowSize: c.w, polynomial: c.p, derivative: c.d });
      const ref = refs[ci]!;
      let scale = 0;
      for (const v of ref) scale = Math.max(scale, Math.abs(v));
      const half = (c.w - 1) / 2;
      for (let i = 0; i < n; i++) {
        // interior: sliding moments, or savitzkyGolayWeights for p=4 (a Gram-matrix solve, which may lose ~1e-9 for w=25)
        const tol = (i < half || i >= n - half ? 1e-8 : 1e-8) * scale;
        expect(Math.abs(ours[i]! - ref[i]!)).toBeLessThanOrEqual(tol);
      }
    });
  }
  it('does not modify its input', () => {
    savitzkyGolayFilter(y, h, { windowSize: 9 });
    expect(Array.from(y)).toEqual(Array.from(yCopy));
  });
});

describe('Savitzky–Golay on a long array with wide windows (sliding-moment interior) vs scipy savgol_filter', () => {
  // 4096 points as in the benchmark: the moments are updated over ~4000 steps (resynchronised every
  // 64), so rounding drift would show here. Reference: scipy 1.17, mode="interp".
  const rng = makeRng(9);
  const n = 4096;
  const h = 0.000486;
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++)
    y[i] = 0.5 * Math.exp(-0.5 * ((i - 1400) / 90) ** 2) + 0.35 * Math.exp(-0.5 * ((i - 2300) / 140) ** 2) + 0.3 + 0.002 * rng();
  const cases = [
    { w: 51, p: 2, d: 0 },
    { w: 165, p: 2, d: 0 },
    { w: 165, p: 2, d: 1 },
    { w: 165, p: 2, d: 2 },
    { w: 165, p: 3, d: 2 },
  ];
  let refs: number[][] = [];
  beforeAll(() => {
    refs = scipy<number[][]>({
      op: 'batch',
      requests: cases.map((c) => ({ op: 'savgol', y: Array.from(y), window: c.w, poly: c.p, deriv: c.d, delta: h })),
    });
  });
  for (const [ci, c] of cases.entries()) {
    it(`w=${c.w} p=${c.p} deriv=${c.d}: every point within 1e-9 of the largest |value|`, () => {
      const ours = savitzkyGolayFilter(y, h, { windowSize: c.w, polynomial: c.p, derivative: c.d });
      const ref = refs[ci]!;
      let scale = 0;
      for (const v of ref) scale = Math.max(scale, Math.abs(v));
      let worst = 0;
      for (let i = 0; i < n; i++) worst = Math.max(worst, Math.abs(ours[i]! - ref[i]!));
      expect(worst).toBeLessThanOrEqual(1e-9 * scale);
    });
  }
});
