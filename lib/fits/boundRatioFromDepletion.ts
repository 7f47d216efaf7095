import { beerLambertConcentration } from "@/lib/engine/derived/concentration";

/**
 * Composition of a dot–dot product from supernatant depletion (Bandkeep DOMAIN.md §6, common
 * practice): at each point of the series the amounts added of dots A and X are known; after the
 * product settles, the supernatant's absorbances give what is left in solution by Beer–Lambert,
 * c = A/(ε·l) (ε from the engine's size-dependent extinction, e.g. Yu et al., Chem. Mater. 2003,
 * 15, 2854 for CdSe; Moreels et al., ACS Nano 2009, 3, 3023 for PbS at 400 nm). Bound = added −
 * left; the bound ratio X:A is the product's composition. A definite stoichiometry shows as a
 * bound ratio that stays nearly constant while the feed ratio changes several fold.
 *
 * Assumes each absorbance belongs to one kind of dot (measured where the other does not absorb,
 * or already corrected for overlap). Concentrations in µM.
 */
export interface DepletionPoint {
  /** Added concentration of dot A, µM. */
  addedA: number;
  /** Added concentration of dot X, µM. */
  addedX: number;
  /** Supernatant absorbance attributed to A, at the wavelength of epsilonA. */
  absorbanceA: number;
  /** Supernatant absorbance attributed to X, at the wavelength of epsilonX. */
  absorbanceX: number;
  /** Path length of this supernatant measurement, cm; options.pathLengthCm when absent. */
  pathLengthCm?: number;
}

export interface DepletionOptions {
  /** Molar extinction of A at its measuring wavelength, M⁻¹cm⁻¹. */
  epsilonA: number;
  /** Molar extinction of X at its measuring wavelength, M⁻¹cm⁻¹. */
  epsilonX: number;
  /** Path length, cm, for points that do not state their own. */
  pathLengthCm: number;
  /** Largest relative standard deviation of the bound ratio still called constant. Default 0.1. */
  constantTolerance?: number;
  /** Smallest fold-change of the feed ratio needed before calling the ratio constant. Default 2. */
  minFeedFoldChange?: number;
}

export interface DepletionRow {
  leftA: number;
  leftX: number;
  boundA: number;
  boundX: number;
  feedRatio: number;
  /** boundX / boundA, or null when less than nothing of A is bound. */
  boundRatio: number | null;
}

export interface DepletionResult {
  rows: DepletionRow[];
  /** Mean and sample standard deviation (n − 1) of the bound ratios that could be computed. */
  meanBoundRatio: number | null;
  sdBoundRatio: number | null;
  /** max feed ratio / min feed ratio. */
  feedFoldChange: number;
  /** True when sd/mean ≤ tolerance and the feed ratio changed at least minFeedFoldChange-fold. */
  constant: boolean;
  warnings: string[];
}

export function boundRatioFromDepletion(points: readonly DepletionPoint[], options: DepletionOptions): DepletionResult {
  if (!Array.isArray(points) || points.length < 2)
    throw new RangeError(`need at least 2 points (got ${Array.isArray(points) ? points.length : 0})`);
  const tolerance = options.constantTolerance ?? 0.1;
  const minFold = options.minFeedFoldChange ?? 2;
  if (!(tolerance > 0)) throw new RangeError("constantTolerance must be positive");
  if (!(minFold >= 1)) throw new RangeError("minFeedFoldChange must be at least 1");
  const warnings: string[] = [];
  const rows = points.map((p, i) => {
    for (const key of ["addedA", "addedX", "absorbanceA", "absorbanceX"] as const) {
      if (!Number.isFinite(p[key])) throw new RangeError(`points[${i}].${key} is not a finite number`);
    }
    if (!(p.addedA > 0)) throw new RangeError(`points[${i}].addedA must be positive`);
    if (!(p.addedX > 0)) throw new RangeError(`points[${i}].addedX must be positive`);
    if (p.pathLengthCm !== undefined && !(p.pathLengthCm > 0)) throw new RangeError(`points[${i}].pathLengthCm must be positive`);
    const l = p.pathLengthCm ?? options.pathLengthCm;
    const leftA = beerLambertConcentration(p.absorbanceA, options.epsilonA, l) * 1e6;
    const leftX = beerLambertConcentration(p.absorbanceX, options.epsilonX, l) * 1e6;
    const boundA = p.addedA - leftA;
    const boundX = p.addedX - leftX;
    if (boundA <= 0) warnings.push(`point ${i + 1}: no dot A is bound (left ${leftA.toPrecision(3)} µM of ${p.addedA} µM added)`);
    if (boundX < 0) warnings.push(`point ${i + 1}: more dot X is left than was added: check ε or the absorbance`);
    return { leftA, leftX, boundA, boundX, feedRatio: p.addedX / p.addedA, boundRatio: boundA > 0 ? boundX / boundA : null };
  });
  const ratios = rows.map((r) => r.boundRatio).filter((r): r is number => r !== null);
  const mean = ratios.length ? ratios.reduce((s, v) => s + v, 0) / ratios.length : null;
  const sd = mean !== null && ratios.length >= 2 ? Math.sqrt(ratios.reduce((s, v) => s + (v - mean) ** 2, 0) / (ratios.length - 1)) : null;
  const feeds = rows.map((r) => r.feedRatio);
  const feedFoldChange = Math.max(...feeds) / Math.min(...feeds);
  const constant = mean !== null && sd !== null && mean > 0 && sd / mean <= tolerance && feedFoldChange >= minFold;
  return { rows, meanBoundRatio: mean, sdBoundRatio: sd, feedFoldChange, constant, warnings };
}
