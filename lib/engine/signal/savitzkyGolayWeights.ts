import { solveLinearSystem } from './solveLinearSystem';

/**
 * Savitzky–Golay convolution weights for the centre point of a window (unit spacing), ordered
 * left to right (i.e. applied as Σ w_k·y_{i+k}, k = −half..half). Computed from the least-squares
 * projection; equal to the tabulated integers / norm of Savitzky & Golay (Anal. Chem. 1964, 36,
 * 1627) as corrected by Steinier, Termonia & Deltour (Anal. Chem. 1972, 44, 1906), times
 * derivative! for derivatives. The weights for uniform spacing are fixed, so they are computed
 * once per (window, polynomial, derivative) and cached; each call returns a fresh copy.
 */
export function savitzkyGolayWeights(windowSize: number, polynomial: number, derivative = 0): Float64Array {
  const key = `${windowSize}/${polynomial}/${derivative}`;
  let w = weightCache.get(key);
  if (!w) {
    w = computeWeights(windowSize, polynomial, derivative);
    weightCache.set(key, w);
  }
  return w.slice();
}

const weightCache = new Map<string, Float64Array>();
const gainCache = new Map<string, number>();

/**
 * Standard-deviation gain √(Σw²) of the Savitzky–Golay filter on independent noise (unit
 * spacing; divide by stepᵈ for a derivative), cached per (window, polynomial, derivative).
 */
export function savitzkyGolayNoiseGain(windowSize: number, polynomial: number, derivative = 0): number {
  const key = `${windowSize}/${polynomial}/${derivative}`;
  let g = gainCache.get(key);
  if (g === undefined) {
    const w = savitzkyGolayWeights(windowSize, polynomial, derivative);
    let s = 0;
    for (let i = 0; i < w.length; i++) s += w[i]! * w[i]!;
    g = Math.sqrt(s);
    gainCache.set(key, g);
  }
  return g;
}

function computeWeights(windowSize: number, polynomial: number, derivative: number): Float64Array {
  if (!Number.isInteger(windowSize) || windowSize < 3 || windowSize % 2 === 0) {
    throw new RangeError('windowSize must be an odd integer of at least 3');
  }
  if (!Number.isInteger(polynomial) || polynomial < 0 || polynomial >= windowSize) {
    throw new RangeError('polynomial must be an integer from 0 to windowSize - 1');
  }
  if (!Number.isInteger(derivative) || derivative < 0 || derivative > polynomial) {
    throw new RangeError('derivative must be an integer from 0 to polynomial');
  }
  const half = (windowSize - 1) / 2;
  const m = polynomial + 1;
  // Gram matrix G = AᵀA with A[i][k] = t_i^k, t = -half..half; solve G c = e_d, w_i = d!·Σ_k c_k t_i^k
  const G = new Float64Array(m * m);
  for (let t = -half; t <= half; t++) {
    for (let a = 0; a < m; a++) for (let b = 0; b < m; b++) G[a * m + b] = G[a * m + b]! + Math.pow(t, a + b);
  }
  const e = new Float64Array(m);
  e[derivative] = 1;
  const c = solveLinearSystem(G, e, m);
  let fact = 1;
  for (let k = 2; k <= derivative; k++) fact *= k;
  const w = new Float64Array(windowSize);
  for (let t = -half; t <= half; t++) {
    let s = 0;
    for (let k = 0; k < m; k++) s += c[k]! * Math.pow(t, k);
    w[t + half] = s * fact;
  }
  return w;
}
