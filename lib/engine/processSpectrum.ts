import { HC_EV_NM } from './constants';
import { TECHNIQUE_SPECS } from '../registry/techniques';
import { toEnergyAxis } from './axis/toEnergyAxis';
import { resampleUniform } from './axis/resampleUniform';
import { savitzkyGolayFilter, savitzkyGolayQuadraticBank } from './signal/savitzkyGolayFilter';
import { savitzkyGolayNoiseGain } from './signal/savitzkyGolayWeights';
import { estimateCorrelatedNoise, type CorrelatedNoiseEstimate } from './signal/estimateCorrelatedNoise';
import { fitBaseline } from './signal/fitBaseline';
import { excitonicPeak, findExcitonicPeaks, type ExcitonicPeak } from './peaks/findExcitonicPeaks';
import { lowEnergyHalfWidth } from './peaks/lowEnergyHalfWidth';
import { fitDarkLevel } from './signal/fitDarkLevel';
import type { ParsedSpectrum, Technique, XUnit } from './types';

export interface ProcessedSpectrum {
  energy: Float64Array;
  step: number;
  /** Signal on the grid (Jacobian applied for PL, %T turned into absorbance), baseline removed. */
  raw: Float64Array;
  smoothed: Float64Array;
  /** Smoothed with the derivative window (used for difference spectra). */
  smoothedWide: Float64Array;
  firstDerivative: Float64Array;
  secondDerivative: Float64Array;
  /** White-noise-equivalent noise σ per point (estimateCorrelatedNoise). */
  sigma: number;
  /** Block length (points) at which σ was estimated. */
  noiseBlockLength: number;
  sigmaSmoothed: number;
  sigmaSecondDerivative: number;
  sigmaFirstDerivative: number;
  windowSize: number;
  derivativeWindowSize: number;
  polynomial: number;
  baselineApplied: boolean;
  peaks: ExcitonicPeak[];
  firstExciton: ExcitonicPeak | null;
  exclude: Array<[number, number]>;
  /** PL dark level subtracted, in counts per unit of the file's X axis (after `scale`); null when none. */
  darkLevel: number | null;
  warnings: string[];
}

/** Energy-axis signal of a parsed spectrum (no grid yet): Jacobian for PL, %T → absorbance. */
export function spectrumToEnergy(
  s: ParsedSpectrum,
  technique: Technique,
): { energy: Float64Array; signal: Float64Array; warnings: string[] } {
  const warnings: string[] = [];
  let y = s.y;
  if (s.yUnit === 'percent-transmittance') {
    y = new Float64Array(s.y.length);
    let clipped = 0;
    for (let i = 0; i < y.length; i++) {
      let t = s.y[i]!;
      if (t <= 1e-6) {
        t = 1e-6;
        clipped++;
      }
      y[i] = 2 - Math.log10(t);
    }
    warnings.push(`${s.fileName}: %T converted to absorbance, A = 2 − log10(%T)`);
    if (clipped) warnings.push(`${s.fileName}: ${clipped} point(s) with %T ≤ 0 clipped before conversion`);
  }
  const emission = TECHNIQUE_SPECS[technique].jacobian && s.yUnit === 'counts';
  const { energy, signal } = toEnergyAxis(s.x, y, s.xUnit, { emission });
  return { energy, signal, warnings };
}

export interface ProcessOptions {
  technique: Technique;
  windowSize: number;
  /** Window for the first and second derivatives (wider: derivatives amplify noise). */
  derivativeWindowSize: number;
  polynomial: number;
  baseline: 'none' | 'offset' | 'scatter';
  minSignificance: number;
  excitationNm?: number | undefined;
  excitationExclusionNm: number;
  scale?: number;
  /** Smooth background (on the grid, in the signal's own units) subtracted before `scale` is applied. */
  background?: Float64Array | undefined;
  /** PL: subtract a dark level fitted on the band-free ends ('auto'), recorded per unit of `xUnit`. Default 'none'. */
  darkLevel?: 'auto' | 'none';
  /** X unit of the file (for the dark level's Jacobian on the energy axis). */
  xUnit?: XUnit;
  /**
   * The same signal already on this grid (unscaled) and, optionally, its noise estimate with
   * blocks up to `noiseMaxBlockLength` points: reused instead of resampling and re-estimating.
   */
  gridded?: { x: Float64Array; y: Float64Array; step: number; noise?: CorrelatedNoiseEstimate; noiseMaxBlockLength?: number };
}

/** Largest power of two ≤ w: block lengths tried by estimateCorrelatedNoise with maxBlockLength w. */
function blockCap(w: number): number {
  let b = 1;
  while (b * 2 <= w) b *= 2;
  return b;
}

/**
 * Puts one spectrum on a uniform energy grid and computes everything that does not need a
 * reference: noise, smoothing, derivatives, baseline, peaks, first exciton.
 */
export function processSpectrum(
  energy: Float64Array,
  signal: Float64Array,
  grid: { from: number; to: number; n: number },
  o: ProcessOptions,
): ProcessedSpectrum {
  const warnings: string[] = [];
  const pre = o.gridded;
  const g = pre ? { x: pre.x, y: pre.y.slice(), step: pre.step } : resampleUniform(energy, signal, grid.from, grid.to, grid.n);
  const raw = g.y;
  const scale = o.scale ?? 1;
  const bg = o.background;
  if (bg) {
    if (bg.length !== raw.length) throw new RangeError('background must lie on the analysis grid');
    for (let i = 0; i < raw.length; i++) raw[i] = raw[i]! - bg[i]!;
  }
  if (scale !== 1) for (let i = 0; i < raw.length; i++) raw[i] = raw[i]! * scale;
  const step = g.step;
  const exclude: Array<[number, number]> = [];
  if (o.technique === 'pl' && o.excitationNm) {
    const eCut = HC_EV_NM / (o.excitationNm + o.excitationExclusionNm);
    exclude.push([eCut, Infinity]);
  }
  const w = o.windowSize;
  // white-noise-equivalent σ, blocks up to the smoothing window (instrument-smoothed noise included)
  // (σ of scale·y is |scale|·σ of y: the MAD is scale-equivariant)
  const reuse = pre?.noise && pre.noiseMaxBlockLength !== undefined && blockCap(pre.noiseMaxBlockLength) === blockCap(w);
  const noise = reuse ? pre.noise! : estimateCorrelatedNoise(raw, { maxBlockLength: w });
  const sigma = reuse ? noise.sigma * Math.abs(scale) : noise.sigma;
  const p = o.polynomial;
  const pd = Math.max(p, 2);
  let smoothed = savitzkyGolayFilter(raw, step, { windowSize: w, polynomial: p, derivative: 0 });
  let darkLevel: number | null = null;
  if (o.technique === 'pl' && o.darkLevel === 'auto') {
    const dark = fitDarkLevel(g.x, raw, smoothed, { exclude, edgeGuard: (w - 1) / 2, xUnit: o.xUnit ?? 'nm' });
    if (dark.level !== null) {
      for (let i = 0; i < raw.length; i++) raw[i] = raw[i]! - dark.level * dark.jacobian[i]!;
      smoothed = savitzkyGolayFilter(raw, step, { windowSize: w, polynomial: p, derivative: 0 });
      darkLevel = dark.level;
    } else warnings.push(dark.reason);
  }
  const wd = o.derivativeWindowSize;
  // the wide window gives the derivatives and the smoothing used for difference spectra; one pass
  const wide =
    pd === 2 || pd === 3
      ? savitzkyGolayQuadraticBank(raw, step, wd, pd)
      : {
          smoothed: savitzkyGolayFilter(raw, step, { windowSize: wd, polynomial: p, derivative: 0 }),
          firstDerivative: savitzkyGolayFilter(raw, step, { windowSize: wd, polynomial: pd, derivative: 1 }),
          secondDerivative: savitzkyGolayFilter(raw, step, { windowSize: wd, polynomial: pd, derivative: 2 }),
        };
  if (pd !== p) wide.smoothed = savitzkyGolayFilter(raw, step, { windowSize: wd, polynomial: p, derivative: 0 });
  let smoothedWide = wide.smoothed;
  const { firstDerivative, secondDerivative } = wide;
  const sigmaSmoothed = sigma * savitzkyGolayNoiseGain(w, p, 0);
  const sigmaFirstDerivative = (sigma * savitzkyGolayNoiseGain(wd, pd, 1)) / step;
  const sigmaSecondDerivative = (sigma * savitzkyGolayNoiseGain(wd, pd, 2)) / (step * step);
  const guard = (Math.max(w, wd) - 1) / 2;
  // local noise: the same estimator on ±max(64, 6w) points around each candidate
  const local = { raw, smoothingGain: savitzkyGolayNoiseGain(w, p, 0), halfWidth: 6 * w, maxBlockLength: w };
  const peakOpts = {
    sigmaSmoothed,
    sigmaSecondDerivative,
    minSignificance: o.minSignificance,
    edgeGuard: guard,
    exclude,
    local,
    minRelativeAmplitude: TECHNIQUE_SPECS[o.technique].minRelativePeakAmplitude,
  };
  let peaks = findExcitonicPeaks(g.x, smoothed, secondDerivative, peakOpts);
  let first = pickFirstExciton(peaks, smoothed, o.technique);
  if (first && o.technique === 'absorption') ({ first, peaks } = withLowEnergyWidth(first, peaks, g.x, smoothed));
  let baselineApplied = false;
  if (o.baseline !== 'none' && o.technique !== 'pl') {
    if (first && first.fwhmMeV) {
      const below = first.energyEv - Math.max((2 * first.fwhmMeV) / 1000, 0.1);
      const base = fitBaseline(g.x, smoothed, below, o.baseline);
      if (base) {
        for (let i = 0; i < raw.length; i++) raw[i] = raw[i]! - base[i]!;
        baselineApplied = true;
        if (o.baseline === 'offset') {
          // Savitzky–Golay filters reproduce constants exactly (interior and polynomial edges), so
          // smoothing (raw − c) is smoothing − c; maxima, prominences, widths and shoulders do not
          // move, only heights (the second derivative is not recomputed, as for 'scatter').
          const c = base[0]!;
          for (let i = 0; i < smoothed.length; i++) smoothed[i] = smoothed[i]! - c;
          for (let i = 0; i < smoothedWide.length; i++) smoothedWide[i] = smoothedWide[i]! - c;
          peaks = peaks.map((q) => excitonicPeak({ ...q, height: smoothed[q.index]! }));
        } else {
          smoothed = savitzkyGolayFilter(raw, step, { windowSize: w, polynomial: p, derivative: 0 });
          smoothedWide = savitzkyGolayFilter(raw, step, { windowSize: wd, polynomial: p, derivative: 0 });
          peaks = findExcitonicPeaks(g.x, smoothed, secondDerivative, peakOpts);
        }
        first = pickFirstExciton(peaks, smoothed, o.technique);
        if (first && o.technique === 'absorption') ({ first, peaks } = withLowEnergyWidth(first, peaks, g.x, smoothed));
      } else {
        warnings.push(`baseline (${o.baseline}) not applied: fewer than 8 points in the transparent region below ${below.toFixed(3)} eV`);
      }
    } else {
      warnings.push(`baseline (${o.baseline}) not applied: no first exciton to place the transparent region`);
    }
  }
  return {
    energy: g.x,
    step,
    raw,
    smoothed,
    smoothedWide,
    firstDerivative,
    secondDerivative,
    sigma,
    noiseBlockLength: noise.blockLength,
    sigmaSmoothed,
    sigmaFirstDerivative,
    sigmaSecondDerivative,
    windowSize: w,
    derivativeWindowSize: wd,
    polynomial: p,
    baselineApplied,
    peaks,
    firstExciton: first,
    exclude,
    darkLevel,
    warnings,
  };
}

/**
 * The first exciton's FWHM as twice its low-energy half width at half maximum, measured on the
 * smoothed signal (the high-energy half overlaps the next transitions; common practice, and the
 * width Jasieniak et al. 2009 scale ε with). Maxima only: a shoulder keeps the width from its
 * second derivative's zero crossings. The peak is replaced in the list too.
 */
function withLowEnergyWidth(
  first: ExcitonicPeak,
  peaks: ExcitonicPeak[],
  energy: Float64Array,
  smoothed: Float64Array,
): { first: ExcitonicPeak; peaks: ExcitonicPeak[] } {
  if (first.kind !== 'maximum') return { first, peaks };
  const hwhm = lowEnergyHalfWidth(energy, smoothed, first.index);
  if (hwhm === null) return { first, peaks };
  const fwhm = 2 * hwhm;
  const updated = excitonicPeak({ ...first, fwhmMeV: fwhm * 1000, area: first.height * fwhm * 1.0644670194312262 });
  return { first: updated, peaks: peaks.map((q) => (q === first ? updated : q)) };
}

/**
 * First exciton: for absorption, the lowest-energy significant feature whose amplitude is at least
 * 2 % of the largest signal (common practice); for PL, the strongest emission maximum; none for IR.
 */
export function pickFirstExciton(peaks: ExcitonicPeak[], smoothed: Float64Array, technique: Technique): ExcitonicPeak | null {
  const policy = TECHNIQUE_SPECS[technique].firstExciton;
  if (policy === 'none' || peaks.length === 0) return null;
  if (policy === 'emission-maximum') {
    let best: ExcitonicPeak | null = null;
    for (let i = 0; i < peaks.length; i++) {
      const p = peaks[i]!;
      if (p.kind === 'maximum' && (!best || p.height > best.height)) best = p;
    }
    return best ?? peaks.reduce((a, b) => (b.amplitude > a.amplitude ? b : a));
  }
  let max = 0;
  for (let i = 0; i < smoothed.length; i++) if (Math.abs(smoothed[i]!) > max) max = Math.abs(smoothed[i]!);
  const floor = 0.02 * max;
  for (let i = 0; i < peaks.length; i++) {
    const p = peaks[i]!;
    if (p.amplitude >= floor && p.height > 0) return p;
  }
  return null;
}
