// How the units a file's columns were read in are written on screen. The engine stores short
// codes ("cm-1", "percent-transmittance"); people read these labels.

import type { XUnit, YUnit } from "@/lib/engine/types";

export const X_UNIT_LABELS: Readonly<Record<XUnit, string>> = {
  nm: "wavelength, nm",
  um: "wavelength, µm",
  "cm-1": "wavenumber, cm⁻¹",
  eV: "photon energy, eV",
};

export const Y_UNIT_LABELS: Readonly<Record<YUnit, string>> = {
  absorbance: "absorbance",
  "percent-transmittance": "transmittance, %",
  counts: "counts",
};

const isXUnit = (u: string): u is XUnit => Object.hasOwn(X_UNIT_LABELS, u);
const isYUnit = (u: string): u is YUnit => Object.hasOwn(Y_UNIT_LABELS, u);

/** The label of a stored axis unit; text that is no known code is shown as it was stored. */
export const xUnitLabel = (u: string): string => (isXUnit(u) ? X_UNIT_LABELS[u] : u);
/** The label of a stored value unit; text that is no known code is shown as it was stored. */
export const yUnitLabel = (u: string): string => (isYUnit(u) ? Y_UNIT_LABELS[u] : u);
