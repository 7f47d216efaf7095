/**
 * Linear interpolation of (x, y) (x strictly ascending) onto n equally spaced points from x[0] to
 * x[n-1], for the wavelength axis, whose points are not equally spaced when the grid is uniform in
 * energy. Inputs are not modified.
 */
export function resampleLinear(x: ArrayLike<number>, y: ArrayLike<number>, n = x.length): { x: Float64Array; y: Float64Array } {
  if (x.length !== y.length || x.length < 2) throw new RangeError("x and y must have the same length, at least 2");
  if (!Number.isInteger(n) || n < 2) throw new RangeError("n must be an integer of at least 2");
  const from = x[0]!;
  const to = x[x.length - 1]!;
  const ox = new Float64Array(n);
  const oy = new Float64Array(n);
  let j = 0;
  for (let i = 0; i < n; i++) {
    const xi = i === n - 1 ? to : from + ((to - from) * i) / (n - 1);
    while (j < x.length - 2 && x[j + 1]! < xi) j++;
    const t = (xi - x[j]!) / (x[j + 1]! - x[j]!);
    ox[i] = xi;
    oy[i] = y[j]! + t * (y[j + 1]! - y[j]!);
  }
  return { x: ox, y: oy };
}
