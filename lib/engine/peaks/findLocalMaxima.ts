/**
 * Indices of local maxima, flat tops reported at their middle (rounded down); the first and last
 * points are never maxima. Same rule as scipy.signal.find_peaks (SciPy 1.x, _local_maxima_1d).
 */
export function findLocalMaxima(y: ArrayLike<number>): Int32Array {
  const n = y.length;
  const out: number[] = [];
  let i = 1;
  const iMax = n - 1;
  while (i < iMax) {
    if (y[i - 1]! < y[i]!) {
      let ahead = i + 1;
      while (ahead < iMax && y[ahead] === y[i]) ahead++;
      if (y[ahead]! < y[i]!) {
        out.push((i + ahead - 1) >> 1);
        i = ahead;
      }
    }
    i++;
  }
  return Int32Array.from(out);
}
