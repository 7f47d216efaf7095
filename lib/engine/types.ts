import type { AnalysisThresholds, FlagKind, FlagUnit } from '../registry/flagKinds';
import type { BandRole, Technique } from '../registry/techniques';

export type XUnit = 'nm' | 'um' | 'cm-1' | 'eV';
export type YUnit = 'absorbance' | 'percent-transmittance' | 'counts';
// Kinds, techniques and thresholds are written once, in lib/registry; re-exported here so the
// engine's imports keep working.
export type { AnalysisThresholds, BandRole, FlagKind, FlagUnit, Technique };
export type MaterialName = 'CdSe' | 'CdTe' | 'CdS' | 'PbS' | 'PbSe';
/** How the table of a text or spreadsheet file is laid out. */
export type TableLayout = 'x-then-y' | 'pairs' | 'blocks';
/** Where the X unit came from: the file's own text, the values (see inferXUnit), or the person's choice. */
export type UnitSource = 'file' | 'values' | 'chosen';

/** One Y series a file offers: a Y column, the Y of one X,Y pair, or a Y column of one block. */
export interface TraceInfo {
  /** 1-based block number (blocks follow one another, each with its own header). */
  block: number;
  /** 1-based pair number when the block is laid out as X,Y pairs side by side. */
  pair?: number;
  /** Zero-based column index of the Y values in the block. */
  column: number;
  /** Zero-based column index of the X values this Y goes with. */
  xColumn: number;
  /** The column's header text (or "column N"). */
  name: string;
  /** Header with its group-header line, e.g. "Probe A / Absorbance"; unique within the file's choices. */
  label: string;
  group?: string;
  /** A series value written in the header ("0.5 eq", "10 µM", "t = 30 s"). */
  seriesValue?: { value: number; unit: string };
}

export interface ParseOptions {
  /** Y column to use: a header name, or a zero-based column index in the file (0 is the X column, so 1 is the first Y column). Default: the first Y column. */
  column?: string | number;
  /** X unit when the file does not state one (or to override it). */
  xUnit?: XUnit;
  /** Y unit when the file does not state one (or to override it). */
  yUnit?: YUnit;
  /** 1-based block to read when the file holds several blocks one after another. Default 1. */
  block?: number;
  /** 1-based X,Y pair to read when the file holds pairs side by side (instead of `column`). */
  pair?: number;
  /** Spreadsheet sheet, by name or 1-based number. Default: the first sheet with a numeric table. */
  sheet?: string | number;
  /** Technique hint; used to infer the Y unit when nothing else states it. */
  technique?: Technique;
  /** Largest accepted file, bytes. Default 20 MiB (20 * 1024 * 1024). */
  maxBytes?: number;
  /** Longest accepted line, characters. Default 1 MiB (1024 * 1024). */
  maxLineLength?: number;
  /** Fewest accepted points. Default 16. */
  minPoints?: number;
}

export interface ParsedSpectrum {
  fileName: string;
  format: 'delimited' | 'jcamp-dx' | 'spreadsheet';
  // The members below are set by parseSpectrumFile; spectra built in code may leave them out.
  /** Text encoding the file was decoded from ("xlsx" for a spreadsheet). */
  encoding?: string;
  layout?: TableLayout;
  /** Where the X unit came from. */
  xUnitSource?: UnitSource;
  /** Every Y series the file offers (for column choice, previews and splitting a file). */
  traces?: TraceInfo[];
  /** 1-based block read. */
  block?: number;
  /** 1-based pair read, for a pairs layout. */
  pair?: number;
  /** Sheet read, and all sheet names, for a spreadsheet. */
  sheet?: string;
  sheets?: string[];
  /** X in the file's own unit, sorted ascending, duplicates averaged. */
  x: Float64Array;
  /** Y matching x. */
  y: Float64Array;
  xUnit: XUnit;
  yUnit: YUnit;
  /** Order of X in the file as written. */
  xOrderInFile: 'ascending' | 'descending';
  /** Technique guessed from units, header text and file name. */
  technique: Technique;
  /** Name of the Y column used (header text, or "column N"). */
  columnName: string;
  /** Zero-based index of the Y column used. */
  columnIndex: number;
  /** All Y column names available in the file. */
  availableColumns: string[];
  /** Header and footer key/value pairs found in the file (keys as written, trimmed). */
  metadata: Record<string, string>;
  /** Optical path length in cm, when the file states it. */
  pathLengthCm?: number;
  /** Excitation wavelength in nm, when the file (or its name) states it. */
  excitationNm?: number;
  warnings: string[];
}

export type Normalization =
  | { mode: 'auto' }
  | { mode: 'none' }
  | { mode: 'wavelength'; wavelengthNm: number }
  | { mode: 'concentration'; sampleConcentration: number; referenceConcentration: number };

export interface AnalysisOptions {
  technique?: Technique;
  material?: MaterialName;
  /** CdSe sizing curve. Default 'yu2003'. */
  sizingModel?: 'yu2003' | 'jasieniak2009';
  pathLengthCm?: number;
  excitationNm?: number;
  /** Savitzky–Golay window (odd, ≥ 5). Default chosen from the data. */
  smoothingWindow?: number;
  /** Savitzky–Golay window for first and second derivatives (odd, ≥ 5). Default chosen from the data (spans ~80 meV; ~8 meV for IR). */
  derivativeWindow?: number;
  /** Savitzky–Golay polynomial order. Default 2. */
  smoothingPolynomial?: number;
  /** Baseline treatment. Default 'offset' for absorption, 'none' otherwise. */
  baseline?: 'none' | 'offset' | 'scatter';
  normalization?: Normalization;
  thresholds?: Partial<AnalysisThresholds>;
  /** Half-width of the region around the excitation line excluded from PL integrals, nm. Default 10. */
  excitationExclusionNm?: number;
  /**
   * Absorbances (1 cm path as measured) for comparing PL per absorbed photon: total absorbance at the
   * excitation and at the emission band, of the sample and of the reference.
   */
  sampleAbsorbanceAtExcitation?: number;
  referenceAbsorbanceAtExcitation?: number;
  sampleAbsorbanceAtEmission?: number;
  referenceAbsorbanceAtEmission?: number;
  /**
   * Absorbance of the dots alone at the excitation, when a quencher or titrant also absorbs there
   * (sample; reference). Default: the total absorbance at the excitation.
   */
  sampleDotsAbsorbanceAtExcitation?: number;
  referenceDotsAbsorbanceAtExcitation?: number;
  /** Apply the inner-filter correction even when an absorbance exceeds 0.3. Default false. */
  forceInnerFilterCorrection?: boolean;
  /** PL dark level: 'auto' subtracts a constant (in counts per wavelength unit) fitted on the band-free ends. Default 'auto'. */
  darkLevel?: 'auto' | 'none';
  /** Points of the uniform energy grid. Default: the number of input points in range (at least 64). */
  gridPoints?: number;
}

export interface PeakReport {
  kind: 'maximum' | 'shoulder';
  energyEv: number;
  wavelengthNm: number;
  /** Smoothed, baseline-corrected signal at the peak. */
  height: number;
  /** Height of the band above its local surroundings (prominence for maxima, Gaussian amplitude from the second derivative for shoulders). */
  amplitude: number;
  fwhmMeV: number | null;
  /** Gaussian-equivalent area, amplitude × FWHM × 1.0645, in signal·eV. */
  area: number | null;
  significance: number;
  /** What the band is, in the words of its technique. */
  bandRole: BandRole;
}

export interface FlagReport {
  kind: FlagKind;
  energyEv: number | null;
  wavelengthNm: number | null;
  fraction: number | null;
  shiftMeV: number | null;
  fwhmChangeMeV: number | null;
  /** The flag's magnitude in its own unit (fraction, meV, signal units or a dimensionless ratio). */
  magnitude: number;
  unit: FlagUnit;
  /** Standard uncertainty of magnitude, from the noise estimate. */
  uncertainty: number;
  /** |magnitude| / uncertainty. */
  significance: number;
  intraband?: boolean;
  /** new-band and band-change: what the band is (intraband candidates are broad new mid-IR bands). */
  bandRole?: BandRole;
  /** new-band: FWHM of the band in the unexplained difference, meV (null when not measurable). */
  widthMeV?: number | null;
  message: string;
}

/** How the sample was scaled and its background removed before the comparison. */
export interface NormalizationReport {
  /** What was asked for. */
  requested: Normalization['mode'];
  /** What was applied ('auto' resolves to 'fit' or 'none'). */
  applied: 'fit' | 'none' | 'wavelength' | 'concentration';
  /** The sample is multiplied by this factor (after any background is subtracted) before the comparison. */
  factor: number;
  /** Sample/reference concentration ratio (1/factor), with its standard uncertainty when fitted. */
  concentrationRatio: number;
  concentrationRatioUncertainty: number | null;
  /** Fitted smooth background subtracted from the sample (signal units; E in eV): offset + slope·E + scatter·(E/centreEv)^scatterPower. */
  background: { offset: number; slope: number; centreEv: number; scatter: number; scatterPower: number | null } | null;
  /** Energy ranges the fit used, eV. */
  regionsEv: Array<[number, number]>;
  /**
   * 'auto' only: how well the fit told the scale from the background. `scaleInflation` is the
   * variance inflation factor of the ratio in the model used (accepted up to `maxScaleInflation`),
   * `terms` the smooth terms kept besides the offset, `droppedTerms` those left out because the
   * data could not tell them from the scale and did not need them. Null when no fit ran.
   */
  separation: {
    scaleInflation: number;
    maxScaleInflation: number;
    terms: Array<'slope' | 'scatter' | 'shift'>;
    droppedTerms: Array<'slope' | 'scatter' | 'shift'>;
  } | null;
  /**
   * False when 'auto' was asked but the fitted ratio cannot be used (scale and background not
   * separable, or too uncertain): flags whose size depends on the scale (bleach, new band) are then
   * withheld, and a warning says so. True otherwise.
   */
  scaleDetermined: boolean;
  /** Why this choice. */
  reason: string;
}

export interface DispersionReport {
  /** Low-energy half width at half maximum of the first exciton, meV. */
  hwhmMeV: number;
  /** σ_E = HWHM/√(2 ln 2), meV. */
  sigmaEnergyMeV: number;
  /** σ_D = σ_E/|dE/dD| from the sizing curve, nm. */
  sigmaDiameterNm: number;
  /** σ_D/D. */
  relative: number;
}

export interface TransitionReport {
  energyEv: number;
  wavelengthNm: number;
  kind: 'maximum' | 'shoulder';
}

export interface DerivedReport {
  material: MaterialName | null;
  diameterNm: number | null;
  concentrationMolPerL: number | null;
  extinctionPerMPerCm: number | null;
  molarMassGPerMol: number | null;
  sizingSource: string | null;
  /** Size dispersion from the first exciton's low-energy half width and the sizing curve's slope. */
  sizeDispersion: DispersionReport | null;
  /** CdSe: the other sizing model's diameter and extinction, and whether the two agree within their stated uncertainty. */
  alternativeSizing: { source: string; diameterNm: number; extinctionPerMPerCm: number; agrees: boolean } | null;
  /** Excitonic transitions above the first exciton (absorption). */
  higherTransitions: TransitionReport[];
  /** First-exciton absorbance over the absorbance at the valley above it (absorption maxima only). */
  firstExcitonPeakToValley: number | null;
}

/** Whether the reference may be compared with the sample at all (lib/engine/compare/checkReferenceMatch.ts). */
export interface ReferenceMatchReport {
  ok: boolean;
  toleranceMeV: number | null;
  reason: string | null;
}

export interface SpectrumSummary {
  fileName: string;
  columnName: string;
  points: number;
  xUnit: XUnit;
  yUnit: YUnit;
  xMin: number;
  xMax: number;
}

export interface AnalysisReport {
  technique: Technique;
  engineVersion: string;
  sample: SpectrumSummary;
  reference: SpectrumSummary | null;
  parameters: {
    grid: { points: number; minEv: number; maxEv: number; stepMeV: number };
    smoothing: { method: 'savitzky-golay'; windowSize: number; derivativeWindowSize: number; polynomial: number; edges: 'polynomial-fit' };
    baseline: { mode: 'none' | 'offset' | 'scatter'; applied: boolean };
    normalization: Normalization & { factor: number; details: NormalizationReport };
    darkLevel: { mode: 'auto' | 'none'; sample: number | null; reference: number | null };
    thresholds: AnalysisThresholds;
    pathLengthCm: number | null;
    excitationNm: number | null;
    material: MaterialName | null;
  };
  noise: {
    method: string;
    /** White-noise-equivalent noise σ per point of the gridded sample. */
    sigma: number;
    /** Block length (grid points) at which σ was taken (1 for white noise). */
    blockLength: number;
    /** Relative systematic standard uncertainty added to fractional quantities and new-band heights (0.005). */
    systematicRelative: number;
    sigmaSmoothed: number;
    referenceSigma: number | null;
  };
  peaks: PeakReport[];
  firstExciton: (PeakReport & { energyEv: number; wavelengthNm: number; fwhmMeV: number | null }) | null;
  referenceFirstExciton: PeakReport | null;
  /** null without a reference. When not ok, no flags are raised. */
  referenceMatch: ReferenceMatchReport | null;
  /** Mid-IR: atmospheric bands inside the range (CO₂ always masked; water-vapour lines masked when seen). */
  atmosphericBands: Array<{ name: string; fromCm1: number; toCm1: number; present: boolean; masked: boolean }>;
  flags: FlagReport[];
  derived: DerivedReport;
  warnings: string[];
}
