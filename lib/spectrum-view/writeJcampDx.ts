/**
 * JCAMP-DX 4.24 writer (McDonald & Wilks, Appl. Spectrosc. 1988, 42, 151), one spectrum in the
 * `##XYDATA=(X++(Y..Y))` table form with AFFN (plain decimal) values: each line starts with the X of
 * its first Y (in units of XFACTOR), then integer Y values that, multiplied by YFACTOR, give the
 * data. X must be equally spaced (the form states only FIRSTX, LASTX and NPOINTS).
 */

export interface JcampInput {
  title: string;
  /** e.g. "UV/VIS SPECTRUM", "INFRARED SPECTRUM". */
  dataType: string;
  /** e.g. "NANOMETERS", "1/CM", "EV". */
  xUnits: string;
  /** e.g. "ABSORBANCE", "COUNTS". */
  yUnits: string;
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  origin?: string;
  owner?: string;
  /** Extra lines, written after the required header as `$$ text` comments. */
  comments?: string[];
  /** Extra user-defined labels (names without the leading "$"), written as `##$NAME=value`. */
  labels?: Record<string, string | number>;
}

/** Significant digits kept by the integer Y values: |Y| ≤ 10⁹ fits every reader's 32-bit integers. */
const Y_SCALE = 1e9;
const MAX_LINE = 80;

const oneLine = (s: string) => s.replace(/[\r\n]+/g, " ").replace(/##/g, "# #").trim();

/** Shortest text of v that reads back as the same double. */
const num = (v: number) => String(v);

export function writeJcampDx(input: JcampInput): string {
  const { x, y } = input;
  const n = x.length;
  if (n < 2) throw new RangeError("x must have at least 2 points");
  if (y.length !== n) throw new RangeError(`y has ${y.length} values for ${n} x values`);
  const first = x[0]!;
  const last = x[n - 1]!;
  const dx = (last - first) / (n - 1);
  if (!Number.isFinite(dx) || dx === 0) throw new RangeError("x must be finite and not constant");
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(x[i]!)) throw new RangeError(`x[${i}] is not a finite number`);
    if (Math.abs(x[i]! - (first + i * dx)) > 1e-7 * Math.abs(dx) + 1e-12 * Math.abs(x[i]!)) {
      throw new RangeError(`x must be equally spaced for (X++(Y..Y)); x[${i}] = ${x[i]} is off the grid`);
    }
  }
  let maxAbs = 0;
  let minY = Infinity;
  let maxY = -Infinity;
  for (let i = 0; i < n; i++) {
    const v = y[i]!;
    if (!Number.isFinite(v)) throw new RangeError(`y[${i}] is not a finite number`);
    maxAbs = Math.max(maxAbs, Math.abs(v));
    minY = Math.min(minY, v);
    maxY = Math.max(maxY, v);
  }
  const yFactor = maxAbs > 0 ? Number((maxAbs / Y_SCALE).toPrecision(12)) : 1;
  const ints = new Array<number>(n);
  for (let i = 0; i < n; i++) ints[i] = Math.round(y[i]! / yFactor);

  const lines = [
    `##TITLE=${oneLine(input.title) || "spectrum"}`,
    "##JCAMP-DX=4.24",
    `##DATA TYPE=${oneLine(input.dataType)}`,
    `##ORIGIN=${oneLine(input.origin ?? "Bandkeep")}`,
    `##OWNER=${oneLine(input.owner ?? "")}`,
  ];
  for (const [k, v] of Object.entries(input.labels ?? {})) lines.push(`##$${oneLine(k).toUpperCase()}=${oneLine(String(v))}`);
  for (const c of input.comments ?? []) lines.push(`$$ ${oneLine(c)}`);
  lines.push(
    `##XUNITS=${oneLine(input.xUnits)}`,
    `##YUNITS=${oneLine(input.yUnits)}`,
    "##XFACTOR=1",
    `##YFACTOR=${num(yFactor)}`,
    `##FIRSTX=${num(first)}`,
    `##LASTX=${num(last)}`,
    `##DELTAX=${num(dx)}`,
    `##MINY=${num(minY)}`,
    `##MAXY=${num(maxY)}`,
    `##NPOINTS=${n}`,
    `##FIRSTY=${num(ints[0]! * yFactor)}`,
    "##XYDATA=(X++(Y..Y))",
  );
  let i = 0;
  while (i < n) {
    let line = num(first + i * dx);
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
  lines.push("##END=");
  return `${lines.join("\r\n")}\r\n`;
}

/**
 * Linear interpolation of (x, y) (x strictly ascending) onto n equally spaced points from x[0] to
 * x[n-1], for the wavelength axis, whose points are not equally spaced when the grid is uniform in
 * energy. Inputs are not modified.
 */
export function resampleLinear(x: ArrayLike<number>, y: ArrayLike<number>, n = x.length): { x: Float64Array; y: Float64Array } {
  if (x.length !== y.length || x.length < 2) throw new RangeError("x and y must have the same length, at least 2");
  if (!Number.isInteger(n) || n < 2) throw new RangeError("n must be an integer of at least 2");
  const from = x[0]!;
  const to = x[x.length - 1]!;
  const ox = new Float64Array(n);
  const oy = new Float64Array(n);
  let j = 0;
  for (let i = 0; i < n; i++) {
    const xi = i === n - 1 ? to : from + ((to - from) * i) / (n - 1);
    while (j < x.length - 2 && x[j + 1]! < xi) j++;
    const t = (xi - x[j]!) / (x[j + 1]! - x[j]!);
    ox[i] = xi;
    oy[i] = y[j]! + t * (y[j + 1]! - y[j]!);
  }
  return { x: ox, y: oy };
}
