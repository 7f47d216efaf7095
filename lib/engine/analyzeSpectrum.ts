import { ENGINE_VERSION } from './version';
import { DEFAULT_THRESHOLDS } from '../registry/flagKinds';
import { TECHNIQUE_SPECS } from '../registry/techniques';
import { HC_EV_NM } from './constants';
import { processSpectrum, spectrumToEnergy, type ProcessedSpectrum, type ProcessOptions } from './processSpectrum';
import { checkReferenceMatch } from './compare/checkReferenceMatch';
import { autoNormalization } from './compare/autoNormalization';
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
  FlagReport,
  Normalization,
  NormalizationReport,
  ReferenceMatchReport,
  ParsedSpectrum,
  PeakReport,
  SpectrumSummary,
  Technique,
} from './types';

/** Default thresholds (common practice; see docs/analysis-json.md): one per flag kind, from the registry. */
export { DEFAULT_THRESHOLDS };

function summary(s: ParsedSpectrum): SpectrumSummary {
  return {
    fileName: s.fileName,
    columnName: s.columnName,
    points: s.x.length,
    xUnit: s.xUnit,
    yUnit: s.yUnit,
    xMin: s.x[0]!,
    xMax: s.x[s.x.length - 1]!,
  };
}

/**
 * Spans of the smoothing and derivative windows, eV. Defaults (common practice): 25 meV and
 * 80 meV for visible/NIR bands of 60–150 meV FWHM; 3 and 8 meV in the mid-IR. They follow the
 * band when it is narrower than 100 meV: a quarter of its FWHM for smoothing and 0.8 of it for the
 * derivatives, so that a 25 meV line is not smoothed into a wider one (the fits then refine the
 * broadening by convolution, fitShiftBroadening).
 */
export function followBandWidth(
  spec: { smoothingSpanMeV: number; derivativeSpanMeV: number; firstExciton: string },
  fwhmMeV: number | null,
): { smoothingEv: number; derivativeEv: number } {
  const smoothingEv = spec.smoothingSpanMeV / 1000;
  const derivativeEv = spec.derivativeSpanMeV / 1000;
  // Techniques without a first band (mid-IR) keep their fixed spans.
  if (spec.firstExciton === 'none' || fwhmMeV === null || !(fwhmMeV > 0)) return { smoothingEv, derivativeEv };
  const f = fwhmMeV / 1000;
  return { smoothingEv: Math.min(smoothingEv, 0.25 * f), derivativeEv: Math.min(derivativeEv, 0.8 * f) };
}

/**
 * Warns when the first exciton may be cut by the red end of the data: the absorbance there is more
 * than half the first exciton's, or the band's low-energy half is not inside the data.
 */
function edgeWarnings(s: ProcessedSpectrum): string[] {
  const fx = s.firstExciton!;
  const guard = (s.windowSize - 1) / 2;
  const atEdge = s.smoothed[Math.min(guard, s.smoothed.length - 1)]!;
  const reachesEdge = fx.height > 0 && atEdge > 0.5 * fx.height;
  const lowHalf = fx.fwhmMeV ? fx.energyEv - fx.fwhmMeV / 1000 < s.energy[0]! : false;
  if (!reachesEdge && !lowHalf) return [];
  return [
    `first exciton at ${fx.wavelengthNm.toFixed(1)} nm may be cut by the red end of the data (${(HC_EV_NM / s.energy[0]!).toFixed(1)} nm, absorbance there ${atEdge.toFixed(3)} vs ${fx.height.toFixed(3)} at the band): its position, width and the sizes derived from it are uncertain; measure further to the red`,
  ];
}

function peakOut(p: ExcitonicPeak, technique: Technique): PeakReport {
  return {
    kind: p.kind,
    energyEv: p.energyEv,
    wavelengthNm: p.wavelengthNm,
    height: p.height,
    amplitude: p.amplitude,
    fwhmMeV: p.fwhmMeV,
    area: p.area,
    significance: p.significance,
    bandRole: TECHNIQUE_SPECS[technique].bandRole,
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
  const windows = (fwhmMeV: number | null) => {
    const spans = followBandWidth(TECHNIQUE_SPECS[technique], fwhmMeV);
    const w = options.smoothingWindow ?? chooseSmoothingWindow(n, stepEv, { targetSpanEv: spans.smoothingEv, signalToNoise: snr });
    const wd =
      options.derivativeWindow ?? Math.max(w, chooseSmoothingWindow(n, stepEv, { targetSpanEv: spans.derivativeEv, signalToNoise: snr }));
    return { w, wd };
  };
  let { w: windowSize, wd: derivativeWindowSize } = windows(null);
  const checkWindows = () => {
    for (const [name, w] of [
      ['smoothingWindow', windowSize],
      ['derivativeWindow', derivativeWindowSize],
    ] as const) {
      if (!Number.isInteger(w) || w < 5 || w % 2 === 0 || w > n) {
        throw new RangeError(`${name} must be an odd integer from 5 to the number of grid points`);
      }
    }
    if (!Number.isInteger(polynomial) || polynomial < 2 || polynomial >= windowSize) {
      throw new RangeError('smoothingPolynomial must be an integer from 2 to smoothingWindow - 1');
    }
  };
  checkWindows();
  const baseline = options.baseline ?? TECHNIQUE_SPECS[technique].baseline;
  const darkLevel = options.darkLevel ?? 'auto';
  const normalization: Normalization = options.normalization ?? { mode: 'auto' };
  const procOptsFor = (w: number, wd: number): ProcessOptions => ({
    technique,
    windowSize: w,
    derivativeWindowSize: wd,
    polynomial,
    baseline,
    minSignificance: thresholds.minSignificance,
    excitationNm,
    excitationExclusionNm: options.excitationExclusionNm ?? 10,
    darkLevel,
    xUnit: sample.xUnit,
  });
  let procOpts = procOptsFor(windowSize, derivativeWindowSize);
  const grid = { from, to, n };
  const sampleGrid = { ...gridded, noise: sampleNoise, noiseMaxBlockLength: baseWindow };
  const processSample = (scale: number, background?: Float64Array) =>
    processSpectrum(se.energy, se.signal, grid, { ...procOpts, scale, background, gridded: sampleGrid });
  // the reference's processing is memoised per reference object (many samples, one parent)
  const referenceOpts = () => ({ ...procOpts, xUnit: ref?.xUnit ?? sample.xUnit });
  let r: ProcessedSpectrum | null = ref ? processReference(ref, technique, grid, referenceOpts()) : null;
  // windows follow the band: the reference's first exciton (or emission band), else the sample's
  let plain: ProcessedSpectrum | null = null;
  if (!ref) plain = processSample(1);
  const band = (r ?? plain)?.firstExciton ?? null;
  const followed = windows(band?.fwhmMeV ?? null);
  if (followed.w !== windowSize || followed.wd !== derivativeWindowSize) {
    windowSize = followed.w;
    derivativeWindowSize = followed.wd;
    checkWindows();
    procOpts = procOptsFor(windowSize, derivativeWindowSize);
    if (ref) r = processReference(ref, technique, grid, referenceOpts());
    plain = null;
  }

  // concentration and background, before any band is compared
  let factor = 1;
  let background: Float64Array | undefined;
  let details: NormalizationReport = {
    requested: normalization.mode,
    applied: 'none',
    factor: 1,
    concentrationRatio: 1,
    concentrationRatioUncertainty: null,
    background: null,
    regionsEv: [],
    separation: null,
    scaleDetermined: true,
    reason: '',
  };
  let concentrationFlag: FlagReport | null = null;
  let s: ProcessedSpectrum;
  switch (normalization.mode) {
    case 'none':
      details.reason = 'no scaling: chosen by the caller';
      s = plain ?? processSample(1);
      break;
    case 'concentration': {
      if (!(normalization.sampleConcentration > 0 && normalization.referenceConcentration > 0)) {
        throw new RangeError('concentrations for normalisation must be positive');
      }
      factor = normalization.referenceConcentration / normalization.sampleConcentration;
      details = {
        ...details,
        applied: 'concentration',
        factor,
        concentrationRatio: 1 / factor,
        reason: 'scaled by the concentrations the caller gave (× c_ref/c_sample)',
      };
      s = processSample(factor);
      break;
    }
    case 'wavelength': {
      if (!r) throw new RangeError('normalisation at a wavelength needs a reference');
      const e = HC_EV_NM / normalization.wavelengthNm;
      if (!(e >= from && e <= to)) {
        const [shortNm, longNm] = [HC_EV_NM / to, HC_EV_NM / from];
        throw new RangeError(
          `normalisation wavelength ${normalization.wavelengthNm} nm lies outside the range shared by the sample and its reference (${shortNm.toFixed(1)}–${longNm.toFixed(1)} nm)`,
        );
      }
      const unscaled = plain ?? processSample(1);
      const k = Math.round((e - from) / stepEv);
      if (!(Math.abs(unscaled.smoothed[k]!) > 0)) throw new RangeError('sample signal is zero at the normalisation wavelength');
      factor = r.smoothed[k]! / unscaled.smoothed[k]!;
      details = {
        ...details,
        applied: 'wavelength',
        factor,
        concentrationRatio: 1 / factor,
        reason: `scaled to the reference at ${normalization.wavelengthNm} nm, chosen by the caller`,
      };
      s = processSample(factor);
      break;
    }
    case 'auto': {
      const auto = r ? autoNormalization(technique, gridded.x, gridded.y, r, sampleNoise.sigma, derivativeWindowSize, thresholds) : null;
      if (auto && auto.fit) {
        factor = 1 / auto.fit.ratio;
        background = auto.fit.background;
        details = auto.details;
        concentrationFlag = auto.flag;
        s = processSample(factor, background);
      } else {
        if (auto) details = auto.details;
        else details.reason = 'no reference: nothing to scale against';
        s = plain ?? processSample(1);
      }
      break;
    }
  }
  warnings.push(...s.warnings.map((w) => `${sample.fileName}: ${w}`));
  if (r && ref) warnings.push(...r.warnings.map((w) => `${ref.fileName}: ${w}`));
  if (technique === 'pl' && !excitationNm)
    warnings.push('excitation wavelength unknown: an excitation or scatter line may be reported as a peak');

  // the sample's first exciton is the feature nearest the parent's (a new band below the gap is not it)
  const followParent = (p: ProcessedSpectrum): ProcessedSpectrum => {
    if (!r?.firstExciton || !p.firstExciton) return p;
    const matched = matchFirstExciton(p.peaks, r.firstExciton.energyEv);
    if (!matched || matched === p.firstExciton) return p;
    warnings.push(
      `first exciton taken at ${matched.energyEv.toFixed(3)} eV, the feature nearest the parent's (${r.firstExciton.energyEv.toFixed(3)} eV); the lower-energy feature at ${p.firstExciton.energyEv.toFixed(3)} eV is not treated as the first exciton`,
    );
    return { ...p, firstExciton: matched };
  };
  s = followParent(s);

  // may the reference be compared with this sample at all? (before any band flag)
  let referenceMatch: ReferenceMatchReport | null = null;
  if (r && re) {
    const side = (p: ProcessedSpectrum, energy: Float64Array) => ({
      technique,
      rangeEv: [energy[0]!, energy[energy.length - 1]!] as const,
      bandEv: p.firstExciton?.energyEv ?? null,
      fwhmMeV: p.firstExciton?.fwhmMeV ?? null,
    });
    const verdict = checkReferenceMatch(side(s, se.energy), side(r, re.energy));
    referenceMatch = verdict.ok
      ? { ok: true, toleranceMeV: verdict.toleranceMeV, reason: null }
      : { ok: false, toleranceMeV: null, reason: verdict.reason };
    if (!verdict.ok) {
      warnings.push(`${verdict.reason}: no band flags raised`);
      if (factor !== 1 || background) {
        // the fit to a reference that does not match means nothing: report the sample as measured
        factor = 1;
        background = undefined;
        concentrationFlag = null;
        details = {
          requested: normalization.mode,
          applied: 'none',
          factor: 1,
          concentrationRatio: 1,
          concentrationRatioUncertainty: null,
          background: null,
          regionsEv: [],
          separation: null,
          scaleDetermined: true,
          reason: 'not scaled: the reference does not match this sample',
        };
        s = followParent(processSample(1));
      }
    }
  }

  const comparison =
    r && referenceMatch?.ok
      ? compareSpectra(s, r, {
          ...options,
          technique,
          thresholds,
          excitationNm,
          scaleRelativeUncertainty:
            details.concentrationRatioUncertainty !== null ? details.concentrationRatioUncertainty / details.concentrationRatio : 0,
          scaleUndetermined: !details.scaleDetermined,
        })
      : { flags: [], warnings: [], atmosphericBands: [] };
  warnings.push(...comparison.warnings);
  const flagList = concentrationFlag && referenceMatch?.ok ? [concentrationFlag, ...comparison.flags] : comparison.flags;

  if (technique === 'absorption' && s.firstExciton) warnings.push(...edgeWarnings(s));

  const derived = deriveQuantities({
    material: options.material,
    sizingModel: options.sizingModel,
    technique,
    firstExciton: s.firstExciton,
    peaks: s.peaks,
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
      normalization: { ...normalization, factor, details },
      darkLevel: {
        mode: darkLevel,
        sample: technique === 'pl' ? s.darkLevel : null,
        reference: technique === 'pl' && r ? r.darkLevel : null,
      },
      thresholds,
      pathLengthCm,
      excitationNm: excitationNm ?? null,
      material: options.material ?? null,
    },
    noise: {
      method:
        'white-noise-equivalent σ: 1.4826 × median |fourth differences| of B-point block means × √B / √70, B doubled while σ rises > 25 % (B ≤ smoothing window)',
      sigma: s.sigma,
      blockLength: s.noiseBlockLength,
      systematicRelative: SYSTEMATIC_RELATIVE,
      sigmaSmoothed: s.sigmaSmoothed,
      referenceSigma: r ? r.sigma : null,
    },
    peaks: s.peaks.map((p) => peakOut(p, technique)),
    firstExciton: fx ? peakOut(fx, technique) : null,
    referenceFirstExciton: r?.firstExciton ? peakOut(r.firstExciton, technique) : null,
    referenceMatch,
    atmosphericBands: comparison.atmosphericBands,
    flags: flagList,
    derived: derived.report,
    warnings,
  };
}
