/**
 * hc in eV·nm and eV·cm, from the CODATA 2018 exact values of h, c and e
 * (hc = 1.239 841 984… × 10⁻⁶ eV·m).
 */
export const HC_EV_NM = 1239.841984;
export const HC_EV_CM = 1.239841984e-4;

export const BAND_UNITS = ["nm", "eV", "cm-1"] as const;
export type BandUnit = (typeof BAND_UNITS)[number];

const TO_EV: Record<BandUnit, (v: number) => number> = {
  nm: (v) => HC_EV_NM / v,
  eV: (v) => v,
  "cm-1": (v) => v * HC_EV_CM,
};

/**
 * A band range given in nm, eV or cm⁻¹ as a photon-energy range in eV, low end first
 * (a wavelength range turns round: 590 nm is the lower energy of 570–590 nm).
 * Throws RangeError for a bound that is not a positive finite number.
 */
export function bandRangeEv(min: number, max: number, unit: BandUnit): { minEv: number; maxEv: number } {
  for (const [name, v] of [
    ["min", min],
    ["max", max],
  ] as const) {
    if (!Number.isFinite(v) || v <= 0) throw new RangeError(`band ${name} must be a positive number, got ${v}`);
  }
  const a = TO_EV[unit](min);
  const b = TO_EV[unit](max);
  return { minEv: Math.min(a, b), maxEv: Math.max(a, b) };
}
