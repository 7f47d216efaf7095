import { HC_EV_NM } from "@/lib/engine/constants";
import { evToX, xToEv } from "@/lib/engine/axis/convertUnits";
import type { ParsedSpectrum } from "@/lib/engine/types";

/** How readAbsorbanceAt reads a value, for the people who see it. */
export const ABSORBANCE_READING =
  "measured absorbance as recorded in the file (linear interpolation between the two nearest recorded points; no smoothing, no baseline subtraction; %T turned into A = 2 − log10 %T)";

const toAbsorbance = (y: number, unit: ParsedSpectrum["yUnit"]) => (unit === "percent-transmittance" ? 2 - Math.log10(y) : y);

/**
 * The measured absorbance of a parsed spectrum at one wavelength (nm), linearly interpolated
 * between the two recorded points around it (the file's own X unit). X must ascend, as the parser
 * leaves it. Throws RangeError naming the wavelength when it lies outside the recorded range, and
 * for emission counts, which are no absorbance.
 */
export function readAbsorbanceAt(spectrum: Pick<ParsedSpectrum, "x" | "y" | "xUnit" | "yUnit">, wavelengthNm: number): number {
  if (!(Number.isFinite(wavelengthNm) && wavelengthNm > 0)) throw new RangeError("wavelength must be a positive number of nm");
  if (spectrum.yUnit === "counts") throw new RangeError("the file holds emission counts, not absorbance");
  const { x, y } = spectrum;
  const n = x.length;
  if (n < 2 || y.length !== n) throw new RangeError("the spectrum needs at least 2 points with one value each");
  // A wavelength axis is read at the wavelength itself: no round trip through energy to blur it.
  const target = spectrum.xUnit === "nm" ? wavelengthNm : evToX(HC_EV_NM / wavelengthNm, spectrum.xUnit);
  if (!(target >= x[0]! && target <= x[n - 1]!)) {
    const ends = [x[0]!, x[n - 1]!].map((v) => HC_EV_NM / xToEv(v, spectrum.xUnit)).sort((a, b) => a - b);
    throw new RangeError(`${round(wavelengthNm)} nm is outside the recorded range ${round(ends[0]!)}–${round(ends[1]!)} nm`);
  }
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (x[mid]! <= target) lo = mid;
    else hi = mid;
  }
  const a0 = toAbsorbance(y[lo]!, spectrum.yUnit);
  const a1 = toAbsorbance(y[hi]!, spectrum.yUnit);
  if (x[hi] === x[lo]) return a0;
  const t = (target - x[lo]!) / (x[hi]! - x[lo]!);
  const value = a0 + t * (a1 - a0);
  if (!Number.isFinite(value)) throw new RangeError(`no finite absorbance at ${round(wavelengthNm)} nm`);
  return value;
}

const round = (nm: number) => Number(nm.toFixed(1)).toString();
