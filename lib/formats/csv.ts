/**
 * The one CSV writer of every export (spectrum downloads, series tables, the audit trail, export
 * bundles). RFC 4180: cells quoted where needed, lines ended with CRLF, a line end after the last line.
 */

export type CsvValue = string | number | null | undefined;

/**
 * One cell. RFC 4180 quoting: a cell holding a comma, quote or line break is quoted, quotes doubled.
 * Formula guard (OWASP, "CSV Injection"): text that starts with = + - @, a tab or a carriage
 * return is run as a formula by spreadsheet programs, so it gets a leading apostrophe.
 * Numbers are written as numbers (a negative number is not a formula), at full double precision
 * (shortest round-trip text); a non-finite number or null is an empty cell.
 */
export function csvCell(value: CsvValue): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  const guarded = /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(guarded) ? `"${guarded.replace(/"/g, '""')}"` : guarded;
}

/** One CSV line of cells (without its line end). */
export const csvLine = (cells: readonly CsvValue[]): string => cells.map(csvCell).join(",");

/** Lines joined into a document: CRLF between lines and after the last. */
export const csvDocument = (lines: readonly string[]): string => `${lines.join("\r\n")}\r\n`;

export interface CsvTable {
  /** Lines written before the header as "key,value" (the engine's parser reads these as metadata). */
  metadata?: Record<string, string | number>;
  header: readonly string[];
  /** One array per header column, all of one length; one line per index. */
  columns: readonly ArrayLike<number>[];
}

/** A numeric table: optional metadata lines, the header line, then one line per point. */
export function writeCsvTable(table: CsvTable): string {
  const { header, columns } = table;
  if (columns.length !== header.length) throw new RangeError(`${header.length} header names for ${columns.length} columns`);
  const n = columns[0]?.length ?? 0;
  columns.forEach((c, k) => {
    if (c.length !== n) throw new RangeError(`column ${header[k]} has ${c.length} values for ${n} points`);
  });
  const lines: string[] = [];
  for (const [k, v] of Object.entries(table.metadata ?? {})) lines.push(csvLine([k, v]));
  lines.push(csvLine(header));
  for (let i = 0; i < n; i++) lines.push(columns.map((c) => csvCell(c[i]!)).join(","));
  return csvDocument(lines);
}
