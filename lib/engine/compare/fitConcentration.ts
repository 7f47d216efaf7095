import { solveLinearSystem } from '../signal/solveLinearSystem';

/**
 * Separates a concentration change and a smooth background from band changes, before any band is
 * compared: fits S(E) ≈ k·R(E) + k·δ·R'(E) + b₀ + b₁·(E − E_c) + c·(E/E_c)^p on the energies that carry no
 * claimed band change (the caller's mask: for absorption the continuum well above the band edge,
 * where absorbance tracks the number of dots rather than their size, plus the transparent region
 * below the gap, which pins the background).
 *
 * Sources and practice: scaling on the high-energy continuum is how concentrations are read from
 * absorbance (Yu, Qu, Guo & Peng, Chem. Mater. 2003, 15, 2854; Leatherdale et al., J. Phys. Chem.
 * B 2002, 106, 7619; citations from memory); an offset or a slope from cuvette mismatch and a
 * scattering tail ∝ λ^−p (p = 4 for small scatterers, flatter for large; Rayleigh) are smooth and
 * are not bands (common practice).
 *
 * The scattering power is chosen among 2, 3 and 4 (p = 1 is the slope) and kept only when it
 * lowers χ² by at least 25 noise variances (a 5σ improvement for one extra parameter; likelihood
 * ratio, common practice). The R' term (first-order Taylor shift δ) lets a uniform shift of the
 * continuum through without biasing k. Local features the smooth model cannot follow (a new band in
 * the transparent region) are clipped where the caller allows it (`clippable`: the transparent
 * region, never the continuum k is read from): points where the residual averaged over `clipWindow`
 * points exceeds 4 standard errors are dropped, with `clipWindow` points either side, and the fit
 * is repeated (at most 3 times). Linear least squares; k's standard uncertainty from the
 * covariance with the combined noise σ² = σ_S² + k²σ_R².
 */
export interface ConcentrationFit {
  /** k: sample/reference concentration ratio. */
  ratio: number;
  sigmaRatio: number;
  /** Background on the whole grid (signal units of the sample). */
  background: Float64Array;
  /** Background = offset + slope·E + scatter·(E/centreEv)^scatterPower (E in eV). */
  offset: number;
  slope: number;
  centreEv: number;
  scatter: number;
  scatterPower: number | null;
  /** Points used after clipping. */
  used: number;
  clipped: number;
  /** Smooth terms in the model used, besides the scale and the offset. */
  terms: BackgroundTerm[];
  /** Terms left out because the data could not tell them from the scale (and did not need them). */
  dropped: BackgroundTerm[];
  /** Variance inflation factor of k in the model used (1 = the other terms cost k no precision). */
  scaleInflation: number;
  /**
   * Set when the data need terms that they cannot tell from the scale (inflation above
   * MAX_SCALE_INFLATION in every model the data accept): k trades against those terms, and is
   * usable only if its standard uncertainty (which includes the inflation) is small enough for
   * the caller's purpose.
   */
  degenerate: { terms: BackgroundTerm[]; inflation: number } | null;
}

/** A smooth term of the model besides scale and offset: slope, scattering tail, shift of the continuum (R'). */
export type BackgroundTerm = 'slope' | 'scatter' | 'shift';

/**
 * Largest variance inflation factor of k that is accepted: VIF = 1/(1 − R²) of the reference column
 * regressed on the other columns, i.e. how many times the background terms multiply k's variance
 * over a fit of scale and offset alone. A VIF above 10 is the usual mark of a coefficient that the
 * other regressors nearly reproduce (Marquardt, Technometrics 1970, 12, 591; Kutner, Nachtsheim,
 * Neter & Li, Applied Linear Statistical Models, 5th ed. 2005, §10.5; both from memory).
 */
export const MAX_SCALE_INFLATION = 10;

const POWERS = [2, 3, 4] as const;

/**
 * The smooth background offset + slope·E + scatter·(E/centreEv)^scatterPower on an energy axis (eV):
 * the engine and the viewer (lib/spectrum-view/deriveViewArrays.ts) evaluate it with this one function.
 */
export function evaluateBackground(
  energy: ArrayLike<number>,
  b: { offset: number; slope: number; centreEv: number; scatter: number; scatterPower: number | null },
): Float64Array {
  const out = new Float64Array(energy.length);
  const { offset, slope, scatter, centreEv, scatterPower } = b;
  // integer powers by multiplication (Math.pow with a variable exponent is the slow path)
  const p = scatterPower === null || scatter === 0 ? 0 : scatterPower;
  for (let i = 0; i < out.length; i++) {
    const e = energy[i]!;
    let v = offset + slope * e;
    if (p !== 0) {
      const t = e / centreEv;
      v += scatter * (p === 2 ? t * t : p === 3 ? t * t * t : p === 4 ? t * t * t * t : t ** p);
    }
    out[i] = v;
  }
  return out;
}
/** χ² improvement (in noise variances) that a scattering term must bring to be kept. */
const SCATTER_CHI2_GAIN = 25;
const CLIP_Z = 4;
const MAX_CLIP_ROUNDS = 3;

export function fitConcentration(
  energy: Float64Array,
  sample: ArrayLike<number>,
  reference: ArrayLike<number>,
  referenceSlope: ArrayLike<number>,
  mask: Uint8Array,
  o: { sigmaSample: number; sigmaReference: number; clipWindow: number; allowSlopeAndScatter: boolean; clippable: Uint8Array },
): ConcentrationFit | null {
  const n = energy.length;
  if (sample.length !== n || reference.length !== n || mask.length !== n)
    throw new RangeError('fitConcentration: arrays must share the grid');
  const use = mask.slice();
  // centre and scale of the energy columns (conditioning)
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < n; i++)
    if (use[i]) {
      lo = Math.min(lo, energy[i]!);
      hi = Math.max(hi, energy[i]!);
    }
  if (!(hi > lo)) return null;
  const centre = 0.5 * (lo + hi);
  const half = 0.5 * (hi - lo);
  let clipped = 0;
  let best: SeparatedModel | null = null;
  const acc = new Float64Array(COLUMNS * COLUMNS + COLUMNS + 1);
  for (let round = 0; round <= MAX_CLIP_ROUNDS; round++) {
    // one pass: cross-products of the columns [R, 1, u, (E/Ec)^2, (E/Ec)^3, (E/Ec)^4, R'] and S
    const m = accumulate(acc, energy, sample, reference, referenceSlope, use, centre, half);
    if (m < 16) return null;
    const xtx = acc.subarray(0, COLUMNS * COLUMNS);
    const xty = acc.subarray(COLUMNS * COLUMNS, COLUMNS * COLUMNS + COLUMNS);
    const yy = acc[COLUMNS * COLUMNS + COLUMNS]!;
    // spread of the reference about its mean on the used points: k's variance in a scale-and-offset
    // fit is σ²/sRR, so the variance inflation of k in any model with an offset is inv00·sRR
    const sRR = xtx[0]! - (xtx[1]! * xtx[1]!) / m;
    const solve = (cols: number[], power: number | null): Model | null => {
      const p = cols.length;
      const A = new Float64Array(p * p);
      const b = new Float64Array(p);
      for (let r = 0; r < p; r++) {
        b[r] = xty[cols[r]!]!;
        for (let c = 0; c < p; c++) A[r * p + c] = xtx[cols[r]! * COLUMNS + cols[c]!]!;
      }
      const coef = solveLinearSystem(A, b, p);
      if (!coef.every(Number.isFinite)) return null;
      let fitted = 0;
      for (let r = 0; r < p; r++) fitted += coef[r]! * b[r]!;
      const e0 = new Float64Array(p);
      e0[0] = 1;
      const inv00 = solveLinearSystem(A, e0, p)[0]!;
      return { coef, cols, power, chi2: yy - fitted, inv00, inflation: sRR > 0 ? inv00 * sRR : Infinity };
    };
    const baseCols = o.allowSlopeAndScatter ? [0, 6, 1, 2] : [0, 6, 1];
    const base = solve(baseCols, null);
    if (!base) return null;
    const k0 = base.coef[0]!;
    const noiseVar = o.sigmaSample ** 2 + k0 * k0 * o.sigmaReference ** 2;
    let chosen = base;
    if (o.allowSlopeAndScatter) {
      for (const p of POWERS) {
        const f = solve([0, 6, 1, 2, p + 1], p);
        if (!f) continue;
        const scatterPositive = f.coef[4]! > 0;
        if (scatterPositive && f.chi2 < chosen.chi2 && base.chi2 - f.chi2 >= SCATTER_CHI2_GAIN * noiseVar) chosen = f;
      }
    }
    const separated = separateScale(chosen, solve, SCATTER_CHI2_GAIN * noiseVar);
    best = separated;
    chosen = separated;
    if (round === MAX_CLIP_ROUNDS) break;
    // clip local features the smooth model does not follow
    // the chosen model's weight on each of the 7 columns (0 when not in the model)
    const wcol = new Float64Array(COLUMNS);
    for (let r = 0; r < chosen.cols.length; r++) wcol[chosen.cols[r]!] = chosen.coef[r]!;
    const [w0, w1, w2, w3, w4, w5, w6] = wcol as unknown as [number, number, number, number, number, number, number];
    const w = Math.max(1, o.clipWindow);
    const sigma = Math.sqrt(noiseVar);
    const resid = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      if (!(use[i] && o.clippable[i])) continue;
      const e = energy[i]!;
      const t = e / centre;
      const t2 = t * t;
      resid[i] =
        sample[i]! - (w0 * reference[i]! + w6 * referenceSlope[i]! + w1 + (w2 * (e - centre)) / half + t2 * (w3 + t * (w4 + t * w5)));
    }
    // running mean of the residual over w points of each contiguous run of used, clippable points
    const flag = new Uint8Array(n);
    let any = false;
    let runStart = -1;
    for (let i = 0; i <= n; i++) {
      if (i < n && use[i] && o.clippable[i]) {
        if (runStart < 0) runStart = i;
        continue;
      }
      if (runStart < 0) continue;
      const win = Math.min(w, i - runStart);
      const limit = (CLIP_Z * sigma) / Math.sqrt(win);
      let sum = 0;
      // flagged ranges grow left to right: each point is marked once (markedTo: end of the last range)
      let markedTo = runStart;
      for (let j = runStart; j < runStart + win; j++) sum += resid[j]!;
      for (let j = runStart; j + win <= i; j++) {
        if (j > runStart) sum += resid[j + win - 1]! - resid[j - 1]!;
        if (Math.abs(sum / win) > limit) {
          any = true;
          const end = Math.min(i, j + win + w);
          for (let q = Math.max(markedTo, j - w); q < end; q++) flag[q] = 1;
          markedTo = Math.max(markedTo, end);
        }
      }
      runStart = -1;
    }
    if (!any) break;
    let dropped = 0;
    for (let i = 0; i < n; i++)
      if (flag[i] && use[i]) {
        use[i] = 0;
        dropped++;
      }
    if (dropped === 0) break;
    clipped += dropped;
  }
  if (!best) return null;
  let used = 0;
  for (let i = 0; i < n; i++) used += use[i]!;
  const k = best.coef[0]!;
  if (!(k > 0)) return null;
  const noiseVar = o.sigmaSample ** 2 + k * k * o.sigmaReference ** 2;
  const sigmaRatio = Math.sqrt(noiseVar * Math.max(best.inv00, 0));
  const fitted = best;
  const coefOf = (c: number) => {
    const j = fitted.cols.indexOf(c);
    return j >= 0 ? fitted.coef[j]! : 0;
  };
  const b0 = coefOf(1);
  const b1 = coefOf(2);
  const scatter = best.power !== null ? coefOf(best.power + 1) : 0;
  const params = { offset: b0 - (b1 * centre) / half, slope: b1 / half, centreEv: centre, scatter, scatterPower: best.power };
  return {
    ratio: k,
    sigmaRatio,
    background: evaluateBackground(energy, params),
    ...params,
    used,
    clipped,
    terms: termsOf(best.cols),
    dropped: best.dropped,
    scaleInflation: best.inflation,
    degenerate: best.degenerate,
  };
}

/** Columns of the design: R, 1, u (slope), (E/Ec)^2, ^3, ^4 (scattering), R' (shift). */
const COLUMNS = 7;

/**
 * Cross-products of the 7 columns and S over the used points, in one pass: acc[0..49) = XᵀX
 * (row-major), acc[49..56) = XᵀS, acc[56] = SᵀS. Returns the number of points used. A small
 * function of its own, so that the engine's JIT compiles this hot loop early and tight.
 */
function accumulate(
  acc: Float64Array,
  energy: Float64Array,
  sample: ArrayLike<number>,
  reference: ArrayLike<number>,
  referenceSlope: ArrayLike<number>,
  use: Uint8Array,
  centre: number,
  half: number,
): number {
  let s00 = 0,
    s01 = 0,
    s02 = 0,
    s03 = 0,
    s04 = 0,
    s05 = 0,
    s06 = 0,
    s11 = 0,
    s12 = 0,
    s13 = 0,
    s14 = 0,
    s15 = 0,
    s16 = 0,
    s22 = 0,
    s23 = 0,
    s24 = 0,
    s25 = 0,
    s26 = 0,
    s33 = 0,
    s34 = 0,
    s35 = 0,
    s36 = 0,
    s44 = 0,
    s45 = 0,
    s46 = 0,
    s55 = 0,
    s56 = 0,
    s66 = 0;
  let y0 = 0,
    y1 = 0,
    y2 = 0,
    y3 = 0,
    y4 = 0,
    y5 = 0,
    y6 = 0;
  let yy = 0;
  let m = 0;
  const n = energy.length;
  const invCentre = 1 / centre;
  const invHalf = 1 / half;
  for (let i = 0; i < n; i++) {
    if (!use[i]) continue;
    const e = energy[i]!;
    const t = e * invCentre;
    const c0 = reference[i]!;
    const c2 = (e - centre) * invHalf;
    const c3 = t * t;
    const c4 = c3 * t;
    const c5 = c4 * t;
    const c6 = referenceSlope[i]!;
    const y = sample[i]!;
    s00 += c0 * c0;
    s01 += c0;
    s02 += c0 * c2;
    s03 += c0 * c3;
    s04 += c0 * c4;
    s05 += c0 * c5;
    s06 += c0 * c6;
    s12 += c2;
    s13 += c3;
    s14 += c4;
    s15 += c5;
    s16 += c6;
    s22 += c2 * c2;
    s23 += c2 * c3;
    s24 += c2 * c4;
    s25 += c2 * c5;
    s26 += c2 * c6;
    s33 += c3 * c3;
    s34 += c3 * c4;
    s35 += c3 * c5;
    s36 += c3 * c6;
    s44 += c4 * c4;
    s45 += c4 * c5;
    s46 += c4 * c6;
    s55 += c5 * c5;
    s56 += c5 * c6;
    s66 += c6 * c6;
    y0 += c0 * y;
    y1 += y;
    y2 += c2 * y;
    y3 += c3 * y;
    y4 += c4 * y;
    y5 += c5 * y;
    y6 += c6 * y;
    yy += y * y;
    m++;
  }
  s11 = m;
  const rows = [
    [s00, s01, s02, s03, s04, s05, s06],
    [s01, s11, s12, s13, s14, s15, s16],
    [s02, s12, s22, s23, s24, s25, s26],
    [s03, s13, s23, s33, s34, s35, s36],
    [s04, s14, s24, s34, s44, s45, s46],
    [s05, s15, s25, s35, s45, s55, s56],
    [s06, s16, s26, s36, s46, s56, s66],
  ];
  for (let r = 0; r < COLUMNS; r++) for (let c = 0; c < COLUMNS; c++) acc[r * COLUMNS + c] = rows[r]![c]!;
  acc[49] = y0;
  acc[50] = y1;
  acc[51] = y2;
  acc[52] = y3;
  acc[53] = y4;
  acc[54] = y5;
  acc[55] = y6;
  acc[56] = yy;
  return m;
}
const termOfColumn = (c: number): BackgroundTerm | null => (c === 2 ? 'slope' : c === 6 ? 'shift' : c >= 3 && c <= 5 ? 'scatter' : null);
function termsOf(cols: number[]): BackgroundTerm[] {
  const out: BackgroundTerm[] = [];
  for (const c of cols) {
    const t = termOfColumn(c);
    if (t) out.push(t);
  }
  return out;
}

interface Model {
  coef: Float64Array;
  cols: number[];
  power: number | null;
  chi2: number;
  inv00: number;
  inflation: number;
}
type SeparatedModel = Model & { dropped: BackgroundTerm[]; degenerate: { terms: BackgroundTerm[]; inflation: number } | null };

/**
 * Scale and smooth background are told apart only when the background terms do not nearly
 * reproduce the reference on the fitted points (a short or curved continuum makes a slope, an E^p
 * tail or the shift term R' look like part of k·R, and the fit then trades scale for them). When
 * k's variance inflation in the chosen model exceeds MAX_SCALE_INFLATION, every smaller model
 * (the same columns less some of slope, scattering and shift; scale and offset always stay) is
 * tried. Models the data reject are out: χ² rises by more than `needGain` over the chosen model
 * (the same 5σ likelihood-ratio rule that admits a scattering term). Of the rest, the largest with
 * inflation within the limit is kept (among equals, the smaller inflation). When none is within the
 * limit, the data need terms they cannot tell from the scale: the model of least inflation is kept
 * and marked degenerate, with the terms it needed (the caller decides whether k is still usable).
 */
function separateScale(chosen: Model, solve: (cols: number[], power: number | null) => Model | null, needGain: number): SeparatedModel {
  if (chosen.inflation <= MAX_SCALE_INFLATION) return { ...chosen, dropped: [], degenerate: null };
  const optional = chosen.cols.filter((c) => termOfColumn(c) !== null);
  let best: { model: Model; dropped: number[] } | null = null;
  let least: { model: Model; dropped: number[] } = { model: chosen, dropped: [] };
  // subsets of the optional columns to leave out (at most 3 columns: 7 proper subsets)
  for (let mask = 1; mask < 1 << optional.length; mask++) {
    const out = optional.filter((_c, j) => mask & (1 << j));
    const cols = chosen.cols.filter((c) => !out.includes(c));
    const f = solve(cols, cols.includes((chosen.power ?? -2) + 1) ? chosen.power : null);
    if (!f || f.chi2 - chosen.chi2 > needGain) continue;
    if (f.inflation < least.model.inflation) least = { model: f, dropped: out };
    if (f.inflation > MAX_SCALE_INFLATION) continue;
    if (!best || out.length < best.dropped.length || (out.length === best.dropped.length && f.inflation < best.model.inflation))
      best = { model: f, dropped: out };
  }
  if (best) return { ...best.model, dropped: termsOf(best.dropped), degenerate: null };
  return {
    ...least.model,
    dropped: termsOf(least.dropped),
    degenerate: { terms: termsOf(least.model.cols), inflation: least.model.inflation },
  };
}
