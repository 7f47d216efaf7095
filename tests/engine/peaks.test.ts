import { beforeAll, describe, expect, it } from 'vitest';
import { findLocalMaxima } from '../../lib/engine/peaks/findLocalMaxima';
import { peakProminences } from '../../lib/engine/peaks/peakProminences';
import { peakWidths } from '../../lib/engine/peaks/peakWidths';
import { findExcitonicPeaks } from '../../lib/engine/peaks/findExcitonicPeaks';
import { savitzkyGolayFilter } from '../../lib/engine/signal/savitzkyGolayFilter';
import { makeRng } from './synthetic';
import { scipy } from './scipy';

type PeakRef = {
  peaks: number[];
  prominences: number[];
  left: number[];
  right: number[];
  widths: number[];
  leftIps: number[];
  rightIps: number[];
};

describe('peak finding vs scipy.signal.find_peaks / peak_prominences / peak_widths (scipy 1.17)', () => {
  const rng = makeRng(7);
  const n = 500;
  const noisy = new Float64Array(n);
  const plateau = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    noisy[i] = 2 * Math.exp(-0.5 * ((i - 120) / 12) ** 2) + Math.exp(-0.5 * ((i - 300) / 30) ** 2) + 0.05 * rng();
    plateau[i] = Math.round(3 * Math.sin(i / 20) + 0.3 * Math.sin(i / 3)); // flat tops
  }
  const arrays = { noisy, plateau };
  let refs: PeakRef[] = [];
  beforeAll(() => {
    refs = scipy<PeakRef[]>({ op: 'batch', requests: Object.values(arrays).map((y) => ({ op: 'peaks', y: Array.from(y) })) });
  });
  Object.entries(arrays).forEach(([name, y], k) => {
    it(`${name}: same maxima, prominences, bases and half-prominence widths`, () => {
      const ref = refs[k]!;
      const peaks = findLocalMaxima(y);
      expect(Array.from(peaks)).toEqual(ref.peaks);
      expect(ref.peaks.length).toBeGreaterThan(3);
      const pr = peakProminences(y, peaks);
      expect(Array.from(pr.leftBases)).toEqual(ref.left);
      expect(Array.from(pr.rightBases)).toEqual(ref.right);
      pr.prominences.forEach((v, i) => expect(v).toBeCloseTo(ref.prominences[i]!, 12));
      const w = peakWidths(y, peaks, pr.prominences, pr.leftBases, pr.rightBases, 0.5);
      w.widths.forEach((v, i) => expect(v).toBeCloseTo(ref.widths[i]!, 10));
      w.leftIps.forEach((v, i) => expect(v).toBeCloseTo(ref.leftIps[i]!, 10));
      w.rightIps.forEach((v, i) => expect(v).toBeCloseTo(ref.rightIps[i]!, 10));
    });
  });
});

describe('excitonic peaks: maxima and shoulders', () => {
  it('finds a Gaussian maximum at its centre with FWHM 2√(2 ln 2)σ (analytic)', () => {
    const n = 801;
    const e = Float64Array.from({ length: n }, (_, i) => 1.8 + (0.8 * i) / (n - 1));
    const step = e[1]! - e[0]!;
    const y = e.map((v) => Math.exp(-0.5 * ((v - 2.2) / 0.04) ** 2));
    const s = savitzkyGolayFilter(y, step, { windowSize: 7 });
    const d2 = savitzkyGolayFilter(y, step, { windowSize: 21, derivative: 2 });
    const peaks = findExcitonicPeaks(e, s, d2, { sigmaSmoothed: 1e-4, sigmaSecondDerivative: 1e-2 });
    const max = peaks.filter((p) => p.kind === 'maximum');
    expect(max).toHaveLength(1);
    expect(max[0]!.energyEv).toBeCloseTo(2.2, 4);
    expect(max[0]!.fwhmMeV! / 1000).toBeCloseTo(0.04 * 2.3548200450309493, 3);
  });
  it('finds a shoulder with no local maximum as a second-derivative minimum (common practice)', () => {
    const n = 801;
    const e = Float64Array.from({ length: n }, (_, i) => 1.8 + (1.2 * i) / (n - 1));
    const step = e[1]! - e[0]!;
    // first exciton at 2.2 eV (σ 0.05) on the rising flank of a much larger band at 2.6 eV
    const y = e.map((v) => 0.2 * Math.exp(-0.5 * ((v - 2.2) / 0.05) ** 2) + 3 * Math.exp(-0.5 * ((v - 2.6) / 0.2) ** 2));
    const s = savitzkyGolayFilter(y, step, { windowSize: 7 });
    const d2 = savitzkyGolayFilter(y, step, { windowSize: 21, derivative: 2 });
    expect(findLocalMaxima(s.subarray(0, 500)).length).toBe(0); // truly a shoulder
    const peaks = findExcitonicPeaks(e, s, d2, { sigmaSmoothed: 1e-4, sigmaSecondDerivative: 1e-2 });
    const sh = peaks.find((p) => p.kind === 'shoulder' && Math.abs(p.energyEv - 2.2) < 0.03);
    expect(sh).toBeDefined();
    expect(sh!.energyEv).toBeCloseTo(2.2, 1);
  });
});
