import { describe, expect, it } from "vitest";
import { parseSpectrumFile } from "@/lib/engine";
import { supernatantCsv } from "@/lib/demo/synthetic";
import { readAbsorbanceAt } from "@/lib/series/readAbsorbanceAt";

const f64 = (v: number[]) => Float64Array.from(v);
const HC = 1239.841984; // eV·nm, CODATA 2018

describe("readAbsorbanceAt", () => {
  const nm = { x: f64([400, 401, 402, 403]), y: f64([0.5, 0.4, 0.3, 0.1]), xUnit: "nm" as const, yUnit: "absorbance" as const };

  it("returns a recorded value exactly and interpolates linearly between two points (by hand)", () => {
    expect(readAbsorbanceAt(nm, 401)).toBe(0.4);
    expect(readAbsorbanceAt(nm, 400)).toBe(0.5);
    expect(readAbsorbanceAt(nm, 403)).toBe(0.1);
    expect(readAbsorbanceAt(nm, 402.25)).toBeCloseTo(0.3 + 0.25 * (0.1 - 0.3), 12);
  });

  it("reads an energy axis at the energy of the wavelength (E = hc/λ, CODATA 2018) and turns %T into absorbance", () => {
    const ev = { x: f64([1.5, 2, 2.5, 3]), y: f64([0.1, 0.7, 0.2, 0.9]), xUnit: "eV" as const, yUnit: "absorbance" as const };
    expect(readAbsorbanceAt(ev, HC / 2)).toBeCloseTo(0.7, 10);
    const t = { x: f64([400, 500, 600]), y: f64([1, 10, 100]), xUnit: "nm" as const, yUnit: "percent-transmittance" as const };
    expect(readAbsorbanceAt(t, 500)).toBeCloseTo(1, 12); // A = 2 − log10(10 %) (common practice)
    expect(readAbsorbanceAt(t, 550)).toBeCloseTo(0.5, 12); // between A = 1 and A = 0
  });

  it("names the wavelength and the recorded range when asked outside it, and refuses emission counts", () => {
    expect(() => readAbsorbanceAt(nm, 420)).toThrow("420 nm is outside the recorded range 400–403 nm");
    expect(() => readAbsorbanceAt({ ...nm, yUnit: "counts" }, 401)).toThrow(/emission counts/);
  });

  it("reads a parsed instrument-style export at its recorded lines (the file's own numbers)", () => {
    const text = supernatantCsv(
      {
        cdse: { firstExcitonEv: HC / 550, atNm: 550, absorbance: 0.04 },
        pbs: { firstExcitonEv: 1.3, atNm: 400, absorbance: 0.2 },
        noise: 0,
      },
      "probe",
    );
    const parsed = parseSpectrumFile("probe.csv", new TextEncoder().encode(text));
    const line = (n: string) =>
      Number(
        text
          .split("\r\n")
          .find((l) => l.startsWith(`${n},`))!
          .split(",")[1],
      );
    expect(readAbsorbanceAt(parsed, 550)).toBe(line("550.0"));
    expect(readAbsorbanceAt(parsed, 400)).toBe(line("400.0"));
  });
});
