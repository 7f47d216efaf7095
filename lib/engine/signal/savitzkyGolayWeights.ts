import * as sgModule from 'ml-savitzky-golay';

type SavitzkyGolayFn = (data: number[], h: number, options: Record<string, unknown>) => number[];
// Under Node ESM the default export of ml-savitzky-golay can arrive wrapped as { default: fn }.
const sgExports = sgModule as unknown as { default: SavitzkyGolayFn | { default: SavitzkyGolayFn } };
const savitzkyGolay: SavitzkyGolayFn = typeof sgExports.default === 'function' ? sgExports.default : sgExports.default.default;

/**
 * Savitzky–Golay convolution weights for the centre point of a window (unit spacing), ordered
 * left to right (i.e. applied as Σ w_k·y_{i+k}, k = −half..half), taken from ml-savitzky-golay (the
 * one source of Savitzky–Golay coefficients in the engine); equal to the tabulated integers / norm of Savitzky & Golay (Anal. Chem. 1964, 36,
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
  if (!Number.isInteger(windowSize) || windowSize < 5 || windowSize % 2 === 0) {
    throw new RangeError('windowSize must be an odd integer of at least 5');
  }
  if (!Number.isInteger(polynomial) || polynomial < 1 || polynomial >= windowSize) {
    throw new RangeError('polynomial must be an integer from 1 to windowSize - 1');
  }
  if (!Number.isInteger(derivative) || derivative < 0 || derivative > polynomial) {
    throw new RangeError('derivative must be an integer from 0 to polynomial');
  }
  // The package's filter applied once to a unit impulse (h = 1) gives the weights in convolution
  // order; reversed, they are in 'dot' order (left to right).
  const impulse = new Array<number>(2 * windowSize - 1).fill(0);
  impulse[windowSize - 1] = 1;
  const convolved = savitzkyGolay(impulse, 1, { windowSize, polynomial, derivative, pad: 'none' });
  return Float64Array.from(convolved).reverse();
}
