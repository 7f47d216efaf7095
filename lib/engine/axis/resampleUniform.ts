/**
 * Linear interpolation of (x, y) (x ascending) onto `n` uniformly spaced points from `from` to
 * `to`. Points outside the data range are not allowed (RangeError). Inputs are not modified.
 */
export function resampleUniform(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  from: number,
  to: number,
  n: number,
): { x: Float64Array; y: Float64Array; step: number } {
  if (x.length !== y.length) throw new RangeError('x and y must have the same length');
  if (!Number.isInteger(n) || n < 2) throw new RangeError('n must be an integer of at least 2');
  const m = x.length;
  const eps = 1e-9 * Math.abs(x[m - 1]! - x[0]!);
  if (from < x[0]! - eps || to > x[m - 1]! + eps || !(to > from)) {
    throw new RangeError('resampling range must lie inside the data range');
  }
  const gx = new Float64Array(n);
  const gy = new Float64Array(n);
  const step = (to - from) / (n - 1);
  let j = 0;
  for (let i = 0; i < n; i++) {
    const t = i === n - 1 ? to : from + i * step;
    gx[i] = t;
    while (j < m - 2 && x[j + 1]! < t) j++;
    const x0 = x[j]!;
    const x1 = x[j + 1]!;
    const w = x1 === x0 ? 0 : (t - x0) / (x1 - x0);
    const wc = w < 0 ? 0 : w > 1 ? 1 : w;
    gy[i] = y[j]! + wc * (y[j + 1]! - y[j]!);
  }
  return { x: gx, y: gy, step };
}
