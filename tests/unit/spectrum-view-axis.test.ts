import { describe, expect, it } from "vitest";
import { analyzeSpectrum } from "@/lib/engine";
import { axisToEnergy, energyToAxis, toDisplayAxis } from "@/lib/spectrum-view/axis";
import { deriveViewArrays } from "@/lib/spectrum-view/deriveViewArrays";
import { SizedLru } from "@/lib/lruCache";
import { PARENT_BANDS, absorbanceSpectrum, plSpectrum } from "../engine/synthetic";

// References: CODATA 2018 (hc = 1239.841984 eV·nm, 1 eV = 8065.54394 cm⁻¹; Tiesinga et al.,
// Rev. Mod. Phys. 2021, 93, 025010), written out here rather than imported, so a wrong constant in
// the code fails the test. Jacobian I(E) = I(λ)·λ²/hc: DOMAIN.md §4 (Mooney & Kambhampati,
// J. Phys. Chem. Lett. 2013, 4, 3316; confirmed).
const HC = 1239.841984;
const CM1_PER_EV = 8065.54394;

const uniformEnergy = (from: number, to: number, n: number) =>
  Float64Array.from({ length: n }, (_, i) => from + ((to - from) * i) / (n - 1));
const trapz = (x: ArrayLike<number>, y: ArrayLike<number>) => {
  let s = 0;
  for (let i = 1; i < x.length; i++) s += 0.5 * (y[i]! + y[i - 1]!) * (x[i]! - x[i - 1]!);
  return s;
};

describe("energyToAxis / axisToEnergy (CODATA 2018)", () => {
  it("puts 2 eV at hc/2 = 619.920992 nm and 16131.08788 cm⁻¹", () => {
    expect(energyToAxis(2, "nm")).toBeCloseTo(619.920992, 9); // CODATA hc / 2
    expect(energyToAxis(2, "cm-1")).toBeCloseTo(2 * CM1_PER_EV, 6); // CODATA 2018
    expect(energyToAxis(2, "ev")).toBe(2);
  });
  it("inverts itself on every axis", () => {
    for (const axis of ["nm", "ev", "cm-1"] as const) expect(axisToEnergy(energyToAxis(1.234, axis), axis)).toBeCloseTo(1.234, 12);
  });
  it("refuses non-positive energies with a RangeError naming the value", () => {
    expect(() => energyToAxis(0, "nm")).toThrow(/energyEv must be a positive/);
    expect(() => axisToEnergy(-5, "cm-1")).toThrow(RangeError);
  });
});

describe("toDisplayAxis", () => {
  const e = uniformEnergy(1.8, 2.6, 801);

  it("reverses to ascending wavelength and leaves absorbance values alone (axis only, DOMAIN.md §4)", () => {
    const a = e.map((v) => 0.3 + 0.1 * v);
    const d = toDisplayAxis(e, { a }, "nm", { emission: false });
    expect(d.x[0]).toBeCloseTo(HC / 2.6, 9);
    expect(d.x[800]).toBeCloseTo(HC / 1.8, 9);
    for (let i = 1; i < d.x.length; i++) expect(d.x[i]!).toBeGreaterThan(d.x[i - 1]!);
    expect(d.series.a![0]).toBe(a[800]);
    expect(d.series.a![800]).toBe(a[0]);
    expect(a[0]).toBeCloseTo(0.48, 12); // input not modified
  });

  it("turns I(E) back into I(λ) with I(λ) = I(E)·E²/hc, the inverse of DOMAIN.md's I(E) = I(λ)·λ²/hc", () => {
    // I(λ): a Gaussian in wavelength, known in closed form; I(E) from the DOMAIN.md formula.
    const iLambda = (nm: number) => 1000 * Math.exp(-0.5 * ((nm - 560) / 18) ** 2);
    const iE = e.map((ev) => (iLambda(HC / ev) * (HC / ev) ** 2) / HC);
    const d = toDisplayAxis(e, { pl: iE }, "nm", { emission: true });
    for (let i = 0; i < d.x.length; i += 50) expect(d.series.pl![i]).toBeCloseTo(iLambda(d.x[i]!), 9);
    // the integrated emission is preserved (DOMAIN.md §4), to the trapezoid rule's accuracy
    const areaE = trapz(e, iE);
    expect(trapz(d.x, d.series.pl!) / areaE).toBeCloseTo(1, 4);
  });

  it("gives I(ν̃) = I(λ)·λ²/10⁷ on the wavenumber axis (same Jacobian, ν̃ = 10⁷/λ)", () => {
    const iLambda = (nm: number) => 50 + nm / 10;
    const iE = e.map((ev) => (iLambda(HC / ev) * (HC / ev) ** 2) / HC);
    const d = toDisplayAxis(e, { pl: iE }, "cm-1", { emission: true });
    for (let i = 0; i < d.x.length; i += 100) {
      const nm = 1e7 / d.x[i]!;
      expect(d.x[i]).toBeCloseTo(e[i]! * CM1_PER_EV, 6);
      expect(d.series.pl![i]! / ((iLambda(nm) * nm * nm) / 1e7)).toBeCloseTo(1, 8);
    }
    expect(trapz(d.x, d.series.pl!) / trapz(e, iE)).toBeCloseTo(1, 9);
  });

  it("keeps null series null and refuses bad grids", () => {
    const d = toDisplayAxis(e, { a: e, ref: null }, "ev", { emission: false });
    expect(d.series.ref).toBeNull();
    expect(() => toDisplayAxis([2, 1.9], { a: [1, 2] }, "nm", { emission: false })).toThrow(/strictly ascending/);
    expect(() => toDisplayAxis([1, 2], { a: [1] }, "nm", { emission: false })).toThrow(/series a has 1 values for 2/);
  });
});

describe("deriveViewArrays re-derives the curves the engine measured", () => {
  it("absorption with a parent: smoothed curve passes through every reported peak height; difference = smoothed − reference", () => {
    const parent = absorbanceSpectrum({ bands: PARENT_BANDS, noise: 0.0015, seed: 7 });
    const sample = absorbanceSpectrum({
      bands: PARENT_BANDS.map((b, i) => (i === 0 ? { ...b, a: b.a * 0.6 } : b)),
      noise: 0.0015,
      seed: 8,
      newBand: { e: 1.9, sigma: 0.05, a: 0.06 },
    });
    const report = analyzeSpectrum(sample, { reference: parent });
    expect(report.flags.some((f) => f.kind === "bleach")).toBe(true);
    const v = deriveViewArrays(report, sample, parent);
    expect(v.energyEv.length).toBe(report.parameters.grid.points);
    expect(v.energyEv[0]).toBeCloseTo(report.parameters.grid.minEv, 12);
    for (const p of report.peaks) {
      const k = Math.round((p.energyEv - v.energyEv[0]!) / (v.energyEv[1]! - v.energyEv[0]!));
      expect(v.smoothed[k]).toBeCloseTo(p.height, 10); // the engine's height is smoothed[index]
    }
    for (let i = 0; i < v.energyEv.length; i += 37) expect(v.difference![i]).toBe(v.smoothed[i]! - v.reference![i]!);
    expect(v.emission).toBe(false);
  });

  it("PL in counts is flagged as an emission density and has no reference curve without a parent", () => {
    const pl = plSpectrum({ e: 2.1, sigma: 0.05, area: 100, noise: 0.01, seed: 3 });
    const v = deriveViewArrays(analyzeSpectrum(pl), pl, null);
    expect(v.emission).toBe(true);
    expect(v.reference).toBeNull();
    expect(v.difference).toBeNull();
  });

  it("refuses a report without grid parameters", () => {
    const pl = plSpectrum({ e: 2.1, sigma: 0.05, area: 100, noise: 0.01, seed: 3 });
    expect(() => deriveViewArrays({ parameters: {} } as never, pl, null)).toThrow(/grid and smoothing/);
  });
});

describe("SizedLru", () => {
  it("evicts the least recently used entries once the size budget is exceeded", () => {
    const lru = new SizedLru<string>(10, (s) => s.length);
    lru.set("a", "xxxx");
    lru.set("b", "xxxx");
    expect(lru.get("a")).toBe("xxxx"); // a is now the most recent
    lru.set("c", "xxxx"); // 12 > 10: b goes
    expect(lru.get("b")).toBeUndefined();
    expect(lru.get("a")).toBe("xxxx");
    expect(lru.usedSize).toBe(8);
    lru.set("huge", "x".repeat(11));
    expect(lru.get("huge")).toBeUndefined();
  });
});
