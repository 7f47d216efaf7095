import { describe, expect, it } from "vitest";
import { depletionComposition } from "@/lib/fits/depletionComposition";
import { formatTypedRows, overlapFromPure, parseTypedRows, rowsFromReadings } from "@/lib/series/depletionRows";
import type { SupernatantReadings } from "@/lib/series/supernatantSchemas";

const HC = 1239.841984; // eV·nm, CODATA 2018
// Extinction coefficients written out from the papers' formulas, as DOMAIN.md §3 checks them:
const EPS_CDSE_550 = 1.115e5; // Yu 2003: CdSe first exciton at 550 nm → D 3.040 nm, ε = 5857·D^2.65 ≈ 1.115e5 M⁻¹cm⁻¹
const PBS_3NM_EXCITON_NM = HC / 1.3395; // Moreels 2009: d = 3 nm → E₀ = 1.3395 eV
const EPS_PBS_400 = 0.0233 * 27 * 1e6; // Moreels 2009: ε₄₀₀ = 0.0233·d³ µM⁻¹cm⁻¹ = 6.291e5 M⁻¹cm⁻¹ at d = 3 nm

// An invented 2:1 product (two X per A), 0.5 µM A in every mixture. Below 2 equivalents every X
// binds (with half as much A); above, every A binds (with twice as much X). What is left makes
// the supernatant absorbances (Beer–Lambert, l = 1 cm), and A also absorbs at X's 400 nm
// (rA = 1.2) and X at A's 550 nm (rX = 0.35): absorbances add (common practice).
const addedA = 0.5;
const feeds = [0.5, 1, 3, 4];
const rA = 1.2,
  rX = 0.35;
const truth = feeds.map((feed) => {
  const addedX = feed * addedA;
  const boundA = Math.min(addedA, addedX / 2);
  const boundX = 2 * boundA;
  const a = (addedA - boundA) * 1e-6 * EPS_CDSE_550; // A's absorbance at 550 nm
  const x = (addedX - boundX) * 1e-6 * EPS_PBS_400; // X's absorbance at 400 nm
  return { addedX, leftA: addedA - boundA, leftX: addedX - boundX, atA: a + rX * x, atX: rA * a + x };
});
const setup = {
  dotA: { material: "CdSe" as const, firstExcitonNm: 550 },
  dotX: { material: "PbS" as const, firstExcitonNm: PBS_3NM_EXCITON_NM },
  pathLengthCm: 1,
  overlap: { aAtXPerAtA: rA, xAtAPerAtX: rX },
};

describe("depletionComposition", () => {
  it("finds the 2:1 composition of a mixture with overlapping dots (Yu 2003, Moreels 2009 ε; Beer–Lambert)", () => {
    const rows = truth.map((t, i) => ({ label: `p${i}`, addedA, addedX: t.addedX, atA: t.atA, atX: t.atX }));
    const out = depletionComposition(rows, setup);
    expect(out.extinctionA.readingNm).toBe(550); // Yu 2003 states ε at the first exciton
    expect(out.extinctionX.readingNm).toBe(400); // Moreels 2009 states ε at 400 nm
    expect(Math.abs(out.extinctionA.epsilonPerMPerCm / EPS_CDSE_550 - 1)).toBeLessThan(5e-4); // DOMAIN.md check value, 4 digits
    expect(Math.abs(out.extinctionX.epsilonPerMPerCm / EPS_PBS_400 - 1)).toBeLessThan(3e-4); // d solved back to 3 nm (E₀ given to 4 decimals)
    out.result.rows.forEach((r, i) => {
      expect(r.leftA).toBeCloseTo(truth[i]!.leftA, 3);
      expect(r.leftX).toBeCloseTo(truth[i]!.leftX, 3);
      expect(r.boundRatio!).toBeCloseTo(2, 2);
    });
    expect(out.result.constant).toBe(true); // feed ratio changed 8-fold, bound ratio steady
    expect(out.result.feedFoldChange).toBeCloseTo(8, 12);
  });

  it("names the row, the dot or the field of every refusal", () => {
    const ok = { label: "Points, line 1", addedA: 0.5, addedX: 0.25, atA: 0.03, atX: 0.01 };
    expect(() => depletionComposition([ok, { ...ok, label: "Points, line 2", addedX: 0 }], setup)).toThrow(
      "Points, line 2: added X must be a positive number of µM",
    );
    expect(() => depletionComposition([ok], setup)).toThrow(/Points: need at least 2 points/);
    expect(() => depletionComposition([ok, ok], { ...setup, dotA: { material: "CdSe", firstExcitonNm: -1 } })).toThrow(
      /^Dot A: first exciton must be/,
    );
    expect(() => depletionComposition([ok, ok], { ...setup, pathLengthCm: 0 })).toThrow("Path length: give a positive number of cm");
    expect(() =>
      depletionComposition([ok, { ...ok, label: "sup-2.csv" }], { ...setup, overlap: { aAtXPerAtA: 1, xAtAPerAtX: 0.99 } }),
    ).toThrow(/^Points, line 1: the two dots absorb too alike/);
  });
});

describe("rows for the depletion panel", () => {
  const reading = (fileName: string, atA: number | null, atX: number | null, error: string | null = null) => ({
    spectrumId: fileName,
    fileName,
    atA,
    atX,
    pathLengthCm: 1,
    error,
  });
  const readings: SupernatantReadings = {
    seriesId: "s",
    wavelengthsNm: { a: 550, x: 400 },
    reading: "measured",
    points: [
      { spectrumId: "p0", fileName: "p0.csv", seriesValue: 0, supernatant: reading("s0.csv", 0.05, 0.06) },
      { spectrumId: "p1", fileName: "p1.csv", seriesValue: 1, supernatant: reading("s1.csv", 0.03, 0.04) },
      { spectrumId: "p2", fileName: "p2.csv", seriesValue: 2, supernatant: null },
      { spectrumId: "p3", fileName: "p3.csv", seriesValue: null, supernatant: reading("s3.csv", 0.01, 0.2) },
      {
        spectrumId: "p4",
        fileName: "p4.csv",
        seriesValue: 4,
        supernatant: reading("s4.csv", null, null, "s4.csv: 400 nm is outside the recorded range 450–750 nm"),
      },
    ],
    pureA: null,
    pureX: null,
  };

  it("takes added X from the series value as a feed ratio or as a concentration, naming each file it cannot use", () => {
    const ratio = rowsFromReadings(readings, "feed-ratio", 0.5, "PbS per CdSe");
    expect(ratio.rows).toEqual([{ label: "s1.csv", addedA: 0.5, addedX: 0.5, atA: 0.03, atX: 0.04, pathLengthCm: 1 }]);
    expect(ratio.notes).toEqual(["s0.csv left out: nothing of dot X was added at PbS per CdSe 0"]);
    expect(ratio.errors).toEqual([
      "s3.csv: its point p3.csv has no value of PbS per CdSe",
      "s4.csv: 400 nm is outside the recorded range 450–750 nm",
    ]);
    expect(rowsFromReadings(readings, "added-x", 0.5, "PbS").rows[0]!.addedX).toBe(1);
  });

  it("reads overlap ratios from spectra of the pure dots, and refuses a pure spectrum with nothing at its own wavelength", () => {
    const o = overlapFromPure(reading("cdse.csv", 0.2, 0.5), reading("pbs.csv", 0.3, 0.6));
    expect(o.ratios.aAtXPerAtA).toBeCloseTo(2.5, 12); // 0.5 / 0.2
    expect(o.ratios.xAtAPerAtX).toBeCloseTo(0.5, 12); // 0.3 / 0.6
    expect(overlapFromPure(reading("flat.csv", 0, 0.1), null).errors).toEqual([
      "Spectrum of pure A: flat.csv has no positive absorbance at its own dot's wavelength (0.00), so it cannot scale the overlap",
    ]);
  });

  it("parses typed lines with an optional path length, names bad lines, and writes rows back the same way", () => {
    const typed = parseTypedRows("0.5, 0.25, 0.03, 0.001\n\n0.5;1;0.01;0.2;0.5\n0.5 x 1 2");
    expect(typed.rows.map((r) => r.label)).toEqual(["Points, line 1", "Points, line 3"]);
    expect(typed.rows[1]!.pathLengthCm).toBe(0.5);
    expect(typed.errors[0]).toMatch(/^Points, line 4: give four numbers/);
    expect(parseTypedRows(formatTypedRows(typed.rows)).rows.map(({ label: _label, ...r }) => r)).toEqual(
      typed.rows.map(({ label: _label, ...r }) => r),
    );
  });
});
