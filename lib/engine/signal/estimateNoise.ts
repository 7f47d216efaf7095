import { MAD_TO_SIGMA } from '../constants';

/**
 * Robust estimate of the standard deviation of white noise in a finely sampled signal: the median
 * absolute deviation of the second differences y[i-1] − 2y[i] + y[i+1], scaled by 1.4826 (MAD to
 * σ for a Gaussian; Rousseeuw & Croux, J. Am. Stat. Assoc. 1993, 88, 1273) and by 1/√6 (the
 * second difference of independent noise has variance 6σ²). Smooth signal contributes little to
 * second differences when it is sampled finely compared with its features (common practice).
 */
export function estimateNoise(y: ArrayLike<number>, from = 0, to = y.length): number {
  const n = to - from;
  if (n < 5) throw new RangeError('at least 5 points are needed to estimate noise');
  const d = new Float64Array(n - 2);
  for (let i = from + 1; i < to - 1; i++) d[i - from - 1] = y[i - 1]! - 2 * y[i]! + y[i + 1]!;
  const med = median(d);
  for (let i = 0; i < d.length; i++) d[i] = Math.abs(d[i]! - med);
  return (MAD_TO_SIGMA * median(d)) / Math.sqrt(6);
}

/** Median of a Float64Array (sorts it in place — only call on a private copy). */
export function median(a: Float64Array): number {
  a.sort();
  const n = a.length;
  if (n === 0) return Number.NaN;
  return n % 2 ? a[(n - 1) / 2]! : 0.5 * (a[n / 2 - 1]! + a[n / 2]!);
}
