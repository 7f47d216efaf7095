/**
 * Display axes of the spectrum viewer, and the conversion of arrays computed on the engine's
 * uniform energy grid (ascending eV) to the axis a person picks.
 *
 * λ[nm] = hc / E[eV] and ν̃[cm⁻¹] = E[eV] · (cm⁻¹ per eV), CODATA 2018 (lib/engine/constants.ts).
 * Emission spectra carry a density per unit of the axis, so their values change with the axis
 * (Jacobian, Mooney & Kambhampati, J. Phys. Chem. Lett. 2013, 4, 3316):
 *   I(E) = I(λ)·λ²/hc   ⇔   I(λ) = I(E)·E²/hc,      I(ν̃) = I(E)/(cm⁻¹ per eV) = I(λ)·λ²/10⁷ (λ in nm).
 * Absorbance is a value at a point, not a density: only the axis changes. Integrated emission is
 * the same on every axis.
 */
import { CM1_PER_EV, HC_EV_NM } from "@/lib/engine/constants";
import { formatQuantity, type DisplayUnit } from "@/lib/format/quantity";

export const DISPLAY_AXES = ["nm", "ev", "cm-1"] as const;
export type DisplayAxis = (typeof DISPLAY_AXES)[number];

export const AXIS_LABELS: Record<DisplayAxis, { short: string; title: string; unit: string }> = {
  nm: { short: "nm", title: "Wavelength (nm)", unit: "nm" },
  ev: { short: "eV", title: "Energy (eV)", unit: "eV" },
  "cm-1": { short: "cm⁻¹", title: "Wavenumber (cm⁻¹)", unit: "cm⁻¹" },
};

export function isDisplayAxis(v: unknown): v is DisplayAxis {
  return typeof v === "string" && (DISPLAY_AXES as readonly string[]).includes(v);
}

/** Position of one energy (eV) on a display axis. Throws RangeError for a non-positive energy. */
export function energyToAxis(energyEv: number, axis: DisplayAxis): number {
  if (!(energyEv > 0) || !Number.isFinite(energyEv)) throw new RangeError(`energyEv must be a positive finite number, got ${energyEv}`);
  if (axis === "ev") return energyEv;
  if (axis === "nm") return HC_EV_NM / energyEv;
  return energyEv * CM1_PER_EV;
}

/** Energy (eV) of a position on a display axis (inverse of energyToAxis). */
export function axisToEnergy(value: number, axis: DisplayAxis): number {
  if (!(value > 0) || !Number.isFinite(value)) throw new RangeError(`axis value must be a positive finite number, got ${value}`);
  if (axis === "ev") return value;
  if (axis === "nm") return HC_EV_NM / value;
  return value / CM1_PER_EV;
}

/** Factor that turns an emission value per eV into a value per unit of `axis` at energy E. */
export function emissionFactor(energyEv: number, axis: DisplayAxis): number {
  if (axis === "ev") return 1;
  if (axis === "nm") return (energyEv * energyEv) / HC_EV_NM;
  return 1 / CM1_PER_EV;
}

export type SeriesArrays<K extends string> = Record<K, ArrayLike<number> | null>;

export interface DisplayArrays<K extends string> {
  axis: DisplayAxis;
  /** Ascending positions on the display axis. */
  x: Float64Array;
  series: Record<K, Float64Array | null>;
}

/**
 * Converts arrays on an ascending energy grid to a display axis. The output X is ascending (uPlot
 * needs it), so on the wavelength axis the order is reversed. With `emission`, values are
 * multiplied by the Jacobian of the axis; otherwise they are copied. Inputs are not modified.
 * Throws RangeError when the grid is not strictly ascending and positive, or a series has another
 * length.
 */
export function toDisplayAxis<K extends string>(
  energyEv: ArrayLike<number>,
  series: SeriesArrays<K>,
  axis: DisplayAxis,
  options: { emission: boolean },
): DisplayArrays<K> {
  const n = energyEv.length;
  if (!isDisplayAxis(axis)) throw new RangeError(`axis must be one of ${DISPLAY_AXES.join(", ")}`);
  for (let i = 0; i < n; i++) {
    const e = energyEv[i]!;
    if (!(e > 0) || !Number.isFinite(e)) throw new RangeError(`energyEv[${i}] must be a positive finite number`);
    if (i > 0 && !(e > energyEv[i - 1]!)) throw new RangeError(`energyEv must be strictly ascending (index ${i})`);
  }
  const reverse = axis === "nm";
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const j = reverse ? n - 1 - i : i;
    x[i] = energyToAxis(energyEv[j]!, axis);
  }
  const out = {} as Record<K, Float64Array | null>;
  for (const key of Object.keys(series) as K[]) {
    const y = series[key];
    if (!y) {
      out[key] = null;
      continue;
    }
    if (y.length !== n) throw new RangeError(`series ${key} has ${y.length} values for ${n} grid points`);
    const v = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const j = reverse ? n - 1 - i : i;
      v[i] = options.emission ? y[j]! * emissionFactor(energyEv[j]!, axis) : y[j]!;
    }
    out[key] = v;
  }
  return { axis, x, series: out };
}

const AXIS_UNITS: Record<DisplayAxis, DisplayUnit> = { nm: "nm", ev: "eV", "cm-1": "cm-1" };

/** A band's position on a display axis with its unit: "577.9 nm", "2.145 eV", "2178 cm⁻¹" ("—" when unknown). */
export function formatPosition(energyEv: number | null | undefined, axis: DisplayAxis): string {
  if (energyEv === null || energyEv === undefined || !(energyEv > 0) || !Number.isFinite(energyEv)) return "—";
  return formatQuantity(energyToAxis(energyEv, axis), AXIS_UNITS[axis]);
}
