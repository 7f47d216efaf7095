import { ENGINE_VERSION } from './version';
import { DEFAULT_THRESHOLDS } from '../registry/flagKinds';
import { TECHNIQUE_SPECS } from '../registry/techniques';
import { HC_EV_NM } from './constants';
import { processSpectrum, spectrumToEnergy, type ProcessedSpectrum } from './processSpectrum';
import { chooseSmoothingWindow } from './signal/chooseSmoothingWindow';
import { resampleUniform } from './axis/resampleUniform';
import { estimateCorrelatedNoise } from './signal/estimateCorrelatedNoise';
import { SYSTEMATIC_RELATIVE } from './compare/compareSpectra';
import { compareSpectra } from './compare/compareSpectra';
import { processReference, referenceToEnergy } from './referenceCache';
import { deriveQuantities } from './derived/deriveQuantities';
import type { ExcitonicPeak } from './peaks/findExcitonicPeaks';
import { matchFirstExciton } from './peaks/matchFirstExciton';
import type {
  AnalysisOptions,
  AnalysisReport,
  AnalysisThresholds,
  Normalization,
  ParsedSpectrum,
  PeakReport,
  SpectrumSummary,
  Technique,
} from './types';

/** Default thresholds (common practice; see docs/analysis-json.md): one per flag kind, from the registry. */
export { DEFAULT_THRESHOLDS };

function summary(s: ParsedSpectrum): SpectrumSummary {
  return { fileName: s.fileName, columnName: s.columnName, points: s.x.length, xUnit: s.xUnit, yUnit: s.yUnit, xMin: s.x[0]!, xMax: s.x[s.x.length - 1]! };
}

function peakOut(p: ExcitonicPeak): PeakReport {
  return {
    kind: p.kind,
    energyEv: p.energyEv,
    wavelengthNm: p.wavelengthNm,
    height: p.height,
    amplitude: p.amplitude,
    fwhmMeV: p.fwhmMeV,
    area: p.area,
    significance: p.significance,
  };
}

/**
 * Analyses one spectrum, optionally against its parent reference, on a uniform energy grid. The
 * returned object is exactly the JSON the command-line tool prints (docs/analysis-json.md).
 * Inputs are not modified. Throws RangeError for options out of range and when the two spectra
 * do not overlap.
 */
export function analyzeSpectrum(sample: ParsedSpectrum, options: AnalysisOptions & { reference?: ParsedSpectrum } = {}): AnalysisReport {
  const technique: Technique = options.technique ?? sample.technique;
  const thresholds: AnalysisThresholds = { ...DEFAULT_THRESHOLDS, ...(options.thresholds ?? {}) };
  for (const [k, v] of Object.entries(thresholds)) {
    if (!(typeof v === 'number' && Number.isFinite(v) && v >= 0)) throw new RangeError(`threshold ${k} must be a non-negative number`);
  }
  const warnings: string[] = [...sample.warnings.map((w) => `${sample.fileName}: ${w}`)];
  const ref = options.reference;
  if (ref) warnings.push(...ref.warnings.map((w) => `${ref.fileName}: ${w}`));
  if (ref && ref.technique !== technique && !options.technique) {
    warnings.push(`reference looks like ${ref.technique} but the sample like ${technique}; compared as ${technique}`);
  }
  const excitationNm = options.excitationNm ?? sample.excitationNm ?? ref?.excitationNm;
  const pathLengthCm = options.pathLengthCm ?? sample.pathLengthCm ?? null;
  const se = spectrumToEnergy(sample, technique);
  warnings.push(...se.warnings);
  const re = ref ? referenceToEnergy(ref, technique) : null;
  if (re) warnings.push(...re.warnings);

  // common grid
  let from = se.energy[0]!;
  let to = se.energy[se.energy.length - 1]!;
  if (re) {
    from = Math.max(from, re.energy[0]!);
    to = Math.min(to, re.energy[re.energy.length - 1]!);
    if (!(to > from)) throw new RangeError('sample and reference do not overlap in energy');
  }
  let inRange = 0;
  const sEnergy = se.energy;
  for (let i = 0; i < sEnergy.length; i++) if (sEnergy[i]! >= from && sEnergy[i]! <= to) inRange++;
  const n = options.gridPoints ?? Math.max(64, inRange);
  if (!Number.isInteger(n) || n < 16) throw new RangeError('gridPoints must be an integer of at least 16');
  if (inRange < 16) throw new RangeError('fewer than 16 sample points lie in the range shared with the reference');
  const stepEv = (to - from) / (n - 1);

  // smoothing window from the data (overridable)
  let windowSize = options.smoothingWindow;
  let derivativeWindowSize = options.derivativeWindow;
  const polynomial = options.smoothingPolynomial ?? 2;
  let max = 0;
  const sSignal = se.signal;
  for (let i = 0; i < sSignal.length; i++) max = Math.max(max, Math.abs(sSignal[i]!));
  const spans = TECHNIQUE_SPECS[technique];
  const baseWindow = chooseSmoothingWindow(n, stepEv, { targetSpanEv: spans.smoothingSpanMeV / 1000 });
  // noise of the sample on the analysis grid (estimated once; processSpectrum reuses it)
  const gridded = resampleUniform(se.energy, se.signal, from, to, n);
  const sampleNoise = estimateCorrelatedNoise(gridded.y, { maxBlockLength: baseWindow });
  const snr = max / Math.max(sampleNoise.sigma, 1e-300);
  windowSize ??= chooseSmoothingWindow(n, stepEv, { targetSpanEv: spans.smoothingSpanMeV / 1000, signalToNoise: snr });
  derivativeWindowSize ??= Math.max(windowSize, chooseSmoothingWindow(n, stepEv, { targetSpanEv: spans.derivativeSpanMeV / 1000, signalToNoise: snr }));
  for (const [name, w] of [['smoothingWindow', windowSize], ['derivativeWindow', derivativeWindowSize]] as const) {
    if (!Number.isInteger(w) || w < 5 || w % 2 === 0 || w > n) {
      throw new RangeError(`${name} must be an odd integer from 5 to the number of grid points`);
    }
  }
  if (!Number.isInteger(polynomial) || polynomial < 2 || polynomial >= windowSize) {
    throw new RangeError('smoothingPolynomial must be an integer from 2 to smoothingWindow - 1');
  }
  const baseline = options.baseline ?? TECHNIQUE_SPECS[technique].baseline;
  const normalization: Normalization = options.normalization ?? { mode: 'none' };
  let factor = 1;
  if (normalization.mode === 'concentration') {
    if (!(normalization.sampleConcentration > 0 && normalization.referenceConcentration > 0)) {
      throw new RangeError('concentrations for normalisation must be positive');
    }
    factor = normalization.referenceConcentration / normalization.sampleConcentration;
  }
  const procOpts = {
    technique,
    windowSize,
    derivativeWindowSize,
    polynomial,
    baseline,
    minSignificance: thresholds.minSignificance,
    excitationNm,
    excitationExclusionNm: options.excitationExclusionNm ?? 10,
  };
  const grid = { from, to, n };
  const sampleGrid = { ...gridded, noise: sampleNoise, noiseMaxBlockLength: baseWindow };
  let s: ProcessedSpectrum = processSpectrum(se.energy, se.signal, grid, { ...procOpts, scale: factor, gridded: sampleGrid });
  // the reference's processing is memoised per reference object (many samples, one parent)
  const r: ProcessedSpectrum | null = ref ? processReference(ref, technique, grid, procOpts) : null;
  if (normalization.mode === 'wavelength') {
    if (!r) throw new RangeError('normalisation at a wavelength needs a reference');
    const e = HC_EV_NM / normalization.wavelengthNm;
    if (!(e >= from && e <= to)) {
      const [shortNm, longNm] = [HC_EV_NM / to, HC_EV_NM / from];
      throw new RangeError(
        `normalisation wavelength ${normalization.wavelengthNm} nm lies outside the range shared by the sample and its reference (${shortNm.toFixed(1)}–${longNm.toFixed(1)} nm)`,
      );
    }
    const k = Math.round((e - from) / stepEv);
    if (!(Math.abs(s.smoothed[k]!) > 0)) throw new RangeError('sample signal is zero at the normalisation wavelength');
    factor = r.smoothed[k]! / s.smoothed[k]!;
    s = processSpectrum(se.energy, se.signal, grid, { ...procOpts, scale: factor, gridded: sampleGrid });
  }
  warnings.push(...s.warnings.map((w) => `${sample.fileName}: ${w}`));
  if (r && ref) warnings.push(...r.warnings.map((w) => `${ref.fileName}: ${w}`));
  if (technique === 'pl' && !excitationNm) warnings.push('excitation wavelength unknown: an excitation or scatter line may be reported as a peak');

  const flags = r ? compareSpectra(s, r, { ...options, technique, thresholds, excitationNm }) : { flags: [], warnings: [] };
  warnings.push(...flags.warnings);

  if (r?.firstExciton && s.firstExciton) {
    const matched = matchFirstExciton(s.peaks, r.firstExciton.energyEv);
    if (matched && matched !== s.firstExciton) {
      warnings.push(
        `first exciton taken at ${matched.energyEv.toFixed(3)} eV, the feature nearest the parent's (${r.firstExciton.energyEv.toFixed(3)} eV); the lower-energy feature at ${s.firstExciton.energyEv.toFixed(3)} eV is not treated as the first exciton`,
      );
      s = { ...s, firstExciton: matched };
    }
  }

  const derived = deriveQuantities({
    material: options.material,
    sizingModel: options.sizingModel,
    technique,
    firstExciton: s.firstExciton,
    energy: s.energy,
    smoothed: s.smoothed,
    pathLengthCm,
  });
  warnings.push(...derived.warnings);

  const fx = s.firstExciton;
  return {
    technique,
    engineVersion: ENGINE_VERSION,
    sample: summary(sample),
    reference: ref ? summary(ref) : null,
    parameters: {
      grid: { points: n, minEv: from, maxEv: to, stepMeV: stepEv * 1000 },
      smoothing: { method: 'savitzky-golay', windowSize, derivativeWindowSize, polynomial, edges: 'polynomial-fit' },
      baseline: { mode: baseline, applied: s.baselineApplied },
      normalization: { ...normalization, factor },
      thresholds,
      pathLengthCm,
      excitationNm: excitationNm ?? null,
      material: options.material ?? null,
    },
    noise: {
      method: 'white-noise-equivalent σ: 1.4826 × median |fourth differences| of B-point block means × √B / √70, B doubled while σ rises > 25 % (B ≤ smoothing window)',
      sigma: s.sigma,
      blockLength: s.noiseBlockLength,
      systematicRelative: SYSTEMATIC_RELATIVE,
      sigmaSmoothed: s.sigmaSmoothed,
      referenceSigma: r ? r.sigma : null,
    },
    peaks: s.peaks.map(peakOut),
    firstExciton: fx ? peakOut(fx) : null,
    referenceFirstExciton: r?.firstExciton ? peakOut(r.firstExciton) : null,
    flags: flags.flags,
    derived: derived.report,
    warnings,
  };
}
