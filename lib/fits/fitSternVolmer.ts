/**
 * Stern–Volmer fit of a PL quench series: F₀/F = 1 + K_SV·[Q] (IUPAC Gold Book, "Stern–Volmer
 * kinetic relationships"; Stern & Volmer, Phys. Z. 1919, 20, 183). With the quench fraction
 * q = 1 − F/F₀, F₀/F = 1/(1 − q). The line y = intercept + K_SV·[Q] is fitted by ordinary least
 * squares with a free intercept (ideally 1); the slope's standard error and R² are those of
 * scipy.stats.linregress: se = √(SSR/(n − 2)/Sxx).
 */
export interface SternVolmerFit {
  /** K_SV in reciprocal units of the concentration given. */
  ksv: number;
  ksvSe: number;
  intercept: number;
  interceptSe: number;
  r2: number;
  n: number;
  /** F₀/F at each point, in input order. */
  ratio: number[];
}

export function fitSternVolmer(concentration: ArrayLike<number>, quenchFraction: ArrayLike<number>): SternVolmerFit {
  const n = concentration.length;
  if (quenchFraction.length !== n)
    throw new RangeError(`concentration and quenchFraction must have the same length (got ${n} and ${quenchFraction.length})`);
  if (n < 3) throw new RangeError(`need at least 3 points (got ${n})`);
  const ratio: number[] = [];
  for (let i = 0; i < n; i++) {
    const c = concentration[i]!,
      q = quenchFraction[i]!;
    if (!Number.isFinite(c) || c < 0) throw new RangeError(`concentration[${i}] must be a finite number ≥ 0`);
    if (!Number.isFinite(q) || q >= 1) throw new RangeError(`quenchFraction[${i}] must be a finite number below 1`);
    ratio.push(1 / (1 - q));
  }
  let sx = 0,
    sy = 0;
  for (let i = 0; i < n; i++) {
    sx += concentration[i]!;
    sy += ratio[i]!;
  }
  const mx = sx / n,
    my = sy / n;
  let sxx = 0,
    sxy = 0,
    syy = 0,
    sxx0 = 0;
  for (let i = 0; i < n; i++) {
    const dx = concentration[i]! - mx,
      dy = ratio[i]! - my;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
    sxx0 += concentration[i]! ** 2;
  }
  if (!(sxx > 0)) throw new RangeError("concentration needs at least two distinct values");
  const ksv = sxy / sxx;
  const intercept = my - ksv * mx;
  let ssr = 0;
  for (let i = 0; i < n; i++) ssr += (ratio[i]! - intercept - ksv * concentration[i]!) ** 2;
  const ksvSe = Math.sqrt(ssr / (n - 2) / sxx);
  return {
    ksv,
    ksvSe,
    intercept,
    interceptSe: ksvSe * Math.sqrt(sxx0 / n),
    r2: syy > 0 ? (sxy * sxy) / (sxx * syy) : 1,
    n,
    ratio,
  };
}
