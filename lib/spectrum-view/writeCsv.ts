import { writeCsvTable } from "@/lib/formats/csv";
import { AXIS_LABELS, type DisplayArrays, type DisplayAxis } from "./axis";

export const CSV_X_HEADERS: Record<DisplayAxis, string> = { nm: "wavelength (nm)", ev: "energy (eV)", "cm-1": "wavenumber (cm-1)" };

export interface CsvOptions {
  /** Lines written before the header as "key,value" metadata (the engine's parser reads these as metadata). */
  metadata?: Record<string, string | number>;
  /** Header name of each series column; series without a name here are written under their key. */
  columnNames?: Record<string, string>;
}

/**
 * Display arrays as CSV (lib/formats/csv.ts): optional metadata lines, one header line (X column
 * first, its unit in brackets so readers can tell the axis), then one row per point. Series that
 * are null are left out.
 */
export function writeCsv<K extends string>(data: DisplayArrays<K>, options: CsvOptions = {}): string {
  if (!AXIS_LABELS[data.axis]) throw new RangeError(`axis must be nm, ev or cm-1`);
  const keys = (Object.keys(data.series) as K[]).filter((k) => data.series[k]);
  return writeCsvTable({
    metadata: options.metadata,
    header: [CSV_X_HEADERS[data.axis], ...keys.map((k) => options.columnNames?.[k] ?? k)],
    columns: [data.x, ...keys.map((k) => data.series[k]!)],
  });
}
