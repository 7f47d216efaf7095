/** Points between exact recomputations of the sliding moments (bounds rounding drift). */
const RESYNC = 64;

/**
 * Interior of the quadratic Savitzky–Golay filter (smoothing, first and second derivative) from
 * sliding window moments, O(n) whatever the window. On a symmetric window t = −h..h the normal
 * equations of the fit y ≈ a0 + a1·t + a2·t² split into an even part
 *   [N T2; T2 T4]·[a0; a2] = [M0; M2]
 * and an odd part a1 = M1/T2, with Mk = Σ tᵏ·y(i+t) and Tk = Σ tᵏ (Savitzky & Golay, Anal. Chem.
 * 1964, 36, 1627: the convolution weights are exactly this projection). A cubic fit adds an odd
 * term only, so it gives the same a0 and a2. When the window moves by one point (t → t − 1):
 *   M0' = M0 − y_out + y_in
 *   M1' = M1 + h·y_out + (h+1)·y_in − M0'
 *   M2' = M2 − h²·y_out + (h+1)²·y_in − 2·(M1 + h·y_out + (h+1)·y_in) + M0'
 * with y_out = y[i−h], y_in = y[i+h+1]. Moments are recomputed exactly every 64 points.
 * Writes indices h..n−h−1 of each non-null output: smoothed a0, first derivative a1/step, second
 * derivative 2·a2/step². Edges are left to the caller.
 */
export function savitzkyGolayQuadraticInterior(
  y: Float64Array,
  windowSize: number,
  step: number,
  smooth: Float64Array | null,
  first: Float64Array | null,
  second: Float64Array | null,
): void {
  const n = y.length;
  const h = (windowSize - 1) / 2;
  const N = windowSize;
  const T2 = (h * (h + 1) * (2 * h + 1)) / 3;
  const T4 = (h * (h + 1) * (2 * h + 1) * (3 * h * h + 3 * h - 1)) / 15;
  const det = N * T4 - T2 * T2;
  const c00 = T4 / det;
  const c02 = -T2 / det;
  const c20 = (-2 * T2) / det / (step * step);
  const c22 = (2 * N) / det / (step * step);
  const c11 = 1 / T2 / step;
  const h1 = h + 1;
  const hh = h * h;
  const h1h1 = h1 * h1;
  let M0 = 0;
  let M1 = 0;
  let M2 = 0;
  for (let i = h; i < n - h; i++) {
    if ((i - h) % RESYNC === 0) {
      M0 = 0;
      M1 = 0;
      M2 = 0;
      for (let t = -h; t <= h; t++) {
        const v = y[i + t]!;
        M0 += v;
        M1 += t * v;
        M2 += t * t * v;
      }
    }
    if (smooth) smooth[i] = c00 * M0 + c02 * M2;
    if (first) first[i] = c11 * M1;
    if (second) second[i] = c20 * M0 + c22 * M2;
    if (i + h + 1 < n) {
      const yo = y[i - h]!;
      const yi = y[i + h + 1]!;
      const m0 = M0 - yo + yi;
      const s1 = M1 + h * yo + h1 * yi;
      M2 = M2 - hh * yo + h1h1 * yi - 2 * s1 + m0;
      M1 = s1 - m0;
      M0 = m0;
    }
  }
}
