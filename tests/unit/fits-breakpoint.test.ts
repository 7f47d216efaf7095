import { execFileSync } from "node:child_process";
import { describe, expect, it } from "vitest";
import { fitBreakpoint } from "@/lib/fits/fitBreakpoint";

// Reference: scipy.optimize.curve_fit (scipy 1.17) on the model y = a + b·min(x, xb), started
// from our estimate, returns popt and pcov (absolute_sigma=False); we compare both.
const CURVE_FIT = `
import json, sys
import numpy as np
from scipy.optimize import curve_fit
req = json.load(sys.stdin)
x = np.array(req["x"], float); y = np.array(req["y"], float)
f = lambda x, a, b, xb: a + b * np.minimum(x, xb)
popt, pcov = curve_fit(f, x, y, p0=req["p0"], method="lm", xtol=1e-14, ftol=1e-14, maxfev=20000)
print(json.dumps({"popt": popt.tolist(), "perr": np.sqrt(np.diag(pcov)).tolist()}))
`;
function scipyCurveFit(x: number[], y: number[], p0: number[]): { popt: number[]; perr: number[] } {
  return JSON.parse(execFileSync("python3", ["-c", CURVE_FIT], { input: JSON.stringify({ x, y, p0 }) }).toString());
}

// Invented titration: bleach rising 0.45 per equivalent, saturating at 1.0 equivalent, with fixed
// pseudo-noise so the breakpoint falls between data points.
const X = [0.2, 0.4, 0.6, 0.8, 1.1, 1.3, 1.6, 2.0];
const NOISE = [0.004, -0.006, 0.003, 0.005, -0.004, 0.002, -0.003, 0.001];
const Y = X.map((x, i) => 0.45 * Math.min(x, 1) + NOISE[i]!);

describe("fitBreakpoint", () => {
  it("recovers an exact two-line model (analytic: y = 0.1 + 0.5·min(x, 1.25))", () => {
    const x = [0, 0.5, 1, 1.5, 2, 2.5];
    const fit = fitBreakpoint(
      x,
      x.map((v) => 0.1 + 0.5 * Math.min(v, 1.25)),
    );
    expect(fit.breakpoint).toBeCloseTo(1.25, 8);
    expect(fit.plateau).toBeCloseTo(0.725, 10);
    expect(fit.slope).toBeCloseTo(0.5, 10);
    expect(fit.r2).toBeCloseTo(1, 12);
  });

  it("matches scipy.optimize.curve_fit parameters and standard errors on a noisy titration", () => {
    const fit = fitBreakpoint(X, Y);
    const ref = scipyCurveFit(X, Y, [fit.intercept, fit.slope, fit.breakpoint]);
    expect(fit.intercept).toBeCloseTo(ref.popt[0]!, 7); // scipy curve_fit
    expect(fit.slope).toBeCloseTo(ref.popt[1]!, 7); // scipy curve_fit
    expect(fit.breakpoint).toBeCloseTo(ref.popt[2]!, 7); // scipy curve_fit
    expect(fit.interceptSe / ref.perr[0]!).toBeCloseTo(1, 3); // scipy curve_fit pcov
    expect(fit.slopeSe / ref.perr[1]!).toBeCloseTo(1, 3); // scipy curve_fit pcov
    expect(fit.breakpointSe / ref.perr[2]!).toBeCloseTo(1, 3); // scipy curve_fit pcov
    // The saturation ratio is the 1:1 stoichiometry the data were made with (invented data).
    expect(Math.abs(fit.breakpoint - 1)).toBeLessThan(3 * fit.breakpointSe + 0.05);
  });

  it("places the breakpoint at the global minimum of the profiled residuals (fine grid scan)", () => {
    const fit = fitBreakpoint(X, Y);
    // A profile scan of the residual sum of squares on a fine grid never goes below our minimum.
    for (let xb = 0.41; xb < 1.99; xb += 0.001) {
      const u = X.map((v) => Math.min(v, xb));
      const mu = u.reduce((s, v) => s + v, 0) / u.length;
      const my = Y.reduce((s, v) => s + v, 0) / Y.length;
      const b = u.reduce((s, v, i) => s + (v - mu) * (Y[i]! - my), 0) / u.reduce((s, v) => s + (v - mu) ** 2, 0);
      const a = my - b * mu;
      const ssr = u.reduce((s, v, i) => s + (Y[i]! - a - b * v) ** 2, 0);
      expect(ssr).toBeGreaterThanOrEqual(fit.ssr - 1e-15);
    }
  });

  it("refuses bad input with messages naming the argument", () => {
    expect(() => fitBreakpoint([1, 2, 3], [1, 2, 3])).toThrow(/at least 4 points/);
    expect(() => fitBreakpoint([1, 2, 3, 4], [1, 2, 3])).toThrow(/same length/);
    expect(() => fitBreakpoint([1, 2, Number.NaN, 4], [1, 2, 3, 4])).toThrow("x[2] is not a finite number");
    expect(() => fitBreakpoint([1, 1, 1, 1], [1, 2, 3, 4])).toThrow(/distinct/);
  });

  it("does not modify its inputs", () => {
    const x = [...X].reverse();
    const y = [...Y].reverse();
    const fit = fitBreakpoint(x, y);
    expect(x).toEqual([...X].reverse());
    expect(fit.breakpoint).toBeCloseTo(fitBreakpoint(X, Y).breakpoint, 12);
  });
});
