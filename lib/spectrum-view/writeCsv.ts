import { csvCell as cell } from "@/lib/csv/csvCell";
import { AXIS_LABELS, type DisplayArrays, type DisplayAxis } from "./axis";

export const CSV_X_HEADERS: Record<DisplayAxis, string> = { nm: "wavelength (nm)", ev: "energy (eV)", "cm-1": "wavenumber (cm-1)" };

export interface CsvOptions {
  /** Lines written before the header as "key,value" metadata (the engine's parser reads these as metadata). */
  metadata?: Record<string, string | number>;
  /** Header name of each series column; series without a name here are written under their key. */
  columnNames?: Record<string, string>;
}

/**
 * Writes display arrays as comma-separated text (RFC 4180 quoting): optional metadata lines, one
 * header line (X column first, its unit in brackets so readers can tell the axis), then one row per
 * point. Numbers at full double precision (shortest round-trip text); series that are null are left
 * out. Lines end with CRLF as RFC 4180 says.
 */
export function writeCsv<K extends string>(data: DisplayArrays<K>, options: CsvOptions = {}): string {
  if (!AXIS_LABELS[data.axis]) throw new RangeError(`axis must be nm, ev or cm-1`);
  const keys = (Object.keys(data.series) as K[]).filter((k) => data.series[k]);
  const n = data.x.length;
  for (const k of keys) if (data.series[k]!.length !== n) throw new RangeError(`series ${k} has ${data.series[k]!.length} values for ${n} points`);
  const lines: string[] = [];
  for (const [k, v] of Object.entries(options.metadata ?? {})) lines.push(`${cell(k)},${cell(v)}`);
  lines.push([CSV_X_HEADERS[data.axis], ...keys.map((k) => options.columnNames?.[k] ?? k)].map(cell).join(","));
  for (let i = 0; i < n; i++) {
    let row = String(data.x[i]);
    for (const k of keys) {
      const v = data.series[k]![i]!;
      row += `,${Number.isFinite(v) ? String(v) : ""}`;
    }
    lines.push(row);
  }
  return `${lines.join("\r\n")}\r\n`;
}
