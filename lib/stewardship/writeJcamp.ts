import type { Technique, XUnit, YUnit } from "@/lib/engine";
import { TECHNIQUE_SPECS } from "@/lib/registry/techniques";

export type JcampInput = {
  title: string;
  technique: Technique;
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  xUnit: XUnit;
  yUnit: YUnit;
  origin: string;
  owner: string;
  /** Extra labelled records, written as ##$KEY=value (user-defined labels start with $). */
  extra?: Record<string, string>;
};

const X_UNITS: Record<XUnit, string> = { nm: "NANOMETERS", um: "MICROMETERS", "cm-1": "1/CM", eV: "EV" };

const oneLine = (s: string) => s.replace(/[\r\n]+/g, " ").replace(/##/g, "#").trim().slice(0, 200) || "untitled";

/** A decimal without exponent (JCAMP-DX AFFN readers take E for a compressed digit). */
function affn(v: number): string {
  const t = String(v);
  if (!/e/i.test(t)) return t;
  return v.toFixed(Math.min(100, Math.max(0, 16 - Math.floor(Math.log10(Math.abs(v) || 1))))).replace(/\.?0+$/, "");
}

/** True when x is ascending with a constant step (to 1e-9 of the step). */
export function isEquallySpaced(x: ArrayLike<number>): boolean {
  const n = x.length;
  const step = (x[n - 1]! - x[0]!) / (n - 1);
  if (!(step > 0)) return false;
  for (let i = 1; i < n; i++) if (Math.abs(x[i]! - (x[0]! + i * step)) > 1e-9 * Math.abs(step) + 1e-12 * Math.abs(x[i]!)) return false;
  return true;
}

/**
 * Writes one spectrum as JCAMP-DX 4.24 text (McDonald & Wilks, Appl. Spectrosc. 1988, 42, 151),
 * AFFN form. Equally spaced X (the usual instrument export) goes in ##XYDATA=(X++(Y..Y)) with one
 * ordinate per line; otherwise the pairs go in ##PEAK TABLE=(XY..XY), the standard's table of
 * X,Y pairs, since common readers do not read ##XYPOINTS. Ordinates are written as integers
 * times ##YFACTOR (max |y| / 2^30, so about 1e-9 of full scale); abscissae in decimal without exponent.
 * Percent transmittance is written as the standard's TRANSMITTANCE fraction (÷100).
 * Throws RangeError for unequal lengths, fewer than 2 points or non-finite values.
 */
export function writeJcamp(input: JcampInput): string {
  const n = input.x.length;
  if (input.y.length !== n) throw new RangeError(`x and y must have the same length (${n} and ${input.y.length})`);
  if (n < 2) throw new RangeError("at least 2 points are needed");
  const scale = input.yUnit === "percent-transmittance" ? 0.01 : 1;
  const ys: number[] = [];
  let maxAbs = 0;
  for (let i = 0; i < n; i++) {
    const xv = input.x[i]!;
    const yv = input.y[i]! * scale;
    if (!Number.isFinite(xv) || !Number.isFinite(yv)) throw new RangeError(`point ${i} is not a finite number`);
    ys.push(yv);
    maxAbs = Math.max(maxAbs, Math.abs(yv));
  }
  const yFactor = maxAbs > 0 ? maxAbs / 2 ** 30 : 1;
  const yInt = ys.map((v) => Math.round(v / yFactor));
  const regular = isEquallySpaced(input.x);
  const yUnits = input.yUnit === "absorbance" ? "ABSORBANCE" : input.yUnit === "percent-transmittance" ? "TRANSMITTANCE" : "ARBITRARY UNITS";
  const lines = [
    `##TITLE=${oneLine(input.title)}`,
    "##JCAMP-DX=4.24",
    `##DATA TYPE=${TECHNIQUE_SPECS[input.technique].jcampDataType}`,
    `##DATA CLASS=${regular ? "XYDATA" : "PEAK TABLE"}`,
    `##ORIGIN=${oneLine(input.origin)}`,
    `##OWNER=${oneLine(input.owner)}`,
    ...Object.entries(input.extra ?? {}).map(([k, v]) => `##$${k.toUpperCase().replace(/[^A-Z0-9 ]/g, "")}=${oneLine(v)}`),
    `##XUNITS=${X_UNITS[input.xUnit]}`,
    `##YUNITS=${yUnits}`,
    "##XFACTOR=1",
    `##YFACTOR=${affn(yFactor)}`,
    `##FIRSTX=${affn(input.x[0]!)}`,
    `##LASTX=${affn(input.x[n - 1]!)}`,
    ...(regular ? [`##DELTAX=${affn((input.x[n - 1]! - input.x[0]!) / (n - 1))}`] : []),
    `##FIRSTY=${affn(yInt[0]! * yFactor)}`,
    `##NPOINTS=${n}`,
    regular ? "##XYDATA=(X++(Y..Y))" : "##PEAK TABLE=(XY..XY)",
  ];
  for (let i = 0; i < n; i++) lines.push(regular ? `${affn(input.x[i]!)} ${yInt[i]}` : `${affn(input.x[i]!)},${yInt[i]}`);
  lines.push("##END=");
  return lines.join("\r\n") + "\r\n";
}
