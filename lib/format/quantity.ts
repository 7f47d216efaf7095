// One formatter for a flagged quantity: the sign is written once, with a real minus sign
// (U+2212), so a narrowing reads "−17.8 meV", never "+-17.8 meV".

import { FLAG_KIND_SPECS, FLAG_UNITS, isFlagKind, type FlagUnit } from "@/lib/registry/flagKinds";

export const MINUS = "\u2212";

export type QuantityOptions = {
  /** Write "+" before a positive value. */
  signed?: boolean;
  /** Standard uncertainty in the same unit, written "± u". */
  uncertainty?: number | null;
  /** Word after the unit ("FWHM"). */
  suffix?: string;
};

/** Digits after the point per unit: % to 0.1, meV to 0.1, a ratio to 0.01. Signals use 3 significant digits. */
function digitsText(abs: number, unit: FlagUnit): string {
  switch (unit) {
    case "fraction":
      return (abs * 100).toFixed(1);
    case "meV":
      return abs.toFixed(1);
    case "ratio":
      return abs.toFixed(2);
    case "signal":
      return abs.toPrecision(3);
  }
}

const UNIT_TEXT: Record<FlagUnit, string> = { fraction: " %", meV: " meV", ratio: "", signal: "" };

/** A signed number in a unit: "−17.8 meV", "+3.2 meV", "12.0 %", "0.70 ± 0.01". */
export function formatQuantity(value: number, unit: FlagUnit, o: QuantityOptions = {}): string {
  if (!Number.isFinite(value)) return "—";
  const body = digitsText(Math.abs(value), unit);
  const isZero = Number(body) === 0;
  const sign = isZero ? "" : value < 0 ? MINUS : o.signed ? "+" : "";
  const u = o.uncertainty;
  const plusMinus = u !== null && u !== undefined && Number.isFinite(u) && u > 0 ? ` ± ${digitsText(u, unit)}` : "";
  // "12.0 ± 0.5 %" keeps the unit after the uncertainty; a suffix ends the text.
  return `${sign}${body}${plusMinus}${UNIT_TEXT[unit]}${o.suffix ? ` ${o.suffix}` : ""}`;
}

export type FlagMagnitude = {
  kind: string;
  magnitude: number | null;
  unit: string | null;
  uncertainty?: number | null;
};

const isFlagUnit = (u: string | null): u is FlagUnit => u !== null && (FLAG_UNITS as readonly string[]).includes(u);

/** A flag's magnitude as people read it, with the kind's sign rule and suffix ("—" when unknown). */
export function formatFlagMagnitude(f: FlagMagnitude, o: { withUncertainty?: boolean } = {}): string {
  if (f.magnitude === null || !Number.isFinite(f.magnitude)) return "—";
  const spec = isFlagKind(f.kind) ? FLAG_KIND_SPECS[f.kind] : undefined;
  const unit = isFlagUnit(f.unit) ? f.unit : spec?.unit ?? "signal";
  const suffix = spec && "suffix" in spec ? spec.suffix : undefined;
  return formatQuantity(f.magnitude, unit, {
    signed: spec?.signed ?? false,
    uncertainty: o.withUncertainty ? f.uncertainty : null,
    suffix,
  });
}
