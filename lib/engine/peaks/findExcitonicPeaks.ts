import { FWHM_PER_SIGMA, HC_EV_NM } from '../constants';
import { estimateCorrelatedNoise } from '../signal/estimateCorrelatedNoise';
import type { PeakReport } from '../types';
import { findLocalMaxima } from './findLocalMaxima';
import { peakProminences } from './peakProminences';
import { peakWidths } from './peakWidths';

export interface ExcitonicPeakOptions {
  /** Noise σ of the smoothed signal. */
  sigmaSmoothed: number;
  /** Noise σ of the smoothed second derivative (signal/eV²). */
  sigmaSecondDerivative: number;
  /** Smallest significance kept. Default 5. */
  minSignificance?: number;
  /** Points at each end ignored (edge effects of smoothing). Default 0. */
  edgeGuard?: number;
  /** Energies in [lo, hi] ignored, e.g. around an excitation line. */
  exclude?: Array<[number, number]>;
  /**
   * Local noise: the unsmoothed signal on the same grid and the noise gain √Σw² of the smoothing
   * filter that made `smoothed`. When given, each candidate is also tested against the noise seen
   * around it (see localNoiseFactor), so bands in a part of the spectrum noisier than average
   * (photon-counting noise growing with the signal, the λ² emission Jacobian, a resampled axis)
   * are not taken for peaks.
   */
  /**
   * Smallest amplitude (prominence for maxima, −y''σ² for shoulders) as a fraction of the largest
   * |smoothed| value outside the excluded ranges and edge guards. Default 0 (off); the engine uses
   * 0.01 for emission spectra (common practice: features below ~1 % of the main band are at the
   * level of stray light, second-order and detector artefacts and of the band's own shot noise).
   */
  minRelativeAmplitude?: number;
  local?: { raw: ArrayLike<number>; smoothingGain: number; halfWidth?: number; maxBlockLength?: number };
}

export interface ExcitonicPeak extends Omit<PeakReport, 'bandRole'> {
  index: number;
}

/**
 * Every peak object is built here, from one object literal with one field order, so that the code
 * reading peaks sees a single object shape (a copy made by spreading can get another hidden class
 * in V8, and code reading both kinds was re-optimised over and over).
 */
export function excitonicPeak(p: ExcitonicPeak): ExcitonicPeak {
  return {
    index: p.index,
    kind: p.kind,
    energyEv: p.energyEv,
    wavelengthNm: p.wavelengthNm,
    height: p.height,
    amplitude: p.amplitude,
    fwhmMeV: p.fwhmMeV,
    area: p.area,
    significance: p.significance,
  };
}

/**
 * Excitonic peaks on a uniform, ascending energy grid: local maxima of the smoothed signal
 * (prominence-based FWHM as scipy.signal.peak_widths at rel_height 0.5) and shoulders, found as
 * minima of the smoothed second derivative (common practice for first excitons with no local
 * maximum). A shoulder's width comes from the zero crossings of the second derivative, which lie
 * at ±σ for a Gaussian band; its amplitude is −y''·σ².
 * A maximum's significance is prominence / (√2·σ_smoothed·f), a shoulder's −y'' / (σ''·f), with
 * f ≥ 1 the local noise factor when `local` is given (else 1). Sorted by energy.
 */
export function findExcitonicPeaks(
  energy: Float64Array,
  smoothed: Float64Array,
  secondDerivative: Float64Array,
  options: ExcitonicPeakOptions,
): ExcitonicPeak[] {
  const n = energy.length;
  const minSig = options.minSignificance ?? 5;
  const guard = options.edgeGuard ?? 0;
  const step = (energy[n - 1]! - energy[0]!) / (n - 1);
  const ex = options.exclude ?? [];
  const excluded = (e: number) => ex.length > 0 && ex.some(([lo, hi]) => e >= lo && e <= hi);
  const sigS = Math.max(options.sigmaSmoothed, Number.MIN_VALUE);
  const sigD = Math.max(options.sigmaSecondDerivative, Number.MIN_VALUE);
  const peaks: ExcitonicPeak[] = [];
  let floor = 0;
  const rel = options.minRelativeAmplitude ?? 0;
  if (rel > 0) {
    let top = 0;
    for (let i = guard; i < n - guard; i++) if (!excluded(energy[i]!)) top = Math.max(top, Math.abs(smoothed[i]!));
    floor = rel * top;
  }
  const loc = options.local ? localNoiseFactor(smoothed, options.local, sigS, options.local.halfWidth ?? 0) : null;

  const maxima = findLocalMaxima(smoothed);
  const { prominences, leftBases, rightBases } = peakProminences(smoothed, maxima);
  const { widths } = peakWidths(smoothed, maxima, prominences, leftBases, rightBases, 0.5);
  for (let k = 0; k < maxima.length; k++) {
    const i = maxima[k]!;
    if (i < guard || i >= n - guard || excluded(energy[i]!)) continue;
    // global test first (cheap); the local noise level can only raise σ
    if (prominences[k]! / (Math.SQRT2 * sigS) < minSig || prominences[k]! < floor) continue;
    // a prominence is the difference of two smoothed values (top and base), each with noise σ:
    // its own noise is √2·σ (bases far from the top are independent of it)
    const significance = prominences[k]! / (Math.SQRT2 * sigS * (loc ? loc(i) : 1));
    if (significance < minSig) continue;
    const fwhm = widths[k]! * step;
    const eRefined = refine(energy, smoothed, i);
    peaks.push(
      excitonicPeak({
        index: i,
        kind: 'maximum',
        energyEv: eRefined,
        wavelengthNm: HC_EV_NM / eRefined,
        height: smoothed[i]!,
        amplitude: prominences[k]!,
        fwhmMeV: fwhm * 1000,
        area: prominences[k]! * fwhm * 1.0644670194312262,
        significance,
      }),
    );
  }
  // shoulders: minima of y'' with y'' < 0. For each point, the nearest index at or before
  // (after) it where y'' ≥ 0 (or the end), found in one pass each way.
  const nonNegLeft = new Int32Array(n);
  const nonNegRight = new Int32Array(n);
  for (let i = 0, last = 0; i < n; i++) {
    if (secondDerivative[i]! >= 0 || i === 0) last = i;
    nonNegLeft[i] = last;
  }
  for (let i = n - 1, last = n - 1; i >= 0; i--) {
    if (secondDerivative[i]! >= 0 || i === n - 1) last = i;
    nonNegRight[i] = last;
  }
  for (let i = Math.max(1, guard); i < Math.min(n - 1, n - guard); i++) {
    const d = secondDerivative[i]!;
    if (!(d < 0 && d <= secondDerivative[i - 1]! && d < secondDerivative[i + 1]!)) continue;
    if (excluded(energy[i]!)) continue;
    if (-d / sigD < minSig) continue;
    const l = nonNegLeft[i]!;
    const r = nonNegRight[i]!;
    const leftOk = secondDerivative[l]! >= 0;
    const rightOk = secondDerivative[r]! >= 0;
    const zl = leftOk ? l + secondDerivative[l]! / (secondDerivative[l]! - secondDerivative[l + 1]!) : NaN;
    const zr = rightOk ? r - secondDerivative[r]! / (secondDerivative[r]! - secondDerivative[r - 1]!) : NaN;
    let sigmaPts: number;
    if (leftOk && rightOk) {
      const a = i - zl;
      const b = zr - i;
      sigmaPts = Math.max(a, b) < 2 * Math.min(a, b) ? 0.5 * (a + b) : Math.min(a, b);
    } else if (leftOk) sigmaPts = i - zl;
    else if (rightOk) sigmaPts = zr - i;
    else continue;
    // only the deepest minimum within ±σ counts (small ripples inside one band are not bands)
    const rad = Math.max(1, Math.round(sigmaPts));
    let deepest = true;
    for (let j = Math.max(0, i - rad); j <= Math.min(n - 1, i + rad); j++) if (secondDerivative[j]! < d) deepest = false;
    if (!deepest) continue;
    const sigmaEv = sigmaPts * step;
    const fwhm = sigmaEv * FWHM_PER_SIGMA;
    // same band as a maximum already found?
    const dup = peaks.some(
      (p) => p.kind === 'maximum' && Math.abs(p.energyEv - energy[i]!) < Math.max((0.5 * (p.fwhmMeV ?? 0)) / 1000, 3 * step),
    );
    if (dup) continue;
    const amplitude = -d * sigmaEv * sigmaEv;
    if (amplitude < floor) continue;
    // local noise last: the cheaper tests above reject most candidates
    const significance = -d / (sigD * (loc ? loc(i) : 1));
    if (significance < minSig) continue;
    const e = refine(energy, secondDerivative, i, true);
    peaks.push(
      excitonicPeak({
        index: i,
        kind: 'shoulder',
        energyEv: e,
        wavelengthNm: HC_EV_NM / e,
        height: smoothed[i]!,
        amplitude,
        fwhmMeV: fwhm * 1000,
        area: amplitude * fwhm * 1.0644670194312262,
        significance,
      }),
    );
  }
  peaks.sort((a, b) => a.energyEv - b.energyEv);
  return peaks;
}

/**
 * Factor (≥ 1) by which the noise around index i exceeds the global estimate, applied to the
 * maxima and shoulders found there. The local σ is the engine's own noise estimate
 * (estimateCorrelatedNoise: white-noise-equivalent σ from fourth differences of block means,
 * blocks up to the smoothing window) on the unsmoothed signal in a window of ±h points around i
 * (h = `halfWidth`, at least 64 so that blocks of 4 points still leave 32 block means), times the
 * filter gain √Σw²; the factor is max(1, σ_local·√Σw² / σ_smoothed). Never below 1: the global
 * estimate stays the floor, so a quiet stretch cannot make a peak more significant than before.
 * Results are cached per index (maxima and shoulders may share one).
 */
function localNoiseFactor(
  smoothed: Float64Array,
  local: { raw: ArrayLike<number>; smoothingGain: number; maxBlockLength?: number },
  sigmaSmoothed: number,
  halfWidth: number,
): (i: number) => number {
  const n = smoothed.length;
  if (!(local.smoothingGain > 0) || local.raw.length !== n)
    throw new RangeError('local noise needs raw data on the same grid and a positive smoothing gain');
  const raw = local.raw instanceof Float64Array ? local.raw : Float64Array.from(local.raw);
  const h = Math.max(MIN_LOCAL_HALF_WIDTH, Math.round(halfWidth));
  const cache = new Map<number, number>();
  return (i: number) => {
    let f = cache.get(i);
    if (f !== undefined) return f;
    const lo = Math.max(0, Math.min(i - h, n - 2 * h - 1));
    const hi = Math.min(n, lo + 2 * h + 1);
    f = 1;
    if (hi - lo >= 9) {
      const est = estimateCorrelatedNoise(raw.subarray(lo, hi), { maxBlockLength: local.maxBlockLength ?? Infinity });
      f = Math.max(1, (est.sigma * local.smoothingGain) / sigmaSmoothed);
    }
    cache.set(i, f);
    return f;
  };
}

/** Smallest half-width of the local noise window (points). */
const MIN_LOCAL_HALF_WIDTH = 64;

/** Parabolic interpolation of an extremum through three samples. */
function refine(x: Float64Array, y: Float64Array, i: number, minimum = false): number {
  if (i <= 0 || i >= x.length - 1) return x[i]!;
  const a = y[i - 1]!;
  const b = y[i]!;
  const c = y[i + 1]!;
  const den = a - 2 * b + c;
  if (den === 0 || (minimum ? den < 0 : den > 0)) return x[i]!;
  const off = (0.5 * (a - c)) / den;
  if (Math.abs(off) > 1) return x[i]!;
  return x[i]! + off * (x[i + 1]! - x[i]!);
}
