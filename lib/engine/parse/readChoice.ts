import type { ParseOptions, XUnit, YUnit } from '../types';

/** Words people use for the kind of Y values (CLI, form, API); each maps onto the engine's YUnit. */
export type YKind = 'absorbance' | 'transmittance-percent' | 'intensity';

export const Y_KINDS = {
  absorbance: { yUnit: 'absorbance', label: 'Absorbance' },
  'transmittance-percent': { yUnit: 'percent-transmittance', label: 'Transmittance (%)' },
  intensity: { yUnit: 'counts', label: 'Intensity (counts)' },
} as const satisfies Record<YKind, { yUnit: YUnit; label: string }>;
export const Y_KIND_NAMES = Object.keys(Y_KINDS) as YKind[];

export const X_UNITS = {
  nm: { label: 'nm (wavelength)' },
  um: { label: 'µm (wavelength)' },
  'cm-1': { label: 'cm⁻¹ (wavenumber)' },
  eV: { label: 'eV (photon energy)' },
} as const satisfies Record<XUnit, { label: string }>;
export const X_UNIT_NAMES = Object.keys(X_UNITS) as XUnit[];

/** The Y kind word for an engine YUnit. */
export function yKindOf(unit: YUnit): YKind {
  return Y_KIND_NAMES.find((k) => Y_KINDS[k].yUnit === unit)!;
}

/** How to read one spectrum out of a file: everything a person may choose besides the technique. */
export interface ReadChoice {
  column?: string | number;
  block?: number;
  pair?: number;
  sheet?: string | number;
  xUnit?: XUnit;
  yKind?: YKind;
}

/** Parse options for a read choice (undefined members left out). */
export function readChoiceOptions(choice: ReadChoice): ParseOptions {
  const o: ParseOptions = {};
  if (choice.column !== undefined) o.column = choice.column;
  if (choice.block !== undefined) o.block = choice.block;
  if (choice.pair !== undefined) o.pair = choice.pair;
  if (choice.sheet !== undefined) o.sheet = choice.sheet;
  if (choice.xUnit !== undefined) o.xUnit = choice.xUnit;
  if (choice.yKind !== undefined) o.yUnit = Y_KINDS[choice.yKind].yUnit;
  return o;
}
