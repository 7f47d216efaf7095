/**
 * Two-line (breakpoint) fit: a linear rise that turns into a plateau,
 *
 *   y = a + b·min(x, x_b),   plateau = a + b·x_b,
 *
 * fitted by least squares over all three parameters. For a fixed breakpoint the model is
 * linear in (a, b), so the residual sum of squares is profiled over x_b and minimised by
 * golden-section search inside each interval between neighbouring x values (the profile is
 * smooth there), keeping the best. Standard errors come from the Gauss–Newton covariance
 * s²·(JᵀJ)⁻¹ with s² = SSR/(n − 3), the estimate scipy.optimize.curve_fit returns with
 * absolute_sigma=False; the plateau's error by the delta method.
 *
 * Method: segmented ("broken-stick") regression, Hudson, J. Am. Stat. Assoc. 1966, 61, 1097;
 * the covariance as in Bates & Watts, Nonlinear Regression Analysis, Wiley 1988, ch. 2.
 * In a titration the breakpoint is the feed ratio at which the bleach saturates: the
 * stoichiometry of the product (Bandkeep DOMAIN.md §6).
 */
export interface BreakpointFit {
  /** x at which the rise turns into the plateau. */
  breakpoint: number;
  breakpointSe: number;
  /** y of the plateau, a + b·x_b. */
  plateau: number;
  plateauSe: number;
  slope: number;
  slopeSe: number;
  intercept: number;
  interceptSe: number;
  /** Coefficient of determination, 1 − SSR/SST. */
  r2: number;
  ssr: number;
  n: number;
  /** Covariance of (intercept, slope, breakpoint). */
  covariance: number[][];
}

export interface BreakpointOptions {
  /** Fewest points on the rising segment (x ≤ x_b). Default 2. */
  minRisePoints?: number;
  /** Fewest points on the plateau (x > x_b). Default 1. */
  minPlateauPoints?: number;
}

function checkArrays(x: ArrayLike<number>, y: ArrayLike<number>, minPoints: number): void {
  if (x.length !== y.length) throw new RangeError(`x and y must have the same length (got ${x.length} and ${y.length})`);
  if (x.length < minPoints) throw new RangeError(`need at least ${minPoints} points (got ${x.length})`);
  for (let i = 0; i < x.length; i++) {
    if (!Number.isFinite(x[i]!)) throw new RangeError(`x[${i}] is not a finite number`);
    if (!Number.isFinite(y[i]!)) throw new RangeError(`y[${i}] is not a finite number`);
  }
}

/** Least squares of y on [1, u]: returns a, b and the residual sum of squares. */
function lineFit(u: ArrayLike<number>, y: ArrayLike<number>): { a: number; b: number; ssr: number } {
  const n = u.length;
  let su = 0,
    sy = 0;
  for (let i = 0; i < n; i++) {
    su += u[i]!;
    sy += y[i]!;
  }
  const mu = su / n,
    my = sy / n;
  let suu = 0,
    suy = 0;
  for (let i = 0; i < n; i++) {
    const du = u[i]! - mu;
    suu += du * du;
    suy += du * (y[i]! - my);
  }
  const b = suu > 0 ? suy / suu : 0;
  const a = my - b * mu;
  let ssr = 0;
  for (let i = 0; i < n; i++) {
    const r = y[i]! - a - b * u[i]!;
    ssr += r * r;
  }
  return { a, b, ssr };
}

function profile(x: Float64Array, y: Float64Array, xb: number) {
  const u = x.map((v) => Math.min(v, xb));
  return lineFit(u, y);
}

function invert3(m: number[][]): number[][] {
  const [[a, b, c], [d, e, f], [g, h, i]] = m as [[number, number, number], [number, number, number], [number, number, number]];
  const A = e * i - f * h,
    B = -(d * i - f * g),
    C = d * h - e * g;
  const det = a * A + b * B + c * C;
  if (!(Math.abs(det) > 0)) throw new RangeError("the fit is degenerate: the covariance matrix is singular");
  return [
    [A / det, -(b * i - c * h) / det, (b * f - c * e) / det],
    [B / det, (a * i - c * g) / det, -(a * f - c * d) / det],
    [C / det, -(a * h - b * g) / det, (a * e - b * d) / det],
  ];
}

export function fitBreakpoint(x: ArrayLike<number>, y: ArrayLike<number>, options: BreakpointOptions = {}): BreakpointFit {
  const minRise = options.minRisePoints ?? 2;
  const minPlateau = options.minPlateauPoints ?? 1;
  if (!(Number.isInteger(minRise) && minRise >= 2)) throw new RangeError("minRisePoints must be an integer of at least 2");
  if (!(Number.isInteger(minPlateau) && minPlateau >= 1)) throw new RangeError("minPlateauPoints must be an integer of at least 1");
  checkArrays(x, y, Math.max(4, minRise + minPlateau));
  const order = Array.from({ length: x.length }, (_, i) => i).sort((p, q) => x[p]! - x[q]!);
  const xs = Float64Array.from(order, (i) => x[i]!);
  const ys = Float64Array.from(order, (i) => y[i]!);
  const n = xs.length;

  let best: { xb: number; a: number; b: number; ssr: number } | null = null;
  const golden = 2 - (1 + Math.sqrt(5)) / 2;
  // Interval k spans [xs[k], xs[k+1]]: points 0..k rise, k+1..n-1 form the plateau.
  for (let k = minRise - 1; k <= n - 1 - minPlateau; k++) {
    let lo = xs[k]!,
      hi = xs[k + 1]!;
    if (!(hi > lo)) continue;
    const f = (t: number) => profile(xs, ys, t).ssr;
    let c = lo + golden * (hi - lo),
      d = hi - golden * (hi - lo);
    let fc = f(c),
      fd = f(d);
    for (let it = 0; it < 200 && hi - lo > 1e-13 * Math.max(1, Math.abs(hi)); it++) {
      if (fc < fd) {
        hi = d;
        d = c;
        fd = fc;
        c = lo + golden * (hi - lo);
        fc = f(c);
      } else {
        lo = c;
        c = d;
        fc = fd;
        d = hi - golden * (hi - lo);
        fd = f(d);
      }
    }
    const xb = 0.5 * (lo + hi);
    const fit = profile(xs, ys, xb);
    if (!best || fit.ssr < best.ssr) best = { xb, ...fit };
  }
  if (!best) throw new RangeError("x needs at least three distinct values to place a breakpoint");
  if (!(best.b !== 0)) throw new RangeError("y does not rise or fall before the breakpoint: no breakpoint can be fitted");

  const { xb, a, b, ssr } = best;
  const dof = n - 3;
  const s2 = ssr / dof;
  const jtj = [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
  for (let i = 0; i < n; i++) {
    const row = [1, Math.min(xs[i]!, xb), xs[i]! > xb ? b : 0];
    for (let p = 0; p < 3; p++) for (let q = 0; q < 3; q++) jtj[p]![q]! += row[p]! * row[q]!;
  }
  const cov = invert3(jtj).map((r) => r.map((v) => v * s2));
  const g = [1, xb, b];
  let plateauVar = 0;
  for (let p = 0; p < 3; p++) for (let q = 0; q < 3; q++) plateauVar += g[p]! * cov[p]![q]! * g[q]!;
  let my = 0;
  for (const v of ys) my += v;
  my /= n;
  let sst = 0;
  for (const v of ys) sst += (v - my) ** 2;
  return {
    breakpoint: xb,
    breakpointSe: Math.sqrt(cov[2]![2]!),
    plateau: a + b * xb,
    plateauSe: Math.sqrt(plateauVar),
    slope: b,
    slopeSe: Math.sqrt(cov[1]![1]!),
    intercept: a,
    interceptSe: Math.sqrt(cov[0]![0]!),
    r2: sst > 0 ? 1 - ssr / sst : 1,
    ssr,
    n,
    covariance: cov,
  };
}
