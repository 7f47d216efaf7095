import { execFileSync } from "node:child_process";
import { describe, expect, it } from "vitest";
import { fitSternVolmer } from "@/lib/fits/fitSternVolmer";

// Reference: scipy.stats.linregress (scipy 1.17) of F0/F = 1/(1 − q) against [Q].
const LINREGRESS = `
import json, sys
import numpy as np
from scipy.stats import linregress
req = json.load(sys.stdin)
q = np.array(req["q"], float)
r = linregress(np.array(req["c"], float), 1.0 / (1.0 - q))
print(json.dumps({"slope": r.slope, "intercept": r.intercept, "stderr": r.stderr, "intercept_stderr": r.intercept_stderr, "r2": r.rvalue ** 2}))
`;
function linregress(c: number[], q: number[]) {
  return JSON.parse(execFileSync("python3", ["-c", LINREGRESS], { input: JSON.stringify({ c, q }) }).toString()) as {
    slope: number;
    intercept: number;
    stderr: number;
    intercept_stderr: number;
    r2: number;
  };
}

describe("fitSternVolmer", () => {
  it("recovers K_SV exactly from noise-free data (F0/F = 1 + K[Q], IUPAC Gold Book)", () => {
    const c = [0, 2.5, 5, 10, 20];
    const q = c.map((x) => 1 - 1 / (1 + 0.08 * x));
    const fit = fitSternVolmer(c, q);
    expect(fit.ksv).toBeCloseTo(0.08, 12);
    expect(fit.intercept).toBeCloseTo(1, 12);
    expect(fit.r2).toBeCloseTo(1, 12);
  });

  it("matches scipy.stats.linregress on quench fractions like the demo PL series", () => {
    // Quench fractions as measured in the demo scenario (invented data).
    const c = [0, 2.5, 5, 10, 20];
    const q = [0, 0.16381, 0.28104, 0.43677, 0.60517];
    const fit = fitSternVolmer(c, q);
    const ref = linregress(c, q);
    expect(fit.ksv).toBeCloseTo(ref.slope, 12); // scipy linregress
    expect(fit.ksvSe).toBeCloseTo(ref.stderr, 12); // scipy linregress
    expect(fit.intercept).toBeCloseTo(ref.intercept, 12); // scipy linregress
    expect(fit.interceptSe).toBeCloseTo(ref.intercept_stderr, 12); // scipy linregress
    expect(fit.r2).toBeCloseTo(ref.r2, 12); // scipy linregress
    // The series was made with K = 0.08 µM⁻¹ (scripts/seed.ts): within 5 %.
    expect(Math.abs(fit.ksv - 0.08) / 0.08).toBeLessThan(0.05);
  });

  it("refuses bad input with messages naming the argument", () => {
    expect(() => fitSternVolmer([0, 1], [0, 0.1])).toThrow(/at least 3 points/);
    expect(() => fitSternVolmer([0, 1, 2], [0, 0.1, 1])).toThrow("quenchFraction[2] must be a finite number below 1");
    expect(() => fitSternVolmer([0, -1, 2], [0, 0.1, 0.2])).toThrow("concentration[1] must be a finite number ≥ 0");
    expect(() => fitSternVolmer([1, 1, 1], [0, 0.1, 0.2])).toThrow(/distinct/);
  });
});
