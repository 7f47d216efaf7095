import type { MaterialName } from "@/lib/engine/types";
import { boundRatioFromDepletion, type DepletionResult } from "./boundRatioFromDepletion";
import { dotExtinction, type DotExtinction } from "./dotExtinction";
import { separateTwoAbsorbances, type OverlapRatios } from "./separateTwoAbsorbances";

export interface DepletionRowInput {
  /** Names the row in messages: "line 3", or the supernatant's file name. */
  label: string;
  /** Added concentrations in the mixture, µM. */
  addedA: number;
  addedX: number;
  /** Supernatant absorbance at dot A's reading wavelength, and at dot X's. */
  atA: number;
  atX: number;
  /** Path length of this measurement, cm, when it states one. */
  pathLengthCm?: number;
}

export interface DepletionSetup {
  dotA: { material: MaterialName; firstExcitonNm: number };
  dotX: { material: MaterialName; firstExcitonNm: number };
  /** Path length, cm, for rows that state none. */
  pathLengthCm: number;
  overlap?: OverlapRatios;
}

export interface DepletionComposition {
  extinctionA: DotExtinction;
  extinctionX: DotExtinction;
  /** Each row's absorbance of A (at A's wavelength) and of X (at X's) after the overlap is taken out. */
  separated: { a: number; x: number }[];
  result: DepletionResult;
}

/**
 * The composition of a dot–dot product from supernatant absorbances (DOMAIN.md §6, common
 * practice): ε of each dot from its sizing curve (dotExtinction), each row's absorbance split
 * between the two dots (separateTwoAbsorbances), then bound = added − left with left by
 * Beer–Lambert (boundRatioFromDepletion). Throws RangeError naming the row or the dot.
 */
export function depletionComposition(rows: readonly DepletionRowInput[], setup: DepletionSetup): DepletionComposition {
  const extinctionA = withLabel("Dot A", () => dotExtinction(setup.dotA.material, setup.dotA.firstExcitonNm));
  const extinctionX = withLabel("Dot X", () => dotExtinction(setup.dotX.material, setup.dotX.firstExcitonNm));
  if (!(setup.pathLengthCm > 0)) throw new RangeError("Path length: give a positive number of cm");
  if (rows.length < 2) throw new RangeError(`Points: need at least 2 points with something of both dots added (have ${rows.length})`);
  const separated = rows.map((r) => {
    if (!(Number.isFinite(r.addedA) && r.addedA > 0)) throw new RangeError(`${r.label}: added A must be a positive number of µM`);
    if (!(Number.isFinite(r.addedX) && r.addedX > 0)) throw new RangeError(`${r.label}: added X must be a positive number of µM`);
    if (r.pathLengthCm !== undefined && !(r.pathLengthCm > 0)) throw new RangeError(`${r.label}: path length must be positive`);
    return withLabel(r.label, () => separateTwoAbsorbances(r.atA, r.atX, setup.overlap));
  });
  const result = boundRatioFromDepletion(
    rows.map((r, i) => ({
      addedA: r.addedA,
      addedX: r.addedX,
      absorbanceA: separated[i]!.a,
      absorbanceX: separated[i]!.x,
      ...(r.pathLengthCm !== undefined ? { pathLengthCm: r.pathLengthCm } : {}),
    })),
    { epsilonA: extinctionA.epsilonPerMPerCm, epsilonX: extinctionX.epsilonPerMPerCm, pathLengthCm: setup.pathLengthCm },
  );
  // boundRatioFromDepletion numbers its points from 1; name them as the person knows them.
  const warnings = result.warnings.map((w) => w.replace(/^point (\d+):/, (m, n: string) => `${rows[Number(n) - 1]?.label ?? m}:`));
  return { extinctionA, extinctionX, separated, result: { ...result, warnings } };
}

function withLabel<T>(label: string, run: () => T): T {
  try {
    return run();
  } catch (error) {
    if (error instanceof RangeError) throw new RangeError(`${label}: ${error.message}`);
    throw error;
  }
}
