/** A series value written in a column header, with its unit as written (normalised spelling). */
export interface HeaderSeriesValue {
  value: number;
  unit: string;
}

// Units a titration, dilution, time or temperature series is written in (common practice).
const UNITS: Array<[RegExp, string]> = [
  [/^(?:eq|equiv|equivalents?)\.?$/i, 'eq'],
  [/^[µμu]M$/, 'µM'],
  [/^nM$/, 'nM'],
  [/^pM$/, 'pM'],
  [/^mM$/, 'mM'],
  [/^M$/, 'M'],
  [/^[µμu]L$/i, 'µL'],
  [/^mL$/i, 'mL'],
  [/^(?:s|sec|secs|seconds?)$/i, 's'],
  [/^(?:min|mins|minutes?)$/i, 'min'],
  [/^(?:h|hr|hrs|hours?)$/i, 'h'],
  [/^°\s?C$|^degC$/i, '°C'],
  [/^K$/, 'K'],
];

/** A unit as a series or a header writes it, in the spelling readSeriesValue gives ("equiv" → "eq", "uM" → "µM"); unknown units are only trimmed. */
export function normaliseSeriesUnit(unit: string): string {
  const text = unit.trim();
  return UNITS.find(([r]) => r.test(text))?.[1] ?? text;
}

/**
 * Reads a series value from a column header such as "0.5 eq", "10 µM", "t = 30 s" or
 * "240 s reaction": the first number followed by a known unit. Undefined when there is none.
 */
export function readSeriesValue(header: string): HeaderSeriesValue | undefined {
  const re = /(?:^|[^\w.])([+-]?(?:\d+(?:[.,]\d+)?|[.,]\d+)(?:[eE][+-]?\d+)?)\s*(°\s?C|[A-Za-zµμ]+\.?)/g;
  for (let m = re.exec(header); m; m = re.exec(header)) {
    const unitText = m[2]!;
    const unit = UNITS.find(([r]) => r.test(unitText))?.[1];
    if (!unit) continue;
    const value = Number(m[1]!.replace(',', '.'));
    if (Number.isFinite(value)) return { value, unit };
  }
  return undefined;
}
