/** The size of a flagged change in its own unit, for tables. */
export function magnitudeText(i: { fraction: number | null; shiftMeV: number | null; energyEv: number | null; kind?: string }): string {
  if (i.kind === "shift" && i.shiftMeV !== null) return `${i.shiftMeV.toFixed(1)} meV`;
  if (i.kind === "broadening" && i.fraction !== null) return `+${(i.fraction * 100).toFixed(1)} % FWHM`;
  if (i.fraction !== null) return `${(i.fraction * 100).toFixed(1)} %`;
  if (i.shiftMeV !== null) return `${i.shiftMeV.toFixed(1)} meV`;
  return "—";
}

export { formatWhen as dateText } from "@/lib/format/dates";
