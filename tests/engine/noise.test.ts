import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { analyzeSpectrum, estimateNoise, parseSpectrumFile, savitzkyGolayFilter } from '../../lib/engine/index';
import { estimateCorrelatedNoise } from '../../lib/engine/signal/estimateCorrelatedNoise';
import { savitzkyGolayNoiseGain } from '../../lib/engine/signal/savitzkyGolayWeights';
import { makeRng } from './synthetic';
import { realDir } from './scipy';

// White noise of σ0 averaged by the "instrument" over L points (moving average, unit sum) on top
// of a smooth band: the per-point noise shrinks to σ0/√L, but averages over many points keep
// σ0²/(points) — what matters for smoothed values, band integrals and fits. The white-noise-
// equivalent σ the engine must report is therefore σ0 (batch-means argument; Flegal & Jones,
// Ann. Statist. 2010, 38, 1034, from memory). Tolerance: a factor of 1.5 (as asked; common practice).
function instrumentSmoothed(n: number, sigma0: number, L: number, seed: number): Float64Array {
  const rng = makeRng(seed);
  const w = Float64Array.from({ length: n + L }, () => sigma0 * rng());
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let a = 0;
    for (let k = 0; k < L; k++) a += w[i + k]!;
    y[i] = a / L + 0.8 * Math.exp(-0.5 * ((i - n / 2) / (n / 12)) ** 2);
  }
  return y;
}

describe('noise estimate on instrument-smoothed data', () => {
  const sigma0 = 0.002;
  it('white noise (L = 1): within 15 % of σ0, like the lag-1 estimate (common practice)', () => {
    for (const seed of [1, 2, 3]) {
      const y = instrumentSmoothed(4096, sigma0, 1, seed);
      expect(Math.abs(estimateCorrelatedNoise(y, { maxBlockLength: 51 }).sigma / sigma0 - 1)).toBeLessThan(0.15);
      expect(Math.abs(estimateNoise(y) / sigma0 - 1)).toBeLessThan(0.15);
    }
  });
  for (const L of [5, 9]) {
    it(`moving average over ${L} points: within a factor 1.5 of σ0, where the lag-1 estimate is off by more than 2×`, () => {
      const y = instrumentSmoothed(4096, sigma0, L, 10 + L);
      const est = estimateCorrelatedNoise(y, { maxBlockLength: 51 });
      expect(est.sigma / sigma0).toBeGreaterThan(1 / 1.5);
      expect(est.sigma / sigma0).toBeLessThan(1.5);
      expect(est.blockLength).toBeGreaterThan(1);
      // the old estimator (MAD of second differences) fails this case: it sees only ≈ σ0/√L or less
      expect(estimateNoise(y) / sigma0).toBeLessThan(0.5);
    });
  }
  it('σ × √Σw² matches the scatter of smoothed values over 300 noise draws within a factor 1.5 (Monte Carlo)', () => {
    const L = 7;
    const w = 51;
    const n = 2048;
    const values: number[] = [];
    const estimates: number[] = [];
    for (let k = 0; k < 300; k++) {
      const y = instrumentSmoothed(n, sigma0, L, 1000 + k);
      values.push(savitzkyGolayFilter(y, 1, { windowSize: w, polynomial: 2 })[n / 2]!);
      if (k < 20) estimates.push(estimateCorrelatedNoise(y, { maxBlockLength: w }).sigma);
    }
    const mean = values.reduce((a, b) => a + b, 0) / values.length;
    const empirical = Math.sqrt(values.reduce((a, b) => a + (b - mean) ** 2, 0) / (values.length - 1));
    const predicted = (estimates.reduce((a, b) => a + b, 0) / estimates.length) * savitzkyGolayNoiseGain(w, 2, 0);
    expect(predicted / empirical).toBeGreaterThan(1 / 1.5);
    expect(predicted / empirical).toBeLessThan(1.5);
  });
  it('rejects fewer than 9 points with RangeError', () => {
    expect(() => estimateCorrelatedNoise(new Float64Array(8))).toThrow(RangeError);
  });
});

describe('significance on the real CdSe growth series (real-spectra/cdse-absorbance-growth-series.csv)', () => {
  const file = 'cdse-absorbance-growth-series.csv';
  const bytes = new Uint8Array(readFileSync(path.join(realDir, file)));
  it('fractional flags carry the 0.5 % systematic floor (common practice), so significances stay in the tens, not hundreds', () => {
    // consecutive aliquots of a growth series: columns 4→5 (90 s → 120 s)
    const ref = parseSpectrumFile(file, bytes, { column: 4 });
    const smp = parseSpectrumFile(file, bytes, { column: 5 });
    const r = analyzeSpectrum(smp, { reference: ref });
    expect(r.noise.systematicRelative).toBe(0.005);
    expect(r.flags.length).toBeGreaterThan(0);
    for (const f of r.flags) {
      // bleach significance uses the part of the drop not explained by a shift (docs/analysis-json.md)
      // a concentration flag's magnitude is the ratio; its significance is |ratio − 1| / u
      if (f.kind === 'concentration') expect(f.significance).toBeCloseTo(Math.abs(f.magnitude - 1) / f.uncertainty, 6);
      else if (f.kind !== 'bleach') expect(f.significance).toBeCloseTo(Math.abs(f.magnitude) / f.uncertainty, 6);
      if (f.unit === 'fraction') {
        // u(fraction) ≥ 0.005·√2·(1 − fraction) for a bleach (A_s/A_r = 1 − fraction)
        expect(f.uncertainty).toBeGreaterThanOrEqual(0.005 * Math.SQRT2 * (1 - f.fraction!) * 0.999);
      }
      // with the lag-1 noise and no floor this pair gave a bleach at ~260 σ (engine 0.1 behaviour)
      expect(f.significance).toBeLessThan(100);
    }
  });
});
