import { describe, expect, it } from "vitest";
import { separateTwoAbsorbances } from "@/lib/fits/separateTwoAbsorbances";

// Two dots in one cuvette: Beer–Lambert absorbances add (common practice), so a mixture made by
// hand from known shares must split back into them.
describe("separateTwoAbsorbances", () => {
  it("recovers each dot's share of a mixture built by hand", () => {
    // a = 0.2 (A at λA), x = 0.3 (X at λX), rA = 1.5, rX = 0.4:
    // S(λA) = 0.2 + 0.4·0.3 = 0.32, S(λX) = 1.5·0.2 + 0.3 = 0.6
    const r = separateTwoAbsorbances(0.32, 0.6, { aAtXPerAtA: 1.5, xAtAPerAtX: 0.4 });
    expect(r.a).toBeCloseTo(0.2, 12);
    expect(r.x).toBeCloseTo(0.3, 12);
  });

  it("leaves the absorbances alone without overlap ratios, and takes out only the one given", () => {
    expect(separateTwoAbsorbances(0.12, 0.34)).toEqual({ a: 0.12, x: 0.34 });
    // only A absorbs at λX: x = S(λX) − rA·S(λA) = 0.34 − 2·0.12 = 0.10
    const r = separateTwoAbsorbances(0.12, 0.34, { aAtXPerAtA: 2 });
    expect(r.a).toBeCloseTo(0.12, 12);
    expect(r.x).toBeCloseTo(0.1, 12);
  });

  it("refuses overlaps too alike to tell apart, and bad inputs, naming them", () => {
    expect(() => separateTwoAbsorbances(0.3, 0.3, { aAtXPerAtA: 1, xAtAPerAtX: 0.95 })).toThrow(
      /too alike .*1 − rA·rX = 0\.050, needs ≥ 0\.1/,
    );
    expect(() => separateTwoAbsorbances(0.3, 0.3, { aAtXPerAtA: -0.1 })).toThrow("aAtXPerAtA must be a finite number ≥ 0");
    expect(() => separateTwoAbsorbances(Number.NaN, 0.3)).toThrow("absorbance at A's wavelength is not a finite number");
  });
});
