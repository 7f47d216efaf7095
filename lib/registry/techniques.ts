// The measurement techniques, written once. The TypeScript union, the upload and API enums, the
// database's CHECK constraint, labels, the viewer's default axis, the JCAMP-DX data type, the
// engine's per-technique defaults and the cautions shown all read from TECHNIQUE_SPECS, so code
// asks "does the Jacobian apply?" instead of "is this PL?".
// Plain data only: the engine (lib/engine) imports this module.

import { keysOf, mapOf, type KeyOf } from "./derive";

/** What a technique's bands are (labels in BAND_ROLE_LABELS). */
export type BandRole = "excitonic-transition" | "emission-band" | "vibrational-band" | "intraband-candidate";

export const BAND_ROLE_LABELS: Readonly<Record<BandRole, string>> = {
  "excitonic-transition": "Excitonic transition",
  "emission-band": "Emission band",
  "vibrational-band": "Vibrational band",
  "intraband-candidate": "Intraband candidate",
};

/** The same, for a list of several. */
export const BAND_ROLE_PLURALS: Readonly<Record<BandRole, string>> = {
  "excitonic-transition": "Excitonic transitions",
  "emission-band": "Emission bands",
  "vibrational-band": "Vibrational bands",
  "intraband-candidate": "Intraband candidates",
};

/**
 * The panels a series page draws point by point against the series variable (components/series):
 * the first exciton's bleach, the emission's Stern–Volmer plot (F₀/F against [Q]), the area of new
 * bands, and the shift of the first band (titled with the technique's firstBandLabel).
 */
export type SeriesPanel = "bleach" | "stern-volmer" | "new-band" | "shift";

/** Cautions a technique calls for (texts in lib/hazards.ts). */
export type TechniqueCaution = "uv-laser-light";

export interface TechniqueSpec {
  /** Full name (upload form, exports). */
  label: string;
  /** Short name for tables. */
  shortLabel: string;
  /** The viewer's default axis: wavelength for electronic spectra, wavenumber for vibrational ones. */
  defaultAxis: "nm" | "cm-1";
  /** Order in which the trade usually draws the default axis. */
  defaultDirection: "ascending" | "descending";
  /** Signal is a density per unit of the axis (emission counts), so the energy Jacobian applies when the axis changes (Mooney & Kambhampati, J. Phys. Chem. Lett. 2013, 4, 3316). */
  jacobian: boolean;
  /** Y unit assumed when the file states none. */
  defaultYUnit: "absorbance" | "counts";
  /** Word for the values in exports. */
  valueWord: "absorbance" | "counts";
  /** What its bands are called. */
  bandRole: BandRole;
  /** What "the first band" of a spectrum is: the lowest-energy excitonic peak, the emission maximum, or none. */
  firstExciton: "lowest-energy-peak" | "emission-maximum" | "none";
  /** How the first band's comparison is worded ("first exciton", "emission", "main band"). */
  firstBandWord: string;
  /** Plural used when two spectra's first bands are compared. */
  firstBandsWord: string;
  /** What the peak marked as the first band is called on screen ("first exciton", "emission maximum"). */
  firstBandLabel: string;
  /** The panels of a series of this technique, in order (a PL series has no bleach and no exciton shift). */
  seriesPlot: readonly SeriesPanel[];
  /** Span of the default smoothing window, meV (common practice: well under a band's width). */
  smoothingSpanMeV: number;
  /** Span of the default window for first and second derivatives, meV (common practice). */
  derivativeSpanMeV: number;
  /** Baseline treatment when none is asked for. */
  baseline: "offset" | "none";
  /** JCAMP-DX ##DATA TYPE (McDonald & Wilks, Appl. Spectrosc. 1988, 42, 151). */
  jcampDataType: string;
  /** Smallest relative amplitude a peak must have to be reported (emission: 1 % of the maximum, common practice). */
  minRelativePeakAmplitude: number;
  cautions: readonly TechniqueCaution[];
}

export const TECHNIQUE_SPECS = {
  absorption: {
    label: "UV-Vis-NIR absorption",
    shortLabel: "Absorption",
    defaultAxis: "nm",
    defaultDirection: "ascending",
    jacobian: false,
    defaultYUnit: "absorbance",
    valueWord: "absorbance",
    bandRole: "excitonic-transition",
    firstExciton: "lowest-energy-peak",
    firstBandWord: "first exciton",
    firstBandsWord: "first excitons",
    firstBandLabel: "first exciton",
    seriesPlot: ["bleach", "shift", "new-band"],
    smoothingSpanMeV: 25,
    derivativeSpanMeV: 80,
    baseline: "offset",
    jcampDataType: "UV/VIS SPECTRUM",
    minRelativePeakAmplitude: 0,
    cautions: [],
  },
  pl: {
    label: "Photoluminescence",
    shortLabel: "PL emission",
    defaultAxis: "nm",
    defaultDirection: "ascending",
    jacobian: true,
    defaultYUnit: "counts",
    valueWord: "counts",
    bandRole: "emission-band",
    firstExciton: "emission-maximum",
    firstBandWord: "emission",
    firstBandsWord: "emission maxima",
    firstBandLabel: "emission maximum",
    seriesPlot: ["stern-volmer", "shift"],
    smoothingSpanMeV: 25,
    derivativeSpanMeV: 80,
    baseline: "none",
    jcampDataType: "FLUORESCENCE SPECTRUM",
    minRelativePeakAmplitude: 0.01,
    cautions: ["uv-laser-light"],
  },
  ir: {
    label: "Mid-IR absorption",
    shortLabel: "Mid-IR",
    defaultAxis: "cm-1",
    defaultDirection: "descending",
    jacobian: false,
    defaultYUnit: "absorbance",
    valueWord: "absorbance",
    bandRole: "vibrational-band",
    firstExciton: "none",
    firstBandWord: "main band",
    firstBandsWord: "main bands",
    firstBandLabel: "main band",
    seriesPlot: ["new-band"],
    smoothingSpanMeV: 3,
    derivativeSpanMeV: 8,
    baseline: "none",
    jcampDataType: "INFRARED SPECTRUM",
    minRelativePeakAmplitude: 0,
    cautions: [],
  },
} as const satisfies Record<string, TechniqueSpec>;

export type Technique = keyof typeof TECHNIQUE_SPECS;

/** Everything derived from a technique registry; tests call it with an extended registry. */
export function techniqueRegistry<S extends Record<string, TechniqueSpec>>(specs: S) {
  type Name = KeyOf<S>;
  return {
    TECHNIQUES: keysOf(specs),
    TECHNIQUE_LABELS: mapOf(specs, "label") as Readonly<Record<Name, string>>,
    TECHNIQUE_SHORT_LABELS: mapOf(specs, "shortLabel") as Readonly<Record<Name, string>>,
    isTechnique: (t: string): t is Name => Object.hasOwn(specs, t),
    /** The spec of a stored or received technique; undefined for text that is not a technique. */
    techniqueSpec: (t: string): TechniqueSpec | undefined => (Object.hasOwn(specs, t) ? specs[t as Name] : undefined),
  };
}

export const { TECHNIQUES, TECHNIQUE_LABELS, TECHNIQUE_SHORT_LABELS, isTechnique, techniqueSpec } = techniqueRegistry(TECHNIQUE_SPECS);
