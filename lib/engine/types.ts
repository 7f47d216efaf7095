export type XUnit = 'nm' | 'um' | 'cm-1' | 'eV';
export type YUnit = 'absorbance' | 'percent-transmittance' | 'counts';
export type Technique = 'absorption' | 'pl' | 'ir';
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

export interface AnalysisThresholds {
  /** Smallest significance (magnitude / standard uncertainty) for any flag or peak. Default 5. */
  minSignificance: number;
  /** Smallest bleach fraction flagged. Default 0.05. */
  minBleachFraction: number;
  /** Smallest PL quench fraction flagged. Default 0.10. */
  minQuenchFraction: number;
  /** Smallest |shift| flagged, meV. Default 3. */
  minShiftMeV: number;
  /** Smallest relative FWHM change flagged. Default 0.10. */
  minBroadeningFraction: number;
  /** Smallest new-band height, as a fraction of the reference's first-exciton (or maximum) signal. Default 0.03. */
  minNewBandFraction: number;
}

export type Normalization =
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
  /** Absorbances for PL corrections (absorbed fraction and inner filter). */
  sampleAbsorbanceAtExcitation?: number;
  referenceAbsorbanceAtExcitation?: number;
  sampleAbsorbanceAtEmission?: number;
  referenceAbsorbanceAtEmission?: number;
  /** Apply the inner-filter correction even when an absorbance exceeds 0.3. Default false. */
  forceInnerFilterCorrection?: boolean;
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
}

export type FlagKind = 'bleach' | 'new-band' | 'pl-quench' | 'shift' | 'broadening';

export interface FlagReport {
  kind: FlagKind;
  energyEv: number | null;
  wavelengthNm: number | null;
  fraction: number | null;
  shiftMeV: number | null;
  fwhmChangeMeV: number | null;
  /** The flag's magnitude in its own unit (fraction, meV, or signal units). */
  magnitude: number;
  unit: 'fraction' | 'meV' | 'signal';
  /** Standard uncertainty of magnitude, from the noise estimate. */
  uncertainty: number;
  /** |magnitude| / uncertainty. */
  significance: number;
  intraband?: boolean;
  message: string;
}

export interface DerivedReport {
  material: MaterialName | null;
  diameterNm: number | null;
  concentrationMolPerL: number | null;
  extinctionPerMPerCm: number | null;
  molarMassGPerMol: number | null;
  sizingSource: string | null;
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
    normalization: Normalization & { factor: number };
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
  flags: FlagReport[];
  derived: DerivedReport;
  warnings: string[];
}
