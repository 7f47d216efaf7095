/** Synthetic spectra with known truth for the engine tests (not a test file). */
import type { ParsedSpectrum } from '../../lib/engine/index';
import { gaussianNoise, seededUniform } from '@/lib/demo/synthetic';

/** Deterministic Gaussian noise (mulberry32 + Box–Muller). */
export const makeRng = gaussianNoise;

export interface Band {
  e: number; // centre, eV
  sigma: number; // Gaussian σ, eV
  a: number; // amplitude
}

export const HC = 1239.841984;

/** Quantum-dot-like absorbance on a wavelength axis (descending from 750 to 350 nm, like instruments). */
export function absorbanceSpectrum(opts: {
  bands: Band[];
  noise: number;
  seed: number;
  points?: number;
  background?: number;
  nmFrom?: number;
  nmTo?: number;
  newBand?: Band;
}): ParsedSpectrum {
  const n = opts.points ?? 801;
  const from = opts.nmFrom ?? 750;
  const to = opts.nmTo ?? 350;
  const rng = makeRng(opts.seed);
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  const bands = opts.newBand ? [...opts.bands, opts.newBand] : opts.bands;
  for (let i = 0; i < n; i++) {
    const nm = from + ((to - from) * i) / (n - 1);
    const e = HC / nm;
    let v = (opts.background ?? 0.05) * Math.max(0, e - 2.3) ** 1.5;
    for (const b of bands) v += b.a * Math.exp(-0.5 * ((e - b.e) / b.sigma) ** 2);
    x[i] = nm;
    y[i] = v + opts.noise * rng();
  }
  // ascending for ParsedSpectrum
  x.reverse();
  y.reverse();
  return {
    fileName: `synthetic-${opts.seed}.csv`,
    format: 'delimited',
    x,
    y,
    xUnit: 'nm',
    yUnit: 'absorbance',
    xOrderInFile: 'descending',
    technique: 'absorption',
    columnName: 'A',
    columnIndex: 1,
    availableColumns: ['A'],
    metadata: {},
    warnings: [],
  };
}

/** Emission spectrum I(λ) in counts per nm whose energy-axis shape is a Gaussian of known area. */
export function plSpectrum(opts: {
  e: number;
  sigma: number;
  area: number;
  noise: number;
  seed: number;
  laserNm?: number;
}): ParsedSpectrum {
  const n = 1001;
  const rng = makeRng(opts.seed);
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const nm = 380 + (400 * i) / (n - 1);
    const e = HC / nm;
    // I(E) Gaussian with the given area; I(λ) = I(E)·hc/λ²
    const iE = (opts.area / (opts.sigma * Math.sqrt(2 * Math.PI))) * Math.exp(-0.5 * ((e - opts.e) / opts.sigma) ** 2);
    let v = (iE * HC) / (nm * nm);
    if (opts.laserNm) v += 50 * Math.exp(-0.5 * ((nm - opts.laserNm) / 2) ** 2);
    x[i] = nm;
    y[i] = v + opts.noise * rng();
  }
  return {
    fileName: `pl-${opts.seed}.csv`,
    format: 'delimited',
    x,
    y,
    xUnit: 'nm',
    yUnit: 'counts',
    xOrderInFile: 'ascending',
    technique: 'pl',
    columnName: 'I',
    columnIndex: 1,
    availableColumns: ['I'],
    metadata: {},
    warnings: [],
  };
}

export const PARENT_BANDS: Band[] = [
  { e: 2.2, sigma: 0.045, a: 0.5 },
  { e: 2.42, sigma: 0.07, a: 0.35 },
  { e: 2.9, sigma: 0.15, a: 0.5 },
];

/** Deterministic uniform numbers in [0, 1) (mulberry32). */
export const makeUniform = seededUniform;

/**
 * One Poisson draw of mean `mean` by inversion of the cumulative distribution (sequential search;
 * exact, O(mean) per draw). Means above 500 are drawn as the sum of independent draws of equal
 * means ≤ 500 (a sum of Poisson variables is Poisson), so e^(−mean) never underflows.
 */
export function poissonDraw(mean: number, uniform: () => number): number {
  if (!(mean >= 0)) throw new RangeError('mean must be ≥ 0');
  const parts = Math.ceil(mean / 500) || 1;
  const m = mean / parts;
  let total = 0;
  for (let j = 0; j < parts; j++) {
    const u = uniform();
    let k = 0;
    let p = Math.exp(-m);
    let c = p;
    while (u > c && p > 0) {
      k++;
      p *= m / k;
      c += p;
    }
    total += k;
  }
  return total;
}
