/**
 * Splits the absorbance of a mixture of two kinds of dot, measured at two wavelengths, into the
 * part of each: Beer–Lambert absorbances add (common practice: two-component simultaneous
 * equations), so with a = A's absorbance at λA and x = X's absorbance at λX,
 *
 *   S(λA) = a + rX·x        S(λX) = rA·a + x
 *
 * where rA = A's absorbance at λX per unit of A's absorbance at λA, and rX = X's absorbance at λA
 * per unit at λX, both read from a spectrum of the pure dot (they do not depend on concentration).
 * With rA = rX = 0 nothing is subtracted.
 */
export interface OverlapRatios {
  /** Absorbance of pure A at X's wavelength divided by its absorbance at A's wavelength. Default 0. */
  aAtXPerAtA?: number;
  /** Absorbance of pure X at A's wavelength divided by its absorbance at X's wavelength. Default 0. */
  xAtAPerAtX?: number;
}

/** Smallest 1 − rA·rX accepted: below it an error in S is amplified more than tenfold. */
export const MIN_SEPARABILITY = 0.1;

export function separateTwoAbsorbances(atA: number, atX: number, ratios: OverlapRatios = {}): { a: number; x: number } {
  if (!Number.isFinite(atA)) throw new RangeError("absorbance at A's wavelength is not a finite number");
  if (!Number.isFinite(atX)) throw new RangeError("absorbance at X's wavelength is not a finite number");
  const rA = ratios.aAtXPerAtA ?? 0;
  const rX = ratios.xAtAPerAtX ?? 0;
  if (!(Number.isFinite(rA) && rA >= 0)) throw new RangeError("aAtXPerAtA must be a finite number ≥ 0");
  if (!(Number.isFinite(rX) && rX >= 0)) throw new RangeError("xAtAPerAtX must be a finite number ≥ 0");
  const det = 1 - rA * rX;
  if (det < MIN_SEPARABILITY) {
    throw new RangeError(
      `the two dots absorb too alike at these wavelengths to be told apart (1 − rA·rX = ${det.toFixed(3)}, needs ≥ ${MIN_SEPARABILITY})`,
    );
  }
  return { a: (atA - rX * atX) / det, x: (atX - rA * atA) / det };
}
