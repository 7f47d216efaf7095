/**
 * The one CSV cell writer of every export (spectrum, series, audit trail).
 *
 * RFC 4180 quoting: a cell holding a comma, quote or line break is quoted, quotes doubled.
 * Formula guard (OWASP, "CSV Injection"): text that starts with = + - @, a tab or a carriage
 * return is run as a formula by spreadsheet programs, so it gets a leading apostrophe.
 * Numbers are written as numbers (a negative number is not a formula); a non-finite number
 * or null is an empty cell.
 */
export function csvCell(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  const guarded = /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(guarded) ? `"${guarded.replace(/"/g, '""')}"` : guarded;
}

/** One CSV line of cells (without its line end). */
export const csvLine = (cells: readonly (string | number | null | undefined)[]): string => cells.map(csvCell).join(",");
