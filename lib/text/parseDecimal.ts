// A number as people write one in a form: optional sign, digits with one decimal point (or
// comma), optional exponent. Number() alone also reads "0x10" as 16, "0b11" as 3, "" as 0
// and "Infinity"; those are not measurements, so they come back as NaN here.
const DECIMAL = /^[+-]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][+-]?\d+)?$/;

export function parseDecimal(text: string): number {
  const t = text.trim();
  return DECIMAL.test(t) ? Number(t.replace(",", ".")) : Number.NaN;
}
