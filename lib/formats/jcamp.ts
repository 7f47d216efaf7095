import type { XUnit, YUnit } from "@/lib/engine";

/**
 * The one JCAMP-DX writer (viewer downloads and export bundles): JCAMP-DX 4.24 (McDonald & Wilks,
 * Appl. Spectrosc. 1988, 42, 151), AFFN (plain decimal) values.
 *
 * - Equally spaced X (to 1e-9 of the step, either direction) goes in `##XYDATA=(X++(Y..Y))`: each
 *   line starts with the X of its first Y, then as many Y as fit in 80 characters.
 * - Other X goes in `##PEAK TABLE=(XY..XY)`, one X,Y pair a line (common readers do not read
 *   `##XYPOINTS`).
 * - Y values are integers times `##YFACTOR` = max |y| / 2³⁰ (12 significant digits), so |Y| fits
 *   every reader's 32-bit integers and keeps about 1e-9 of full scale.
 * - Numbers are written without an exponent: AFFN readers take `E` for a compressed digit.
 *
 * Escaping rule (one for every value: title, origin, owner, labels, comments): line breaks become
 * spaces, and any run of `#` becomes a single `#`, so no value can begin a labelled record
 * (`##…=`). Values longer than 200 characters are cut. An empty title is written as "untitled".
 */
export interface JcampInput {
  title: string;
  /** e.g. "UV/VIS SPECTRUM", "INFRARED SPECTRUM" (the technique registry's jcampDataType). */
  dataType: string;
  /** e.g. "NANOMETERS", "1/CM", "EV". */
  xUnits: string;
  /** e.g. "ABSORBANCE", "TRANSMITTANCE", "ARBITRARY UNITS". */
  yUnits: string;
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  origin?: string;
  owner?: string;
  /** Extra user-defined labels (names without the leading "$"), written as `##$NAME=value`. */
  labels?: Record<string, string | number>;
  /** Extra lines, written after the labels as `$$ text` comments. */
  comments?: string[];
}

const MAX_LINE = 80;
const Y_SCALE = 2 ** 30;

/** The escaping rule above: one line, no `##`, at most 200 characters. */
export function jcampValue(text: string): string {
  return text
    .replace(/[\r\n]+/g, " ")
    .replace(/#{2,}/g, "#")
    .trim()
    .slice(0, 200);
}

/** A decimal without exponent, the shortest that reads back as the same double where String() has none. */
export function affn(v: number): string {
  const t = String(v);
  if (!/e/i.test(t)) return t;
  return v.toFixed(Math.min(100, Math.max(0, 16 - Math.floor(Math.log10(Math.abs(v) || 1))))).replace(/\.?0+$/, "");
}

/** True when x has a constant non-zero step (to 1e-9 of the step), ascending or descending. */
export function isEquallySpaced(x: ArrayLike<number>): boolean {
  const n = x.length;
  const step = (x[n - 1]! - x[0]!) / (n - 1);
  if (!Number.isFinite(step) || step === 0) return false;
  for (let i = 1; i < n; i++) if (Math.abs(x[i]! - (x[0]! + i * step)) > 1e-9 * Math.abs(step) + 1e-12 * Math.abs(x[i]!)) return false;
  return true;
}

const X_UNITS: Record<XUnit, string> = { nm: "NANOMETERS", um: "MICROMETERS", "cm-1": "1/CM", eV: "EV" };

/**
 * JCAMP-DX units for a parsed spectrum's units. Percent transmittance is written as the standard's
 * TRANSMITTANCE fraction, so its values are multiplied by `yScale` (0.01).
 */
export function jcampUnits(xUnit: XUnit, yUnit: YUnit): { xUnits: string; yUnits: string; yScale: number } {
  if (yUnit === "percent-transmittance") return { xUnits: X_UNITS[xUnit], yUnits: "TRANSMITTANCE", yScale: 0.01 };
  return { xUnits: X_UNITS[xUnit], yUnits: yUnit === "absorbance" ? "ABSORBANCE" : "ARBITRARY UNITS", yScale: 1 };
}

/** Writes one spectrum. Throws RangeError for unequal lengths, fewer than 2 points or non-finite values. */
export function writeJcamp(input: JcampInput): string {
  const { x, y } = input;
  const n = x.length;
  if (y.length !== n) throw new RangeError(`x and y must have the same length (${n} and ${y.length})`);
  if (n < 2) throw new RangeError("at least 2 points are needed");
  let maxAbs = 0;
  let minY = Infinity;
  let maxY = -Infinity;
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(x[i]!)) throw new RangeError(`x[${i}] is not a finite number`);
    const v = y[i]!;
    if (!Number.isFinite(v)) throw new RangeError(`y[${i}] is not a finite number`);
    maxAbs = Math.max(maxAbs, Math.abs(v));
    minY = Math.min(minY, v);
    maxY = Math.max(maxY, v);
  }
  const yFactor = maxAbs > 0 ? Number((maxAbs / Y_SCALE).toPrecision(12)) : 1;
  const ints = new Array<number>(n);
  for (let i = 0; i < n; i++) ints[i] = Math.round(y[i]! / yFactor);
  const regular = isEquallySpaced(x);
  const first = x[0]!;
  const dx = (x[n - 1]! - first) / (n - 1);

  const lines = [
    `##TITLE=${jcampValue(input.title) || "untitled"}`,
    "##JCAMP-DX=4.24",
    `##DATA TYPE=${jcampValue(input.dataType)}`,
    `##DATA CLASS=${regular ? "XYDATA" : "PEAK TABLE"}`,
    `##ORIGIN=${jcampValue(input.origin ?? "Bandkeep")}`,
    `##OWNER=${jcampValue(input.owner ?? "")}`,
  ];
  for (const [k, v] of Object.entries(input.labels ?? {}))
    lines.push(`##$${k.toUpperCase().replace(/[^A-Z0-9 ]/g, "")}=${jcampValue(String(v))}`);
  for (const c of input.comments ?? []) lines.push(`$$ ${jcampValue(c)}`);
  lines.push(
    `##XUNITS=${jcampValue(input.xUnits)}`,
    `##YUNITS=${jcampValue(input.yUnits)}`,
    "##XFACTOR=1",
    `##YFACTOR=${affn(yFactor)}`,
    `##FIRSTX=${affn(first)}`,
    `##LASTX=${affn(x[n - 1]!)}`,
    ...(regular ? [`##DELTAX=${affn(dx)}`] : []),
    `##MINY=${affn(minY)}`,
    `##MAXY=${affn(maxY)}`,
    `##NPOINTS=${n}`,
    `##FIRSTY=${affn(ints[0]! * yFactor)}`,
  );
  if (regular) {
    lines.push("##XYDATA=(X++(Y..Y))");
    let i = 0;
    while (i < n) {
      let line = affn(first + i * dx);
      let count = 0;
      while (i < n) {
        const piece = ` ${ints[i]}`;
        if (count > 0 && line.length + piece.length > MAX_LINE) break;
        line += piece;
        i++;
        count++;
      }
      lines.push(line);
    }
  } else {
    lines.push("##PEAK TABLE=(XY..XY)");
    for (let i = 0; i < n; i++) lines.push(`${affn(x[i]!)},${ints[i]}`);
  }
  lines.push("##END=");
  return `${lines.join("\r\n")}\r\n`;
}
