/**
 * Solves the m×m system A·x = b (A row-major) by Gaussian elimination with partial
 * pivoting. Inputs are not modified. Used for the small normal-equation systems of the
 * Savitzky–Golay least-squares fits (m = polynomial order + 1).
 */
export function solveLinearSystem(a: ArrayLike<number>, b: ArrayLike<number>, m: number): Float64Array {
  if (a.length < m * m || b.length < m) throw new RangeError('solveLinearSystem: A must be m×m and b of length m');
  const A = Float64Array.from(a);
  const x = Float64Array.from(b);
  for (let col = 0; col < m; col++) {
    let piv = col;
    for (let r = col + 1; r < m; r++) if (Math.abs(A[r * m + col]!) > Math.abs(A[piv * m + col]!)) piv = r;
    if (piv !== col) {
      for (let k = 0; k < m; k++) {
        const t = A[col * m + k]!;
        A[col * m + k] = A[piv * m + k]!;
        A[piv * m + k] = t;
      }
      const t = x[col]!;
      x[col] = x[piv]!;
      x[piv] = t;
    }
    const d = A[col * m + col]!;
    for (let r = col + 1; r < m; r++) {
      const f = A[r * m + col]! / d;
      if (f === 0) continue;
      for (let k = col; k < m; k++) A[r * m + k] = A[r * m + k]! - f * A[col * m + k]!;
      x[r] = x[r]! - f * x[col]!;
    }
  }
  for (let r = m - 1; r >= 0; r--) {
    let s = x[r]!;
    for (let k = r + 1; k < m; k++) s -= A[r * m + k]! * x[k]!;
    x[r] = s / A[r * m + r]!;
  }
  return x;
}
