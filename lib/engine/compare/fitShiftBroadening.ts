/**
 * Fits, in a window around a band, the sample as a scaled, shifted and broadened copy of the
 * reference plus an offset: S(E) ≈ (1+α)·R(E−δ) + γ·R''(E−δ) + b. For a small Gaussian
 * broadening of variance s², R ⊗ G ≈ R + (s²/2)·R'' (Taylor expansion), so s² = 2γ/(1+α).
 * δ is found by iterating the linearisation R(E−δ−ε) ≈ R(E−δ) − ε·R'(E−δ) (Gauss–Newton).
 * Uncertainties come from ordinary least squares with the noise σ of S − R.
 */
export interface ShiftFit {
  alpha: number;
  sigmaAlpha: number;
  shiftEv: number;
  sigmaShiftEv: number;
  broadeningVarianceEv2: number;
  sigmaBroadeningVarianceEv2: number;
  offset: number;
  /** Coefficient of R'' in the last Taylor step. */
  gamma: number;
  /** Model prediction on the indices [from, to) (the evaluation range, which may extend past the fitted window). */
  model: Float64Array;
  /** The (broadened) reference shifted by δ on the window, i.e. the model's part that α scales. */
  base: Float64Array;
  from: number;
  to: number;
}

/**
 * Shift and broadening fit, refined for broadenings too large for the second-order Taylor term:
 * while the fitted broadening is positive, significant (> 2σ) and above `refineAboveVarianceEv2`, the reference (and its
 * derivatives) is convolved with a Gaussian of the variance found so far and the remainder is
 * fitted again (at most 4 rounds): the convolution of two Gaussians adds their variances, so the
 * total converges to the exact value for Gaussian broadening where one Taylor step falls short
 * (≈ 20 % low for a 10 % wider line). Narrowing keeps the single Taylor step.
 */
export function fitShiftBroadening(
  energy: Float64Array,
  sample: Float64Array,
  refSmoothed: Float64Array,
  refD1: Float64Array,
  refD2: Float64Array,
  from: number,
  to: number,
  noiseSigma: number,
  evaluate: { from: number; to: number } = { from, to },
  /** Refine only broadenings at least this large (variance, eV²): small ones are left to the Taylor step (cost). */
  refineAboveVarianceEv2 = 0,
): ShiftFit | null {
  let fit = fitTaylor(energy, sample, refSmoothed, refD1, refD2, from, to, noiseSigma);
  if (!fit) return null;
  const n = energy.length;
  const step = (energy[n - 1]! - energy[0]!) / (n - 1);
  let arrays = [refSmoothed, refD2];
  if (fit.broadeningVarianceEv2 > 2 * fit.sigmaBroadeningVarianceEv2 && fit.broadeningVarianceEv2 >= refineAboveVarianceEv2) {
    let total = fit.broadeningVarianceEv2;
    for (let round = 0; round < 4; round++) {
      const margin = Math.ceil(Math.abs(fit.shiftEv) / step) + 2;
      const a = Math.max(0, Math.min(from, evaluate.from) - margin);
      const b = Math.min(n, Math.max(to, evaluate.to) + margin);
      const blur = (y: Float64Array) => gaussianBlur(y, total, step, a, b);
      const bR = blur(refSmoothed);
      const bR2 = blur(refD2);
      const next = fitTaylor(energy, sample, bR, blur(refD1), bR2, from, to, noiseSigma);
      if (!next) break;
      total += next.broadeningVarianceEv2;
      fit = { ...next, broadeningVarianceEv2: total };
      arrays = [bR, bR2];
      if (!(total > 0) || Math.abs(next.broadeningVarianceEv2) < 0.01 * Math.abs(total)) break;
    }
  }
  // model and its α-scaled part on the evaluation range
  const [R, R2] = arrays as [Float64Array, Float64Array];
  const m = evaluate.to - evaluate.from;
  const model = new Float64Array(Math.max(m, 0));
  const base = new Float64Array(Math.max(m, 0));
  const scale = 1 + fit.alpha;
  for (let k = 0; k < m; k++) {
    const t = evaluate.from + k - fit.shiftEv / step;
    const j = Math.min(Math.max(Math.floor(t), 0), n - 2);
    const f = t - j;
    const r0 = R[j]! + f * (R[j + 1]! - R[j]!);
    const r2 = R2[j]! + f * (R2[j + 1]! - R2[j]!);
    base[k] = r0;
    model[k] = scale * r0 + fit.gamma * r2 + fit.offset;
  }
  return { ...fit, model, base, from: evaluate.from, to: evaluate.to };
}

/** Convolution with a unit-area Gaussian of the given variance (eV²) on indices [a, b); other entries copied. Ends repeat the edge value. */
function gaussianBlur(y: Float64Array, variance: number, step: number, a: number, b: number): Float64Array {
  const out = y.slice();
  if (!(variance > 0)) return out;
  const sd = Math.sqrt(variance) / step;
  const h = Math.max(1, Math.ceil(4 * sd));
  const w = new Float64Array(2 * h + 1);
  let sum = 0;
  for (let j = -h; j <= h; j++) sum += w[j + h] = Math.exp(-0.5 * (j / sd) ** 2);
  for (let j = 0; j < w.length; j++) w[j] = w[j]! / sum;
  const n = y.length;
  for (let i = a; i < b; i++) {
    let v = 0;
    for (let j = -h; j <= h; j++) v += w[j + h]! * y[Math.min(n - 1, Math.max(0, i + j))]!;
    out[i] = v;
  }
  return out;
}

function fitTaylor(
  energy: Float64Array,
  sample: Float64Array,
  refSmoothed: Float64Array,
  refD1: Float64Array,
  refD2: Float64Array,
  from: number,
  to: number,
  noiseSigma: number,
): ShiftFit | null {
  const m = to - from;
  if (m < 8) return null;
  const n = energy.length;
  const step = (energy[n - 1]! - energy[0]!) / (n - 1);
  let delta = 0;
  const R = new Float64Array(m);
  const R1 = new Float64Array(m);
  const R2 = new Float64Array(m);
  let coef: Float64Array = new Float64Array(5);
  let cov: Float64Array = new Float64Array(25);
  const ata = new Float64Array(16);
  const atb = new Float64Array(4);
  for (let iter = 0; iter < 8; iter++) {
    // reference shifted by delta, by linear interpolation on the grid
    for (let k = 0; k < m; k++) {
      const t = from + k - delta / step;
      const j = Math.min(Math.max(Math.floor(t), 0), n - 2);
      const f = t - j;
      R[k] = refSmoothed[j]! + f * (refSmoothed[j + 1]! - refSmoothed[j]!);
      R1[k] = refD1[j]! + f * (refD1[j + 1]! - refD1[j]!);
      R2[k] = refD2[j]! + f * (refD2[j + 1]! - refD2[j]!);
    }
    // regress S − R on [R, R', R'', 1]: normal equations (symmetric; upper triangle accumulated)
    const p = 4;
    ata.fill(0);
    atb.fill(0);
    let a00 = 0,
      a01 = 0,
      a02 = 0,
      a03 = 0,
      a11 = 0,
      a12 = 0,
      a13 = 0,
      a22 = 0,
      a23 = 0;
    let b0 = 0,
      b1 = 0,
      b2 = 0,
      b3 = 0;
    for (let k = 0; k < m; k++) {
      const r0 = R[k]!;
      const r1 = R1[k]!;
      const r2 = R2[k]!;
      const d = sample[from + k]! - r0;
      a00 += r0 * r0;
      a01 += r0 * r1;
      a02 += r0 * r2;
      a03 += r0;
      a11 += r1 * r1;
      a12 += r1 * r2;
      a13 += r1;
      a22 += r2 * r2;
      a23 += r2;
      b0 += r0 * d;
      b1 += r1 * d;
      b2 += r2 * d;
      b3 += d;
    }
    ata.set([a00, a01, a02, a03, a01, a11, a12, a13, a02, a12, a22, a23, a03, a13, a23, m]);
    atb.set([b0, b1, b2, b3]);
    const inv = invert(ata, p);
    if (!inv) return null;
    coef = new Float64Array(p);
    for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) coef[a] = coef[a]! + inv[a * p + b]! * atb[b]!;
    cov = inv;
    const scale = 1 + coef[0]!;
    if (!(scale > 0.05)) return null;
    const eps = -coef[1]! / scale;
    delta += eps;
    if (Math.abs(delta) > 0.5 * (energy[to - 1]! - energy[from]!)) return null;
    if (Math.abs(eps) < 1e-7) break;
  }
  const s2 = noiseSigma * noiseSigma;
  const alpha = coef[0]!;
  const scale = 1 + alpha;
  const model = new Float64Array(m);
  for (let k = 0; k < m; k++) model[k] = scale * R[k]! + coef[2]! * R2[k]! + coef[3]!;
  return {
    alpha,
    sigmaAlpha: Math.sqrt(s2 * cov[0]!),
    shiftEv: delta,
    sigmaShiftEv: Math.sqrt(s2 * cov[1 * 4 + 1]!) / scale,
    broadeningVarianceEv2: (2 * coef[2]!) / scale,
    sigmaBroadeningVarianceEv2: (2 * Math.sqrt(s2 * cov[2 * 4 + 2]!)) / scale,
    offset: coef[3]!,
    gamma: coef[2]!,
    model,
    base: Float64Array.from(R),
    from,
    to,
  };
}

function invert(a: Float64Array, p: number): Float64Array | null {
  const A = a.slice();
  const I = new Float64Array(p * p);
  for (let i = 0; i < p; i++) I[i * p + i] = 1;
  for (let c = 0; c < p; c++) {
    let piv = c;
    for (let r = c + 1; r < p; r++) if (Math.abs(A[r * p + c]!) > Math.abs(A[piv * p + c]!)) piv = r;
    if (Math.abs(A[piv * p + c]!) < 1e-300) return null;
    for (let k = 0; k < p; k++) {
      let t = A[c * p + k]!;
      A[c * p + k] = A[piv * p + k]!;
      A[piv * p + k] = t;
      t = I[c * p + k]!;
      I[c * p + k] = I[piv * p + k]!;
      I[piv * p + k] = t;
    }
    const d = A[c * p + c]!;
    for (let k = 0; k < p; k++) {
      A[c * p + k] = A[c * p + k]! / d;
      I[c * p + k] = I[c * p + k]! / d;
    }
    for (let r = 0; r < p; r++) {
      if (r === c) continue;
      const f = A[r * p + c]!;
      if (f === 0) continue;
      for (let k = 0; k < p; k++) {
        A[r * p + k] = A[r * p + k]! - f * A[c * p + k]!;
        I[r * p + k] = I[r * p + k]! - f * I[c * p + k]!;
      }
    }
  }
  return I;
}
