import { describe, expect, it } from "vitest";
import { MINUS, formatFlagMagnitude, formatQuantity } from "@/lib/format/quantity";

// Sources: the minus sign is U+2212 MINUS SIGN (Unicode Standard, "Mathematical Operators" block;
// the hyphen-minus U+002D is not the typographic minus). Number and unit are separated by a
// space, including before "%" (BIPM SI Brochure, 9th ed. 2019, §5.4.3 and §5.4.7). A value with
// its standard uncertainty may be written "(x ± u) unit" (BIPM SI Brochure §5.4.6; JCGM 100:2008
// GUM §7.2.2); we drop the parentheses and keep the unit after u.

describe("formatQuantity", () => {
  it("writes a negative value with one real minus sign, never '+-'", () => {
    const text = formatQuantity(-17.8, "meV", { signed: true, suffix: "FWHM" });
    expect(text).toBe(`${MINUS}17.8 meV FWHM`);
    expect(text).not.toMatch(/\+-|\+−|-/);
    expect(MINUS.codePointAt(0)).toBe(0x2212);
  });

  it("writes '+' only where a direction matters", () => {
    expect(formatQuantity(3.24, "meV", { signed: true })).toBe("+3.2 meV");
    expect(formatQuantity(0.123, "fraction")).toBe("12.3 %");
  });

  it("writes no sign on a value that rounds to zero (no '−0.0')", () => {
    expect(formatQuantity(-0.04, "meV", { signed: true })).toBe("0.0 meV");
    expect(formatQuantity(0.0004, "fraction", { signed: true })).toBe("0.0 %");
  });

  it("writes the uncertainty once, in the value's unit", () => {
    expect(formatQuantity(0.7, "ratio", { uncertainty: 0.012 })).toBe("0.70 ± 0.01");
    expect(formatQuantity(0.12, "fraction", { uncertainty: 0.005 })).toBe("12.0 ± 0.5 %");
    expect(formatQuantity(-0.2, "ratio", { uncertainty: 0.01 })).toBe(`${MINUS}0.20 ± 0.01`);
  });

  it("answers '—' for a value that is not a number", () => {
    expect(formatQuantity(Number.NaN, "meV")).toBe("—");
    expect(formatFlagMagnitude({ kind: "shift", magnitude: null, unit: "meV" })).toBe("—");
  });
});

describe("formatFlagMagnitude", () => {
  it("reads sign and suffix from the kind's registry entry", () => {
    expect(formatFlagMagnitude({ kind: "broadening", magnitude: -17.8, unit: "meV" })).toBe(`${MINUS}17.8 meV FWHM`);
    expect(formatFlagMagnitude({ kind: "broadening", magnitude: 17.8, unit: "meV" })).toBe("+17.8 meV FWHM");
    expect(formatFlagMagnitude({ kind: "shift", magnitude: -14.04, unit: "meV" })).toBe(`${MINUS}14.0 meV`);
    expect(formatFlagMagnitude({ kind: "bleach", magnitude: 0.25, unit: "fraction" })).toBe("25.0 %");
    expect(formatFlagMagnitude({ kind: "band-change", magnitude: -0.35, unit: "fraction" })).toBe(`${MINUS}35.0 %`);
  });

  it("shows a concentration ratio as a plain number with its uncertainty", () => {
    expect(formatFlagMagnitude({ kind: "concentration", magnitude: 0.7, unit: "ratio", uncertainty: 0.01 }, { withUncertainty: true })).toBe("0.70 ± 0.01");
  });

  it("uses the stored unit when it differs from the kind's usual one", () => {
    expect(formatFlagMagnitude({ kind: "new-band", magnitude: 0.0123, unit: "signal" })).toBe("0.0123");
    expect(formatFlagMagnitude({ kind: "new-band", magnitude: 0.05, unit: "fraction" })).toBe("5.0 %");
  });
});
