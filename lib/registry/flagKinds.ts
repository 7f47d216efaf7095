// The flag kinds the engine raises, written once. The TypeScript union, the zod and OpenAPI
// enums, the threshold names, defaults, bounds and form fields, the labels, marker colours and
// the database's CHECK constraint all derive from FLAG_KIND_SPECS (see lib/registry/derive.ts).
// Plain data and pure functions only: the engine (lib/engine) imports this module.

import { keysOf, mapOf, thresholdDefaultsOf, thresholdSpecsOf, type KeyOf, type ThresholdNameOf } from "./derive";
import type { Technique } from "./techniques";

/** Units of a flag's magnitude as the engine reports it. */
export const FLAG_UNITS = ["fraction", "meV", "signal", "ratio"] as const;
export type FlagUnit = (typeof FLAG_UNITS)[number];

/** Unit of a threshold as a person types it. */
export type ThresholdUnit = "fraction" | "meV" | "sigma";

export interface ThresholdSpec {
  /** The name in AnalysisThresholds, the API's `thresholds` object and the re-run form. */
  name: string;
  /** Label of the form field. */
  label: string;
  default: number;
  /** Accepted values lie in (min, max]: every threshold is positive. */
  min: number;
  max: number;
  unit: ThresholdUnit;
}

export interface KindSpec {
  /** What the review queue, the viewer and mails call the kind when the technique is not known (filters, lists of kinds). */
  label: string;
  /** The kind's name on a spectrum of one technique, where the trade says it otherwise ("Emission shift" in PL). */
  labelByTechnique?: Partial<Record<Technique, string>>;
  /** Marker and swatch colour in the viewer (our own palette). */
  colour: string;
  /** Unit of the magnitude the engine reports for this kind. */
  unit: FlagUnit;
  /** Write a "+" before a positive magnitude (a direction matters: shifts, width changes). */
  signed: boolean;
  /** Word written after the magnitude ("FWHM"), if any. */
  suffix?: string;
  threshold: ThresholdSpec;
  /** A series chart can plot this kind's magnitude point by point. */
  seriesPlot: boolean;
  /** One line for the docs and the OpenAPI description. */
  description: string;
}

/** Thresholds that belong to no one kind. */
export const GENERAL_THRESHOLDS = {
  minSignificance: { name: "minSignificance", label: "Least significance (σ)", default: 5, min: 0, max: 1000, unit: "sigma" },
} as const satisfies Record<string, ThresholdSpec>;

export const FLAG_KIND_SPECS = {
  bleach: {
    label: "Exciton bleach",
    colour: "#b7791f",
    unit: "fraction",
    signed: false,
    threshold: { name: "minBleachFraction", label: "Least bleach (fraction)", default: 0.05, min: 0, max: 1, unit: "fraction" },
    seriesPlot: true,
    description: "the first-exciton band lost a fraction of its height that a change of concentration does not explain",
  },
  "new-band": {
    label: "New band",
    colour: "#2f8a5b",
    unit: "signal",
    signed: false,
    threshold: {
      name: "minNewBandFraction",
      label: "Least new band (fraction of 1st exciton)",
      default: 0.03,
      min: 0,
      max: 1,
      unit: "fraction",
    },
    seriesPlot: true,
    description: "a band absent from the reference appeared (height in signal units)",
  },
  "pl-quench": {
    label: "PL quench",
    colour: "#7c3aed",
    unit: "fraction",
    signed: false,
    threshold: { name: "minQuenchFraction", label: "Least PL quench (fraction)", default: 0.1, min: 0, max: 1, unit: "fraction" },
    seriesPlot: true,
    description: "the integrated emission fell by a fraction, after the absorbed-light and inner-filter corrections",
  },
  shift: {
    label: "Shift",
    labelByTechnique: { absorption: "Exciton shift", pl: "Emission shift", ir: "Band shift" },
    colour: "#0e7490",
    unit: "meV",
    signed: true,
    threshold: { name: "minShiftMeV", label: "Least shift (meV)", default: 3, min: 0, max: 1000, unit: "meV" },
    seriesPlot: true,
    description: "the first exciton (or emission maximum) moved; negative is a red shift",
  },
  broadening: {
    label: "Broadening",
    labelByTechnique: { absorption: "Exciton broadening", pl: "Emission broadening", ir: "Band broadening" },
    colour: "#be185d",
    unit: "meV",
    signed: true,
    suffix: "FWHM",
    threshold: { name: "minBroadeningFraction", label: "Least broadening (fraction)", default: 0.1, min: 0, max: 1, unit: "fraction" },
    seriesPlot: true,
    description: "the first-exciton (or emission) FWHM changed; negative is a narrowing",
  },
  concentration: {
    label: "Concentration ratio",
    colour: "#475569",
    unit: "ratio",
    signed: false,
    threshold: {
      name: "minConcentrationChange",
      label: "Least concentration change (|ratio − 1|)",
      default: 0.05,
      min: 0,
      max: 1,
      unit: "fraction",
    },
    seriesPlot: true,
    description: "the sample/reference concentration ratio found when the reference is scaled to the sample (never a bleach)",
  },
  "band-change": {
    label: "Band changed",
    colour: "#9a3412",
    unit: "fraction",
    signed: true,
    threshold: { name: "minBandChangeFraction", label: "Least band change (fraction)", default: 0.2, min: 0, max: 10, unit: "fraction" },
    seriesPlot: false,
    description: "a band present in the reference grew or shrank: sample/reference band ratio − 1",
  },
} as const satisfies Record<string, KindSpec>;

export type FlagKind = keyof typeof FLAG_KIND_SPECS;

/** Names of every analysis threshold: the general ones, then one per kind. */
export type ThresholdName = ThresholdNameOf<typeof GENERAL_THRESHOLDS, typeof FLAG_KIND_SPECS>;

/** The engine's thresholds: one number per name. */
export type AnalysisThresholds = Record<ThresholdName, number>;

/** Everything derived from a flag-kind registry; tests call it with an extended registry. */
export function flagKindRegistry<G extends Record<string, ThresholdSpec>, S extends Record<string, KindSpec>>(general: G, specs: S) {
  type Kind = KeyOf<S>;
  type Name = ThresholdNameOf<G, S>;
  const thresholdSpecs = thresholdSpecsOf(general, specs);
  return {
    /** Every kind, in the registry's order (lists, filters, the database check). */
    FLAG_KINDS: keysOf(specs),
    /** Every threshold's spec, general ones first, in registry order. */
    THRESHOLD_SPECS: thresholdSpecs,
    THRESHOLD_NAMES: thresholdSpecs.map((t) => t.name) as [Name, ...Name[]],
    /** Default thresholds (common practice; see docs/analysis-json.md). */
    DEFAULT_THRESHOLDS: Object.freeze(thresholdDefaultsOf(thresholdSpecs)) as Readonly<Record<Name, number>>,
    KIND_LABELS: mapOf(specs, "label") as Readonly<Record<Kind, string>>,
    FLAG_COLOURS: mapOf(specs, "colour") as Readonly<Record<Kind, string>>,
    /** The kind's name on a spectrum of `technique` (its general name when the technique is unknown). */
    kindLabel: (kind: Kind, technique?: string | null): string => {
      const spec: KindSpec = specs[kind];
      return (technique && spec.labelByTechnique?.[technique as Technique]) || spec.label;
    },
    /** Narrows a stored or received kind; unknown text is not a kind. */
    isFlagKind: (k: string): k is Kind => Object.hasOwn(specs, k),
  };
}

export const { FLAG_KINDS, THRESHOLD_SPECS, THRESHOLD_NAMES, DEFAULT_THRESHOLDS, KIND_LABELS, FLAG_COLOURS, kindLabel, isFlagKind } =
  flagKindRegistry(GENERAL_THRESHOLDS, FLAG_KIND_SPECS);
