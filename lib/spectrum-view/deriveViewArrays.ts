import { processSpectrum, spectrumToEnergy, type ProcessOptions } from "@/lib/engine/processSpectrum";
import { TECHNIQUE_SPECS } from "@/lib/registry/techniques";
import { evaluateBackground } from "@/lib/engine/compare/fitConcentration";
import type { AnalysisReport, ParsedSpectrum } from "@/lib/engine/types";

/** The curves the viewer draws, on the engine's ascending uniform energy grid (eV). */
export interface ViewArrays {
  energyEv: Float64Array;
  /** The measured signal on the grid, as the engine analysed it (Jacobian for PL, %T → A, baseline removed, normalised). */
  raw: Float64Array;
  /** Savitzky–Golay smoothing with the run's window and order. */
  smoothed: Float64Array;
  /** The parent reference processed with the same grid and options, smoothed; null without a reference. */
  reference: Float64Array | null;
  /** smoothed − reference; null without a reference. */
  difference: Float64Array | null;
  /** True when the values are an emission density (PL in counts): display axes then apply the Jacobian. */
  emission: boolean;
}

/**
 * Re-derives the processed arrays of one finished analysis run from its parsed raw file(s) and the
 * parameters its report records (grid, smoothing windows, baseline, normalisation factor), with the
 * same engine functions the worker used, so the curves are the ones the flags were computed from.
 * Inputs are not modified. Throws RangeError when the report lacks what is needed.
 */
export function deriveViewArrays(report: AnalysisReport, sample: ParsedSpectrum, reference: ParsedSpectrum | null): ViewArrays {
  const p = report?.parameters;
  if (!p?.grid || !p.smoothing) throw new RangeError("report.parameters must hold grid and smoothing (an analysis report)");
  const technique = report.technique;
  const grid = { from: p.grid.minEv, to: p.grid.maxEv, n: p.grid.points };
  if (!(grid.to > grid.from) || !Number.isInteger(grid.n) || grid.n < 2)
    throw new RangeError("report.parameters.grid is not a usable grid");
  const o: ProcessOptions = {
    technique,
    windowSize: p.smoothing.windowSize,
    derivativeWindowSize: p.smoothing.derivativeWindowSize,
    polynomial: p.smoothing.polynomial,
    baseline: p.baseline?.mode ?? "none",
    minSignificance: p.thresholds?.minSignificance ?? 5,
    excitationNm: p.excitationNm ?? undefined,
    excitationExclusionNm: 10,
    // engine 2: PL dark level (absent from older reports: none)
    darkLevel: p.darkLevel?.mode ?? "none",
  };
  const se = spectrumToEnergy(sample, technique);
  // engine 2: the background fitted with the concentration ratio is subtracted before the factor
  const bg = p.normalization?.details?.background;
  const gridEnergy = Float64Array.from({ length: grid.n }, (_, i) => grid.from + ((grid.to - grid.from) * i) / (grid.n - 1));
  const background = bg ? evaluateBackground(gridEnergy, bg) : undefined;
  const s = processSpectrum(se.energy, se.signal, grid, { ...o, xUnit: sample.xUnit, scale: p.normalization?.factor ?? 1, background });
  let refSmoothed: Float64Array | null = null;
  let difference: Float64Array | null = null;
  if (reference) {
    const re = spectrumToEnergy(reference, technique);
    const r = processSpectrum(re.energy, re.signal, grid, { ...o, xUnit: reference.xUnit });
    refSmoothed = r.smoothed;
    difference = new Float64Array(grid.n);
    for (let i = 0; i < grid.n; i++) difference[i] = s.smoothed[i]! - r.smoothed[i]!;
  }
  return {
    energyEv: s.energy,
    raw: s.raw,
    smoothed: s.smoothed,
    reference: refSmoothed,
    difference,
    emission: TECHNIQUE_SPECS[technique].jacobian && sample.yUnit === "counts",
  };
}
