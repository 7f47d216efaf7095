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

/**
 * Median of a Float64Array by quickselect (Hoare's FIND, Commun. ACM 1961, 4, 321), O(n) on
 * average. Reorders the array in place — only call on a private copy. NaN for an empty array.
 */
export function median(a: Float64Array): number {
  const n = a.length;
  if (n === 0) return Number.NaN;
  const hi = select(a, n >> 1);
  if (n % 2) return hi;
  // lower middle: the largest value left of the upper middle after partitioning
  let lo = -Infinity;
  for (let i = 0; i < n >> 1; i++) if (a[i]! > lo) lo = a[i]!;
  return 0.5 * (lo + hi);
}

/** k-th smallest value (0-based); afterwards a[0..k) ≤ a[k] ≤ a(k..n). */
function select(a: Float64Array, k: number): number {
  let left = 0;
  let right = a.length - 1;
  while (right > left) {
    // median of three as pivot
    const mid = (left + right) >> 1;
    let x = a[mid]!;
    const l = a[left]!;
    const r = a[right]!;
    if ((l <= x && x <= r) || (r <= x && x <= l)) {
      // x is the median
    } else if ((x <= l && l <= r) || (r <= l && l <= x)) x = l;
    else x = r;
    let i = left;
    let j = right;
    while (i <= j) {
      while (i <= right && a[i]! < x) i++;
      while (j >= left && a[j]! > x) j--;
      if (i <= j) {
        const t = a[i]!;
        a[i] = a[j]!;
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else return a[k]!;
  }
  return a[k]!;
}
