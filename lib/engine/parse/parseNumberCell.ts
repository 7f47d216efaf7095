const NUMBER_POINT = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const NUMBER_COMMA = /^[+-]?(?:\d+,?\d*|,\d+)(?:[eE][+-]?\d+)?$/;
const NON_FINITE = /^[+-]?(?:nan|inf|infinity|∞)$/i;

/**
 * Parses one text cell as a number.
 * Returns the number, `undefined` for an empty cell, `NaN` for text that is not a number, and
 * ±Infinity / NaN-marked via `nonFinite` for cells such as "NaN" or "Inf".
 */
export function parseNumberCell(cell: string, decimalComma: boolean): number | undefined {
  const s = cell.trim();
  if (s.length === 0) return undefined;
  if (decimalComma) {
    if (NUMBER_COMMA.test(s)) return Number(s.replace(',', '.'));
  } else if (NUMBER_POINT.test(s)) {
    return Number(s);
  }
  return Number.NaN;
}

/** True when a cell spells a non-finite value (NaN, Inf, Infinity). */
export function isNonFiniteWord(cell: string): boolean {
  return NON_FINITE.test(cell.trim());
}
