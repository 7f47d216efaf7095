import { FWHM_PER_SIGMA, HC_EV_NM } from '../constants';
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
}

export interface ExcitonicPeak extends PeakReport {
  index: number;
}

/**
 * Excitonic peaks on a uniform, ascending energy grid: local maxima of the smoothed signal
 * (prominence-based FWHM as scipy.signal.peak_widths at rel_height 0.5) and shoulders, found as
 * minima of the smoothed second derivative (common practice for first excitons with no local
 * maximum). A shoulder's width comes from the zero crossings of the second derivative, which lie
 * at ±σ for a Gaussian band; its amplitude is −y''·σ². Sorted by energy.
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

  const maxima = findLocalMaxima(smoothed);
  const { prominences, leftBases, rightBases } = peakProminences(smoothed, maxima);
  const { widths } = peakWidths(smoothed, maxima, prominences, leftBases, rightBases, 0.5);
  for (let k = 0; k < maxima.length; k++) {
    const i = maxima[k]!;
    if (i < guard || i >= n - guard || excluded(energy[i]!)) continue;
    const significance = prominences[k]! / sigS;
    if (significance < minSig) continue;
    const fwhm = widths[k]! * step;
    const eRefined = refine(energy, smoothed, i);
    peaks.push({
      index: i,
      kind: 'maximum',
      energyEv: eRefined,
      wavelengthNm: HC_EV_NM / eRefined,
      height: smoothed[i]!,
      amplitude: prominences[k]!,
      fwhmMeV: fwhm * 1000,
      area: prominences[k]! * fwhm * 1.0644670194312262,
      significance,
    });
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
    const significance = -d / sigD;
    if (significance < minSig) continue;
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
      (p) => p.kind === 'maximum' && Math.abs(p.energyEv - energy[i]!) < Math.max(0.5 * (p.fwhmMeV ?? 0) / 1000, 3 * step),
    );
    if (dup) continue;
    const amplitude = -d * sigmaEv * sigmaEv;
    const e = refine(energy, secondDerivative, i, true);
    peaks.push({
      index: i,
      kind: 'shoulder',
      energyEv: e,
      wavelengthNm: HC_EV_NM / e,
      height: smoothed[i]!,
      amplitude,
      fwhmMeV: fwhm * 1000,
      area: amplitude * fwhm * 1.0644670194312262,
      significance,
    });
  }
  peaks.sort((a, b) => a.energyEv - b.energyEv);
  return peaks;
}

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
