// One formatter for quantities on screen: the number, its unit as people write it, the sign written
// once with a real minus sign (U+2212), so a narrowing reads "−17.8 meV", never "+-17.8 meV" or
// "-0.0 meV", and a precision chosen per unit. Counts get their plural from countOf.

import { FLAG_KIND_SPECS, FLAG_UNITS, isFlagKind, type FlagUnit } from "@/lib/registry/flagKinds";

export const MINUS = "\u2212";

/** Units a quantity is shown in: the flag units and the spectral axes. */
export type DisplayUnit = FlagUnit | "eV" | "nm" | "cm-1";

export type QuantityOptions = {
  /** Write "+" before a positive value. */
  signed?: boolean;
  /** Standard uncertainty in the same unit, written "± u". */
  uncertainty?: number | null;
  /** Word after the unit ("FWHM"). */
  suffix?: string;
};

/** How each unit is written after a number (BIPM SI Brochure §5.4.3: a space, also before "%"). */
export const UNIT_TEXT: Readonly<Record<DisplayUnit, string>> = {
  fraction: "%",
  meV: "meV",
  ratio: "",
  signal: "",
  eV: "eV",
  nm: "nm",
  "cm-1": "cm⁻¹",
};

/**
 * Digits per unit (common practice for spectra of dots): eV to 1 meV, nm and meV to 0.1, cm⁻¹ to
 * 1 cm⁻¹, a percentage to 0.1 %, a ratio to 0.01; signals (arbitrary units) to 3 significant digits.
 */
function digitsText(abs: number, unit: DisplayUnit): string {
  switch (unit) {
    case "fraction":
      return (abs * 100).toFixed(1);
    case "meV":
    case "nm":
      return abs.toFixed(1);
    case "eV":
      return abs.toFixed(3);
    case "cm-1":
      return abs.toFixed(0);
    case "ratio":
      return abs.toFixed(2);
    case "signal":
      return abs.toPrecision(3);
  }
}

const withUnit = (text: string, unit: DisplayUnit) => (UNIT_TEXT[unit] ? `${text} ${UNIT_TEXT[unit]}` : text);

/** A number with its sign: a real minus, "+" only when asked, no sign on a value that rounds to zero. */
function signedText(value: number, body: string, signed: boolean | undefined): string {
  const isZero = Number(body) === 0;
  return `${isZero ? "" : value < 0 ? MINUS : signed ? "+" : ""}${body}`;
}

/** A signed number in a unit: "−17.8 meV", "+3.2 meV", "12.0 %", "0.70 ± 0.01", "2.145 eV", "1650 cm⁻¹". */
export function formatQuantity(value: number, unit: DisplayUnit, o: QuantityOptions = {}): string {
  if (!Number.isFinite(value)) return "—";
  const u = o.uncertainty;
  const hasU = u !== null && u !== undefined && Number.isFinite(u) && u > 0;
  // A signal has no natural step: with an uncertainty, both are rounded at its second significant digit (GUM §7.2.6).
  const signalDigits = unit === "signal" && hasU ? Math.min(8, Math.max(0, 1 - Math.floor(Math.log10(u)))) : null;
  const text = (v: number) => (signalDigits === null ? digitsText(v, unit) : v.toFixed(signalDigits));
  const number = signedText(value, text(Math.abs(value)), o.signed);
  const plusMinus = hasU ? ` ± ${text(u)}` : "";
  // "12.0 ± 0.5 %" keeps the unit after the uncertainty; a suffix ends the text.
  return `${withUnit(`${number}${plusMinus}`, unit)}${o.suffix ? ` ${o.suffix}` : ""}`;
}

/**
 * A standard uncertainty on its own, always with its unit: "0.072 eV", "1.2 %", "0.35 meV",
 * "0.0012 absorbance" (a signal names its quantity: `signalWord`), "0.010 (ratio)".
 */
export function formatUncertainty(u: number | null | undefined, unit: DisplayUnit, signalWord = "signal units"): string {
  if (u === null || u === undefined || !Number.isFinite(u) || u < 0) return "—";
  // Two significant digits for an uncertainty (JCGM 100:2008 GUM §7.2.6); signals stay unitless.
  const scaled = unit === "fraction" ? u * 100 : u;
  const digits = scaled > 0 ? Math.max(0, 1 - Math.floor(Math.log10(scaled))) : 1;
  const text = scaled.toFixed(Math.min(digits, 8));
  if (unit === "signal") return `${text} ${signalWord}`;
  if (unit === "ratio") return `${text} (ratio)`;
  return withUnit(text, unit);
}

/**
 * A value with its standard uncertainty, both rounded at the uncertainty's second significant
 * digit (JCGM 100:2008 GUM §7.2.6): "0.0800 ± 0.0012 µM⁻¹". `unitText` is written as given.
 */
export function formatWithUncertainty(value: number, se: number, unitText = ""): string {
  if (!Number.isFinite(value)) return "—";
  const tail = unitText ? ` ${unitText}` : "";
  if (!(se > 0) || !Number.isFinite(se)) return `${signedText(value, Math.abs(value).toPrecision(4), false)}${tail}`;
  const digits = Math.min(8, Math.max(0, 1 - Math.floor(Math.log10(se))));
  return `${signedText(value, Math.abs(value).toFixed(digits), false)} ± ${se.toFixed(digits)}${tail}`;
}

/** Words whose plural is the same as the singular (common English usage). */
const SAME_PLURAL = new Set(["series", "spectrum series"]);
/** Irregular plurals of the trade's words. */
const IRREGULAR: Readonly<Record<string, string>> = { spectrum: "spectra", analysis: "analyses", datum: "data" };

/** The plural of a noun we count on screen. */
export function pluralOf(word: string): string {
  if (SAME_PLURAL.has(word)) return word;
  if (Object.hasOwn(IRREGULAR, word)) return IRREGULAR[word]!;
  if (/(s|x|ch|sh)$/.test(word)) return `${word}es`;
  if (/[^aeiou]y$/.test(word)) return `${word.slice(0, -1)}ies`;
  return `${word}s`;
}

/** "1 peak", "2 peaks", "1 spectrum", "0 series": the count and its noun in the right number. */
export function countOf(n: number, singular: string, plural: string = pluralOf(singular)): string {
  return `${n.toLocaleString("en-GB")} ${n === 1 ? singular : plural}`;
}

/**
 * "per equivalent", "per µM": a rate's denominator is one unit, so a unit typed as a plural word
 * ("equivalents") is read in the singular. Symbols (µM, mM, eq) are left as they are.
 */
export function perUnit(unit: string): string {
  const u = unit.trim();
  if (!u) return "per unit";
  const singular = /^[a-z]{4,}s$/i.test(u) && !/ss$/i.test(u) ? u.slice(0, -1) : u;
  return `per ${singular}`;
}

/** A reciprocal unit: "µM⁻¹" for a symbol, "per equivalent" for a word. */
export function reciprocalUnit(unit: string): string {
  const u = unit.trim();
  if (!u) return "";
  return /^[a-z]{4,}$/i.test(u) ? perUnit(u) : `${u}⁻¹`;
}

export type FlagMagnitude = {
  kind: string;
  magnitude: number | null;
  unit: string | null;
  uncertainty?: number | null;
};

const isFlagUnit = (u: string | null): u is FlagUnit => u !== null && (FLAG_UNITS as readonly string[]).includes(u);

/** The unit a flag's magnitude is in: the stored one, else the kind's usual one. */
export function flagUnitOf(f: Pick<FlagMagnitude, "kind" | "unit">): FlagUnit {
  const spec = isFlagKind(f.kind) ? FLAG_KIND_SPECS[f.kind] : undefined;
  return isFlagUnit(f.unit) ? f.unit : (spec?.unit ?? "signal");
}

/** A flag's magnitude as people read it, with the kind's sign rule and suffix ("—" when unknown). */
export function formatFlagMagnitude(f: FlagMagnitude, o: { withUncertainty?: boolean } = {}): string {
  if (f.magnitude === null || !Number.isFinite(f.magnitude)) return "—";
  const spec = isFlagKind(f.kind) ? FLAG_KIND_SPECS[f.kind] : undefined;
  const suffix = spec && "suffix" in spec ? spec.suffix : undefined;
  return formatQuantity(f.magnitude, flagUnitOf(f), {
    signed: spec?.signed ?? false,
    uncertainty: o.withUncertainty ? f.uncertainty : null,
    suffix,
  });
}

/** A flag's standard uncertainty with the flag's unit ("standard uncertainty 7.2 %"). */
export function formatFlagUncertainty(f: FlagMagnitude, signalWord?: string): string {
  return formatUncertainty(f.uncertainty, flagUnitOf(f), signalWord);
}
