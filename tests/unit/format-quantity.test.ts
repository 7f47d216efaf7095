import { describe, expect, it } from "vitest";
import {
  MINUS,
  countOf,
  formatFlagMagnitude,
  formatFlagUncertainty,
  formatQuantity,
  formatUncertainty,
  formatWithUncertainty,
  perUnit,
  pluralOf,
  reciprocalUnit,
} from "@/lib/format/quantity";

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
    expect(
      formatFlagMagnitude({ kind: "concentration", magnitude: 0.7, unit: "ratio", uncertainty: 0.01 }, { withUncertainty: true }),
    ).toBe("0.70 ± 0.01");
  });

  it("uses the stored unit when it differs from the kind's usual one", () => {
    expect(formatFlagMagnitude({ kind: "new-band", magnitude: 0.0123, unit: "signal" })).toBe("0.0123");
    expect(formatFlagMagnitude({ kind: "new-band", magnitude: 0.05, unit: "fraction" })).toBe("5.0 %");
  });
});

describe("spectral positions", () => {
  // Units as written in the SI Brochure (eV is accepted for use with the SI, Table 8) and the
  // wavenumber as cm⁻¹ with a superscript minus one (IUPAC Green Book, 3rd ed., §2.7).
  it("writes eV to 1 meV, nm to 0.1 nm and wavenumbers to 1 cm⁻¹, each with its unit", () => {
    expect(formatQuantity(2.14536, "eV")).toBe("2.145 eV");
    expect(formatQuantity(577.94, "nm")).toBe("577.9 nm");
    expect(formatQuantity(1650.4, "cm-1")).toBe("1650 cm⁻¹");
    expect(formatQuantity(1650.4, "cm-1")).not.toContain("cm-1");
  });

  it("never writes a hyphen for a negative position or '−0' for a rounded zero", () => {
    expect(formatQuantity(-0.0004, "eV")).toBe("0.000 eV");
    expect(formatQuantity(-3.5, "cm-1", { signed: true })).toBe(`${MINUS}4 cm⁻¹`);
  });
});

describe("uncertainties carry their unit", () => {
  // GUM (JCGM 100:2008) §7.2.2: a standard uncertainty is stated in the unit of the measurand;
  // §7.2.6: quote it to at most two significant digits.
  it("states the unit of the quantity with the uncertainty", () => {
    expect(formatUncertainty(0.072, "eV")).toBe("0.072 eV");
    expect(formatUncertainty(0.00347, "meV")).toBe("0.0035 meV");
    expect(formatUncertainty(0.012, "fraction")).toBe("1.2 %");
    expect(formatUncertainty(0.0012, "signal", "absorbance")).toBe("0.0012 absorbance");
    expect(formatUncertainty(0.01, "ratio")).toBe("0.010 (ratio)");
  });

  it("takes the flag's own unit: a broadening's uncertainty is in meV, a bleach's in %", () => {
    expect(formatFlagUncertainty({ kind: "broadening", magnitude: 9.3, unit: "meV", uncertainty: 0.41 })).toBe("0.41 meV");
    expect(formatFlagUncertainty({ kind: "bleach", magnitude: 0.25, unit: "fraction", uncertainty: 0.0072 })).toBe("0.72 %");
  });

  it("rounds a signal at its uncertainty's second significant digit", () => {
    expect(formatQuantity(0.121034, "signal", { uncertainty: 0.000941 })).toBe("0.12103 ± 0.00094");
    expect(formatQuantity(0.121034, "signal")).toBe("0.121");
  });

  it("rounds a value at its uncertainty's second significant digit", () => {
    expect(formatWithUncertainty(0.080412, 0.00123, "µM⁻¹")).toBe("0.0804 ± 0.0012 µM⁻¹");
    expect(formatWithUncertainty(-1.23456, 0.05)).toBe(`${MINUS}1.235 ± 0.050`);
  });
});

describe("counts and rates read as English", () => {
  // Common English usage; "spectra" and "series" are the plurals the trade writes (from memory).
  it("agrees a noun with its count", () => {
    expect(countOf(1, "peak")).toBe("1 peak");
    expect(countOf(2, "peak")).toBe("2 peaks");
    expect(countOf(1, "flag")).toBe("1 flag");
    expect(countOf(0, "flag")).toBe("0 flags");
    expect(countOf(1, "spectrum")).toBe("1 spectrum");
    expect(countOf(3, "spectrum")).toBe("3 spectra");
    expect(countOf(0, "series")).toBe("0 series");
    expect(countOf(12000, "point")).toBe("12,000 points");
    expect(pluralOf("analysis")).toBe("analyses");
    expect(pluralOf("batch")).toBe("batches");
  });

  it("writes a rate per one unit", () => {
    expect(perUnit("equivalents")).toBe("per equivalent");
    expect(perUnit("µM")).toBe("per µM");
    expect(perUnit("")).toBe("per unit");
    expect(perUnit("mass")).toBe("per mass");
    expect(reciprocalUnit("µM")).toBe("µM⁻¹");
    expect(reciprocalUnit("equivalents")).toBe("per equivalent");
  });
});
