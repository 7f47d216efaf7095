import { convert } from "jcampconverter";
import { describe, expect, it } from "vitest";
import { parseSpectrumFile } from "@/lib/engine";
import { jcampUnits, writeJcamp, type JcampInput } from "@/lib/formats/jcamp";
import type { XUnit, YUnit } from "@/lib/engine";
import { TECHNIQUE_SPECS, type Technique } from "@/lib/registry/techniques";

const enc = new TextEncoder();

/** A parsed spectrum written the way export bundles write it (units and %T fraction from jcampUnits). */
function writeParsed(
  p: {
    title: string;
    technique: Technique;
    x: ArrayLike<number>;
    y: ArrayLike<number>;
    xUnit: XUnit;
    yUnit: YUnit;
    origin: string;
    owner: string;
  } & Pick<JcampInput, "labels">,
) {
  const units = jcampUnits(p.xUnit, p.yUnit);
  return writeJcamp({
    title: p.title,
    dataType: TECHNIQUE_SPECS[p.technique].jcampDataType,
    xUnits: units.xUnits,
    yUnits: units.yUnits,
    x: p.x,
    y: Array.from(p.y, (v) => v * units.yScale),
    origin: p.origin,
    owner: p.owner,
    labels: p.labels,
  });
}

describe("writeJcamp (JCAMP-DX 4.24, AFFN) on parsed spectra, as export bundles write them", () => {
  const x = Float64Array.from({ length: 50 }, (_, i) => 400 + i * 2.5);
  const y = Float64Array.from(x, (v) => 0.1 + Math.exp(-(((v - 480) / 12) ** 2)) * 0.8123456789012345);
  const text = writeParsed({
    title: "cdse-test.csv",
    technique: "absorption",
    x,
    y,
    xUnit: "nm",
    yUnit: "absorbance",
    origin: "Test lab",
    owner: "Test lab",
  });

  it("writes the required labelled records", () => {
    expect(text).toMatch(/^##TITLE=cdse-test\.csv\r\n##JCAMP-DX=4\.24\r\n/);
    for (const label of [
      "##DATA TYPE=UV/VIS SPECTRUM",
      "##XUNITS=NANOMETERS",
      "##YUNITS=ABSORBANCE",
      "##NPOINTS=50",
      "##XYDATA=(X++(Y..Y))",
      "##END=",
    ])
      expect(text).toContain(label);
  });

  it("reads back exactly with the engine's parser", () => {
    const parsed = parseSpectrumFile("out.jdx", enc.encode(text));
    expect(parsed.format).toBe("jcamp-dx");
    expect(parsed.xUnit).toBe("nm");
    expect(parsed.yUnit).toBe("absorbance");
    expect(parsed.x.length).toBe(50);
    parsed.x.forEach((v, i) => expect(v).toBeCloseTo(x[i]!, 9));
    parsed.y.forEach((v, i) => expect(Math.abs(v - y[i]!)).toBeLessThan(1e-8)); // YFACTOR = max/2^30 ≈ 8e-10
  });

  it("reads back exactly with jcampconverter", () => {
    const result = convert(text);
    const data = result.flatten[0]!.spectra[0]!.data as unknown as { x: number[]; y: number[] };
    expect(data.x.length).toBe(50);
    data.x.forEach((v, i) => expect(v).toBeCloseTo(x[i]!, 9));
    data.y.forEach((v, i) => expect(Math.abs(v - y[i]!)).toBeLessThan(1e-8));
  });

  it("writes unequally spaced data as X,Y pairs that both readers take back", () => {
    const xs = [400, 401, 403.5, 404, 410, 411, 415, 420, 421, 430, 431, 432, 433, 440, 450, 455];
    const yv = xs.map((v) => 1e-7 * v); // tiny values: no exponent may reach the file
    const t = writeParsed({
      title: "irregular",
      technique: "absorption",
      x: xs,
      y: yv,
      xUnit: "nm",
      yUnit: "absorbance",
      origin: "o",
      owner: "o",
    });
    expect(t).toContain("##PEAK TABLE=(XY..XY)");
    expect(t.split("##NPOINTS")[1]).not.toMatch(/\d[eE][+-]?\d/);
    const parsed = parseSpectrumFile("irr.jdx", enc.encode(t));
    expect(Array.from(parsed.x)).toEqual(xs);
    parsed.y.forEach((v, i) => expect(Math.abs(v - yv[i]!)).toBeLessThan(2.2e-14)); // half a YFACTOR step (4.55e-5 / 2^30 / 2)
    const data = convert(t).flatten[0]!.spectra[0]!.data as unknown as { x: number[]; y: number[] };
    expect(Array.from(data.x)).toEqual(xs);
  });

  it("writes percent transmittance as the standard's fraction, which reads back as %T", () => {
    const xs = Array.from({ length: 20 }, (_, i) => 1000 + i);
    const ts = xs.map((_, i) => 50 + i);
    const t = writeParsed({
      title: "ir",
      technique: "ir",
      x: xs,
      y: ts,
      xUnit: "cm-1",
      yUnit: "percent-transmittance",
      origin: "o",
      owner: "o",
    });
    expect(t).toContain("##YUNITS=TRANSMITTANCE");
    const parsed = parseSpectrumFile("ir.jdx", enc.encode(t));
    expect(parsed.yUnit).toBe("percent-transmittance");
    parsed.y.forEach((v, i) => expect(v).toBeCloseTo(ts[i]!, 6));
  });

  it("refuses bad input with exact messages", () => {
    const base = { title: "t", technique: "pl" as const, xUnit: "nm" as const, yUnit: "counts" as const, origin: "o", owner: "o" };
    expect(() => writeParsed({ ...base, x: [1, 2], y: [1] })).toThrow(new RangeError("x and y must have the same length (2 and 1)"));
    expect(() => writeParsed({ ...base, x: [1], y: [1] })).toThrow(new RangeError("at least 2 points are needed"));
    expect(() => writeParsed({ ...base, x: [1, NaN], y: [1, 2] })).toThrow(new RangeError("x[1] is not a finite number"));
  });

  it("keeps every value on one line with no ## in it (runs of # become one #)", () => {
    const t = writeJcamp({
      title: "a\n##END=",
      dataType: "x",
      xUnits: "NANOMETERS",
      yUnits: "COUNTS",
      x: [1, 2],
      y: [1, 2],
      origin: "o\r\n###TITLE=b",
      labels: { note: "c##d" },
      comments: ["e\n##f"],
    });
    expect(t).toMatch(/^##TITLE=a #END=\r\n/);
    expect(t).toContain("\r\n##ORIGIN=o #TITLE=b\r\n");
    expect(t).toContain("\r\n##$NOTE=c#d\r\n");
    expect(t).toContain("\r\n$$ e #f\r\n");
    expect(t.split("\r\n").filter((l) => l.startsWith("##TITLE="))).toHaveLength(1);
  });
});
