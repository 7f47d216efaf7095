import { savitzkyGolayQuadraticInterior } from './savitzkyGolayQuadratic';
import { savitzkyGolayWeights } from './savitzkyGolayWeights';
import { solveLinearSystem } from './solveLinearSystem';

export interface SavitzkyGolayOptions {
  /** Odd window length, at least 5 and at most the data length. Default 9. */
  windowSize?: number;
  /** Polynomial order, less than windowSize. Default 2. */
  polynomial?: number;
  /** Derivative order, 0 (smoothing) to polynomial. Default 0. */
  derivative?: number;
}

/**
 * Savitzky–Golay smoothing or derivative on uniformly spaced data (Savitzky & Golay, Anal. Chem.
 * 1964, 36, 1627; corrected by Steinier, Termonia & Deltour, Anal. Chem. 1972, 44, 1906).
 * Interior points: for quadratic/cubic smoothing and second derivatives and quadratic first
 * derivatives, the least-squares fit is evaluated from the window's moments Σy, Σt·y, Σt²·y,
 * updated in O(1) per point as the window slides (the symmetric-window normal equations split
 * into even and odd parts; the same filter as the convolution weights, see
 * savitzkyGolayQuadratic.ts); the moments are recomputed exactly every 64 points so that
 * rounding cannot drift. Other orders convolve with savitzkyGolayWeights (cached).
 * Edges: the half-window at each end is taken from a least-squares polynomial fitted to the
 * first (last) `windowSize` points, evaluated (or differentiated) at each edge point — the same
 * treatment as scipy.signal.savgol_filter with mode='interp'. Output has the input's length;
 * input is not modified.
 */
export function savitzkyGolayFilter(y: ArrayLike<number>, step: number, options: SavitzkyGolayOptions = {}): Float64Array {
  const { windowSize = 9, polynomial = 2, derivative = 0 } = options;
  const n = y.length;
  if (!Number.isInteger(windowSize) || windowSize < 5 || windowSize % 2 === 0) {
    throw new RangeError('windowSize must be an odd integer of at least 5');
  }
  if (windowSize > n) throw new RangeError('windowSize must not exceed the data length');
  if (!Number.isInteger(polynomial) || polynomial < 1 || polynomial >= windowSize) {
    throw new RangeError('polynomial must be an integer from 1 to windowSize - 1');
  }
  if (!Number.isInteger(derivative) || derivative < 0 || derivative > polynomial) {
    throw new RangeError('derivative must be an integer from 0 to polynomial');
  }
  if (!(step > 0)) throw new RangeError('step must be positive');
  const half = (windowSize - 1) / 2;
  const out = new Float64Array(n);
  const yy = y instanceof Float64Array ? y : Float64Array.from(y);
  const scale = 1 / Math.pow(step, derivative);
  if (quadraticEquivalent(polynomial, derivative)) {
    savitzkyGolayQuadraticInterior(
      yy,
      windowSize,
      step,
      derivative === 0 ? out : null,
      derivative === 1 ? out : null,
      derivative === 2 ? out : null,
    );
  } else {
    convolveInterior(yy, savitzkyGolayWeights(windowSize, polynomial, derivative), scale, out);
  }
  fitEdge(yy, 0, windowSize, polynomial, derivative, step, out, 0, half);
  fitEdge(yy, n - windowSize, windowSize, polynomial, derivative, step, out, n - half, n);
  return out;
}

/**
 * Smoothed signal, first and second derivatives with one window in one pass (quadratic fit;
 * cubic gives the same smoothing and second derivative). Same values as three calls of
 * savitzkyGolayFilter with polynomial 2; edges as scipy mode='interp'.
 */
export function savitzkyGolayQuadraticBank(
  y: Float64Array,
  step: number,
  windowSize: number,
  polynomial: 2 | 3 = 2,
): { smoothed: Float64Array; firstDerivative: Float64Array; secondDerivative: Float64Array } {
  const n = y.length;
  if (!Number.isInteger(windowSize) || windowSize < 5 || windowSize % 2 === 0 || windowSize > n) {
    throw new RangeError('windowSize must be an odd integer from 5 to the data length');
  }
  if (!(step > 0)) throw new RangeError('step must be positive');
  const half = (windowSize - 1) / 2;
  const smoothed = new Float64Array(n);
  const firstDerivative = new Float64Array(n);
  const secondDerivative = new Float64Array(n);
  savitzkyGolayQuadraticInterior(y, windowSize, step, smoothed, polynomial === 2 ? firstDerivative : null, secondDerivative);
  if (polynomial === 3) convolveInterior(y, savitzkyGolayWeights(windowSize, 3, 1), 1 / step, firstDerivative);
  for (const [d, out] of [
    [0, smoothed],
    [1, firstDerivative],
    [2, secondDerivative],
  ] as const) {
    fitEdge(y, 0, windowSize, polynomial, d, step, out, 0, half);
    fitEdge(y, n - windowSize, windowSize, polynomial, d, step, out, n - half, n);
  }
  return { smoothed, firstDerivative, secondDerivative };
}

/** True when the (polynomial, derivative) filter equals a quadratic-fit filter on a symmetric window. */
function quadraticEquivalent(p: number, d: number): boolean {
  return (p === 2 && d <= 2) || (p === 3 && (d === 0 || d === 2));
}

/** Interior of a convolution with weights in 'dot' order (left to right), four outputs per pass over the weights. */
function convolveInterior(y: Float64Array, c: Float64Array, scale: number, out: Float64Array): void {
  const w = c.length;
  const half = (w - 1) / 2;
  const m = y.length - 2 * half;
  let i = 0;
  for (; i + 3 < m; i += 4) {
    let a0 = 0,
      a1 = 0,
      a2 = 0,
      a3 = 0;
    for (let l = 0; l < w; l++) {
      const cl = c[l]!;
      const b = i + l;
      a0 += cl * y[b]!;
      a1 += cl * y[b + 1]!;
      a2 += cl * y[b + 2]!;
      a3 += cl * y[b + 3]!;
    }
    out[i + half] = a0 * scale;
    out[i + half + 1] = a1 * scale;
    out[i + half + 2] = a2 * scale;
    out[i + half + 3] = a3 * scale;
  }
  for (; i < m; i++) {
    let a = 0;
    for (let l = 0; l < w; l++) a += c[l]! * y[i + l]!;
    out[i + half] = a * scale;
  }
}

/** Fits a polynomial to y[start..start+w) and writes its derivative at indices [from, to). */
function fitEdge(
  y: ArrayLike<number>,
  start: number,
  w: number,
  p: number,
  d: number,
  h: number,
  out: Float64Array,
  from: number,
  to: number,
): void {
  const c = (w - 1) / 2;
  const m = p + 1;
  // normal equations in u = (i - c) / c, well conditioned on [-1, 1]
  const ata = new Float64Array(m * m);
  const aty = new Float64Array(m);
  const pw = new Float64Array(m);
  for (let i = 0; i < w; i++) {
    const u = (i - c) / c;
    pw[0] = 1;
    for (let k = 1; k < m; k++) pw[k] = pw[k - 1]! * u;
    const yi = y[start + i]!;
    for (let a = 0; a < m; a++) {
      aty[a] = aty[a]! + pw[a]! * yi;
      for (let b = 0; b < m; b++) ata[a * m + b] = ata[a * m + b]! + pw[a]! * pw[b]!;
    }
  }
  const coef = solveLinearSystem(ata, aty, m);
  const scale = Math.pow(1 / (c * h), d);
  for (let idx = from; idx < to; idx++) {
    const u = (idx - start - c) / c;
    // d-th derivative of sum coef[k] u^k
    let v = 0;
    for (let k = d; k < m; k++) {
      let f = 1;
      for (let j = 0; j < d; j++) f *= k - j;
      v += coef[k]! * f * Math.pow(u, k - d);
    }
    out[idx] = v * scale;
  }
}
