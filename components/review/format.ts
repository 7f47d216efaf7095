import { formatFlagMagnitude, type FlagMagnitude } from "@/lib/format/quantity";

/** The size of a flagged change in its own unit, for tables ("−17.8 meV FWHM", "12.0 %"). */
export function magnitudeText(i: FlagMagnitude): string {
  return formatFlagMagnitude(i);
}

export { formatWhen as dateText } from "@/lib/format/dates";
