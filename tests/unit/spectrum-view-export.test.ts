import { convert } from "jcampconverter";
import { describe, expect, it } from "vitest";
import { parseSpectrumFile } from "@/lib/engine";
import { toDisplayAxis } from "@/lib/spectrum-view/axis";
import { writeCsv } from "@/lib/spectrum-view/writeCsv";
import { writeJcamp } from "@/lib/formats/jcamp";
import { resampleLinear } from "@/lib/spectrum-view/resampleLinear";

// JCAMP-DX 4.24: McDonald & Wilks, Appl. Spectrosc. 1988, 42, 151 (DOMAIN.md §7). Two readers
// check what we write: the project's own parser (lib/engine parseSpectrumFile) and jcampconverter
// (cheminfo, an independent implementation of the standard).
const CM1_PER_EV = 8065.54394; // CODATA 2018

const enc = (s: string) => new TextEncoder().encode(s);

function bandOnGrid(n: number) {
  const e = Float64Array.from({ length: n }, (_, i) => 1.7 + (0.9 * i) / (n - 1)); // uniform in energy, like the engine's grid
  const a = e.map((v) => 0.02 + 0.5 * Math.exp(-0.5 * ((v - 2.2) / 0.045) ** 2) - 0.004 * Math.sin(40 * v));
  return { e, a };
}

describe("writeJcamp on the viewer's display arrays", () => {
  const { e, a } = bandOnGrid(1201);
  const d = toDisplayAxis(e, { a }, "cm-1", { emission: false }); // a uniform energy grid is a uniform wavenumber grid
  const text = writeJcamp({
    title: "cdse test (smoothed)",
    dataType: "UV/VIS SPECTRUM",
    xUnits: "1/CM",
    yUnits: "ABSORBANCE",
    x: d.x,
    y: d.series.a!,
  });
  const yFactor = Number(/##YFACTOR=(.*)/.exec(text)![1]);

  it("writes the required labels in the order the standard gives and ends with ##END=", () => {
    const lines = text.split("\r\n");
    expect(lines[0]).toBe("##TITLE=cdse test (smoothed)");
    expect(lines[1]).toBe("##JCAMP-DX=4.24");
    expect(lines[2]).toBe("##DATA TYPE=UV/VIS SPECTRUM");
    for (const label of ["##XUNITS=1/CM", "##YUNITS=ABSORBANCE", "##XFACTOR=1", "##NPOINTS=1201", "##XYDATA=(X++(Y..Y))"])
      expect(lines).toContain(label);
    expect(lines.filter(Boolean).at(-1)).toBe("##END=");
    expect(Math.max(...lines.map((l) => l.length))).toBeLessThanOrEqual(80); // 80-character lines (McDonald & Wilks)
    expect(Number(/##FIRSTX=(.*)/.exec(text)![1])).toBe(d.x[0]);
    expect(Number(/##LASTX=(.*)/.exec(text)![1])).toBe(d.x[1200]);
  });

  it("reads back through jcampconverter (independent reader) to within half a YFACTOR step", () => {
    const spectrum = convert(text).flatten[0]!.spectra[0]!;
    const data = spectrum.data as unknown as { x: number[]; y: number[] };
    expect(data.x.length).toBe(1201);
    for (let i = 0; i < 1201; i += 7) {
      expect(Math.abs(data.x[i]! - d.x[i]!)).toBeLessThan(1e-6 * CM1_PER_EV);
      expect(Math.abs(data.y[i]! - d.series.a![i]!)).toBeLessThanOrEqual(yFactor / 2 + 1e-15);
    }
    expect(String(spectrum.xUnits).toUpperCase()).toBe("1/CM");
  });

  it("reads back through the project's own parser with units understood", () => {
    const parsed = parseSpectrumFile("back.jdx", enc(text));
    expect(parsed.format).toBe("jcamp-dx");
    expect(parsed.xUnit).toBe("cm-1");
    expect(parsed.yUnit).toBe("absorbance");
    expect(parsed.x.length).toBe(1201);
    let worst = 0;
    for (let i = 0; i < 1201; i++) worst = Math.max(worst, Math.abs(parsed.y[i]! - d.series.a![i]!));
    expect(worst).toBeLessThanOrEqual(yFactor / 2 + 1e-15);
  });

  it("writes X that is not equally spaced as X,Y pairs, and refuses a value that is not finite, naming it", () => {
    const nm = toDisplayAxis(e, { a }, "nm", { emission: false }); // uniform in energy = not uniform in wavelength
    const pairs = writeJcamp({
      title: "t",
      dataType: "UV/VIS SPECTRUM",
      xUnits: "NANOMETERS",
      yUnits: "ABSORBANCE",
      x: nm.x,
      y: nm.series.a!,
    });
    expect(pairs).toContain("##PEAK TABLE=(XY..XY)");
    expect(pairs).not.toContain("##XYDATA");
    expect(() => writeJcamp({ title: "t", dataType: "x", xUnits: "1/CM", yUnits: "A", x: [1, 2], y: [1, Number.NaN] })).toThrow(
      new RangeError("y[1] is not a finite number"),
    );
  });

  it("on the wavelength axis, resampleLinear gives equal steps that both readers accept, exact for a linear curve", () => {
    const nm = toDisplayAxis(e, { a: e.map((v) => 1239.841984 / v) }, "nm", { emission: false }); // y = λ: linear in x, so interpolation is exact
    const r = resampleLinear(nm.x, nm.series.a!);
    for (let i = 0; i < r.x.length; i += 100) expect(r.y[i]).toBeCloseTo(r.x[i]!, 9);
    const jdx = writeJcamp({ title: "t", dataType: "UV/VIS SPECTRUM", xUnits: "NANOMETERS", yUnits: "ABSORBANCE", x: r.x, y: r.y });
    const ours = parseSpectrumFile("nm.jdx", enc(jdx));
    expect(ours.xUnit).toBe("nm");
    const theirs = convert(jdx).flatten[0]!.spectra[0]!.data as unknown as { x: number[]; y: number[] };
    expect(theirs.y[600]).toBeCloseTo(r.y[600]!, 5);
    expect(ours.y[600]).toBeCloseTo(r.y[600]!, 5);
  });
});

describe("writeCsv", () => {
  it("round-trips every number exactly through the project's parser, column by name, nulls left out", () => {
    const { e, a } = bandOnGrid(401);
    const ref = a.map((v) => v * 1.1);
    const d = toDisplayAxis(e, { raw: a, smoothed: a, reference: ref, difference: null }, "nm", { emission: false });
    const csv = writeCsv(d, {
      metadata: { spectrum: 'cdse, batch "7".csv', technique: "absorption" },
      columnNames: { raw: "absorbance measured", smoothed: "absorbance smoothed", reference: "absorbance reference" },
    });
    expect(csv.split("\r\n")[0]).toBe('spectrum,"cdse, batch ""7"".csv"'); // RFC 4180 quoting
    expect(csv).not.toContain("difference");
    const back = parseSpectrumFile("export.csv", enc(csv), { column: "absorbance reference" });
    expect(back.xUnit).toBe("nm");
    expect(back.yUnit).toBe("absorbance");
    expect(back.x.length).toBe(401);
    for (let i = 0; i < 401; i++) {
      expect(back.x[i]).toBe(d.x[i]);
      expect(back.y[i]).toBe(d.series.reference![i]);
    }
  });

  it("names the axis in the X header so the energy and wavenumber exports read back in their units", () => {
    const { e, a } = bandOnGrid(64);
    for (const [axis, unit] of [
      ["ev", "eV"],
      ["cm-1", "cm-1"],
    ] as const) {
      const csv = writeCsv(toDisplayAxis(e, { a }, axis, { emission: false }), { columnNames: { a: "absorbance" } });
      expect(parseSpectrumFile(`e.csv`, enc(csv)).xUnit).toBe(unit);
    }
  });
});
