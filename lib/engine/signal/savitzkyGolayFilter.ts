import * as sgModule from 'ml-savitzky-golay';

type SgFn = (data: ArrayLike<number>, h: number, options: Record<string, unknown>) => number[];
// Under Node ESM the default export of ml-savitzky-golay can arrive wrapped as { default: fn }.
const mod = sgModule as unknown as { default: SgFn | { default: SgFn } };
const sg: SgFn = typeof mod.default === 'function' ? mod.default : (mod.default as { default: SgFn }).default;

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
 * Interior points use ml-savitzky-golay's convolution coefficients (cached). Edges: the half-window at each end is taken from a
 * least-squares polynomial fitted to the first (last) `windowSize` points, evaluated (or
 * differentiated) at each edge point — the same treatment as scipy.signal.savgol_filter with
 * mode='interp'. Output has the input's length; input is not modified.
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
  const c = coefficients(windowSize, polynomial, derivative);
  const scale = 1 / Math.pow(step, derivative);
  for (let i = half; i < n - half; i++) {
    let acc = 0;
    const base = i - half;
    for (let l = 0; l < windowSize; l++) acc += c[l]! * y[base + l]!;
    out[i] = acc * scale;
  }
  fitEdge(y, 0, windowSize, polynomial, derivative, step, out, 0, half);
  fitEdge(y, n - windowSize, windowSize, polynomial, derivative, step, out, n - half, n);
  return out;
}

const cache = new Map<string, Float64Array>();
/**
 * Convolution coefficients from ml-savitzky-golay itself (applied once to a unit impulse), cached
 * per (window, order, derivative) so that the hot loop is a plain typed-array dot product.
 */
function coefficients(w: number, p: number, d: number): Float64Array {
  const key = `${w}/${p}/${d}`;
  let c = cache.get(key);
  if (!c) {
    const impulse = new Array<number>(2 * w - 1).fill(0);
    impulse[w - 1] = 1;
    const r = sg(impulse, 1, { windowSize: w, polynomial: p, derivative: d, pad: 'none' });
    c = Float64Array.from(r).reverse();
    cache.set(key, c);
  }
  return c;
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
  const coef = solveSymmetric(ata, aty, m);
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

/** Gaussian elimination with partial pivoting on a small dense system. */
function solveSymmetric(a: Float64Array, b: Float64Array, m: number): Float64Array {
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
