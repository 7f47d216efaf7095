/**
 * Shortest decimal text of `v` rounded to `digits` significant digits ("" → never; non-finite → "").
 * Used for compact display payloads; exports use full precision (String(v)).
 */
export function formatNumber(v: number, digits = 7): string {
  if (!Number.isFinite(v)) return "";
  if (v === 0) return "0";
  return String(Number(v.toPrecision(digits)));
}
