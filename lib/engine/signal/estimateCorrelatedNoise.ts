import { MAD_TO_SIGMA } from '../constants';
import { median } from './estimateNoise';

/** Fewest block means kept at the coarsest block length. */
const MIN_BLOCKS = 32;
/** A block length is doubled while the estimate rises by more than this factor (noise still correlated). */
const RISE = 1.25;
/** Variance of the fourth difference (1, −4, 6, −4, 1) of independent values: 70σ². */
const SQRT70 = Math.sqrt(70);

export interface CorrelatedNoiseEstimate {
  /** White-noise-equivalent standard deviation per point (see below). */
  sigma: number;
  /** Block length (points) at which the estimate was taken. */
  blockLength: number;
  /** The estimate at each block length tried, 1, 2, 4, … */
  byBlockLength: Array<{ blockLength: number; sigma: number }>;
}

/**
 * Noise level of a finely sampled signal whose noise may have been smoothed by the instrument
 * (correlated over a few points), as the white-noise-equivalent σ: the σ of independent noise
 * that would give the same variance to averages over many points. That is the σ which, times the
 * √Σw² gain of a smoothing window much wider than the instrument's, gives the honest uncertainty
 * of a smoothed value, of a band integral, or of a least-squares fit. Point-to-point differences
 * (lag 1) miss the part of the noise the instrument averaged away and underestimate it.
 *
 * Method: non-overlapping block means of B points (batch means; the variance of a mean of B
 * points of correlated noise tends to σ²_long-run/B once B exceeds the correlation length —
 * Flegal & Jones, Ann. Statist. 2010, 38, 1034, from memory); the signal is removed by the fourth
 * difference of consecutive block means (exact for cubics, variance 70σ²/B for independent
 * means); σ(B) = 1.4826·median|d|·√B/√70 (the MAD about zero, as differences of noise are
 * centred on zero; MAD to σ: Rousseeuw & Croux, J. Am. Stat. Assoc. 1993, 88, 1273). B = 1, 2, 4, … is doubled while σ(B) still rises by more than 25 % and at least 32
 * blocks remain and B ≤ `maxBlockLength` (the engine passes its smoothing window: noise correlated
 * over more points than the window is not averaged by it, and longer blocks start to see the
 * signal's own curvature); the larger of the last two estimates is returned (never below B = 1).
 * For white noise every B gives the same σ. Limits: noise correlated over more than n/32 points
 * cannot be seen; narrow bands sampled by only a few points per B raise the estimate (the MAD
 * ignores them while they cover less than half of the blocks). Input is not modified.
 */
export function estimateCorrelatedNoise(y: ArrayLike<number>, options: { maxBlockLength?: number } = {}): CorrelatedNoiseEstimate {
  const n = y.length;
  if (!(y instanceof Float64Array)) return estimateCorrelatedNoise(Float64Array.from(y), options);
  const maxB = options.maxBlockLength ?? Infinity;
  if (!(maxB >= 1)) throw new RangeError('maxBlockLength must be at least 1');
  if (n < 9) throw new RangeError('at least 9 points are needed to estimate noise');
  const byBlockLength: Array<{ blockLength: number; sigma: number }> = [];
  const { means, d } = scratch(n);
  let chosen = 0;
  for (let B = 1; ; B *= 2) {
    const nb = Math.floor(n / B);
    if (B > 1 && (nb < MIN_BLOCKS || B > maxB)) break;
    if (nb < 5) break;
    // centre the blocks: the same number of points left over at each end
    const off = (n - nb * B) >> 1;
    if (B === 1) {
      for (let j = 0; j < nb; j++) means[j] = y[j]!;
    } else if (B === 2) {
      // means of the previous level's pairs would shift the blocks; sum directly
      for (let j = 0, a = off; j < nb; j++, a += 2) means[j] = 0.5 * (y[a]! + y[a + 1]!);
    } else {
      for (let j = 0; j < nb; j++) {
        let s = 0;
        const a = off + j * B;
        for (let k = 0; k < B; k++) s += y[a + k]!;
        means[j] = s / B;
      }
    }
    const m = nb - 4;
    for (let j = 0; j < m; j++) d[j] = means[j]! - 4 * means[j + 1]! + 6 * means[j + 2]! - 4 * means[j + 3]! + means[j + 4]!;
    // differences of noise are centred on zero: the MAD about zero (one median instead of two)
    const sub = d.subarray(0, m);
    for (let j = 0; j < m; j++) sub[j] = Math.abs(sub[j]!);
    const sigma = (MAD_TO_SIGMA * median(sub) * Math.sqrt(B)) / SQRT70;
    byBlockLength.push({ blockLength: B, sigma });
    const k = byBlockLength.length - 1;
    if (k > 0 && !(sigma > RISE * byBlockLength[k - 1]!.sigma)) break;
    chosen = k;
  }
  const last = byBlockLength.length - 1;
  const sigma = Math.max(byBlockLength[0]!.sigma, byBlockLength[chosen]!.sigma, byBlockLength[Math.min(chosen + 1, last)]!.sigma);
  return { sigma, blockLength: byBlockLength[chosen]!.blockLength, byBlockLength };
}

// Work arrays reused between calls (JavaScript runs this single-threaded; nothing escapes a call).
let scratchMeans = new Float64Array(0);
let scratchD = new Float64Array(0);
function scratch(n: number): { means: Float64Array; d: Float64Array } {
  if (scratchMeans.length < n) {
    scratchMeans = new Float64Array(n);
    scratchD = new Float64Array(n);
  }
  return { means: scratchMeans, d: scratchD };
}
