import type { DepletionRowInput } from "@/lib/fits/depletionComposition";
import type { OverlapRatios } from "@/lib/fits/separateTwoAbsorbances";
import type { AbsorbanceReading, SupernatantReadings } from "./supernatantSchemas";

// Turns what the series page's depletion panel has (typed lines, or readings of linked
// supernatant spectra) into rows for depletionComposition, naming the line or file of every
// problem. Pure and client-safe.

/** How the added concentrations follow from a point's value of the series variable. */
export type AddedFrom = "feed-ratio" | "added-x";

export type RowsOutcome = { rows: DepletionRowInput[]; notes: string[]; errors: string[] };

/**
 * Lines of "added A, added X, absorbance at A's wavelength, absorbance at X's[, path length]"
 * (commas, semicolons, tabs or spaces between the numbers).
 */
export function parseTypedRows(text: string): RowsOutcome {
  const rows: DepletionRowInput[] = [];
  const errors: string[] = [];
  text.split(/\r?\n/).forEach((raw, i) => {
    const line = raw.trim();
    if (!line) return;
    const cells = line.split(/[,;\t ]+/);
    const values = cells.map(Number);
    if ((cells.length !== 4 && cells.length !== 5) || values.some((v) => !Number.isFinite(v))) {
      errors.push(
        `Points, line ${i + 1}: give four numbers (added A µM, added X µM, absorbance at A's wavelength, at X's) and optionally a path length in cm; found "${line.slice(0, 60)}"`,
      );
      return;
    }
    rows.push({
      label: `Points, line ${i + 1}`,
      addedA: values[0]!,
      addedX: values[1]!,
      atA: values[2]!,
      atX: values[3]!,
      ...(values.length === 5 ? { pathLengthCm: values[4]! } : {}),
    });
  });
  return { rows, notes: [], errors };
}

/** The typed form of rows (the inverse of parseTypedRows), so linked values can be corrected by hand. */
export function formatTypedRows(rows: readonly DepletionRowInput[]): string {
  const n = (v: number) => Number(v.toPrecision(6)).toString();
  return rows
    .map((r) => [r.addedA, r.addedX, r.atA, r.atX, ...(r.pathLengthCm !== undefined ? [r.pathLengthCm] : [])].map(n).join(", "))
    .join("\n");
}

/**
 * One row per point with a linked supernatant. Added A is the same at every point; added X is
 * the point's value times added A (the variable is the feed ratio X:A) or the value itself (the
 * variable is the added concentration of X, µM). Points with nothing of X added are left out
 * with a note; unreadable supernatants and points without a value are errors naming the file.
 */
export function rowsFromReadings(readings: SupernatantReadings, addedFrom: AddedFrom, addedA: number, variableName: string): RowsOutcome {
  const rows: DepletionRowInput[] = [];
  const notes: string[] = [];
  const errors: string[] = [];
  for (const point of readings.points) {
    const s = point.supernatant;
    if (!s) continue;
    if (s.error || s.atA === null || s.atX === null) {
      errors.push(s.error ?? `${s.fileName}: no absorbance read`);
      continue;
    }
    if (point.seriesValue === null) {
      errors.push(`${s.fileName}: its point ${point.fileName} has no value of ${variableName || "the series variable"}`);
      continue;
    }
    const addedX = addedFrom === "feed-ratio" ? point.seriesValue * addedA : point.seriesValue;
    if (!(addedX > 0)) {
      notes.push(`${s.fileName} left out: nothing of dot X was added at ${variableName || "value"} ${point.seriesValue}`);
      continue;
    }
    rows.push({
      label: s.fileName,
      addedA,
      addedX,
      atA: s.atA,
      atX: s.atX,
      ...(s.pathLengthCm !== null ? { pathLengthCm: s.pathLengthCm } : {}),
    });
  }
  return { rows, notes, errors };
}

/**
 * Overlap ratios from spectra of the pure dots: rA = A(λX)/A(λA), rX = X(λA)/X(λX); an absent
 * spectrum gives no ratio (0), and a slightly negative one (noise on a flat baseline) counts as 0.
 */
export function overlapFromPure(
  pureA: AbsorbanceReading | null,
  pureX: AbsorbanceReading | null,
): { ratios: OverlapRatios; errors: string[] } {
  const errors: string[] = [];
  const ratios: OverlapRatios = {};
  const ratio = (r: AbsorbanceReading, over: "atA" | "atX", label: string) => {
    if (r.error || r.atA === null || r.atX === null) {
      errors.push(`${label}: ${r.error ?? `${r.fileName}: no absorbance read`}`);
      return undefined;
    }
    const denominator = r[over]!;
    if (!(denominator > 0)) {
      errors.push(
        `${label}: ${r.fileName} has no positive absorbance at its own dot's wavelength (${denominator.toPrecision(3)}), so it cannot scale the overlap`,
      );
      return undefined;
    }
    const value = (over === "atA" ? r.atX! : r.atA!) / denominator;
    return Math.max(0, value);
  };
  if (pureA) {
    const v = ratio(pureA, "atA", "Spectrum of pure A");
    if (v !== undefined) ratios.aAtXPerAtA = v;
  }
  if (pureX) {
    const v = ratio(pureX, "atX", "Spectrum of pure X");
    if (v !== undefined) ratios.xAtAPerAtX = v;
  }
  return { ratios, errors };
}
