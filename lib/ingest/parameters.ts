import { sha256Hex } from "@/lib/hash";
import { columnNameSchema } from "@/lib/text/plainText";
import { z } from "zod";
import { X_UNIT_NAMES, Y_KIND_NAMES, type ReadChoice, type YKind } from "@/lib/engine/parse/readChoice";
import type { XUnit } from "@/lib/engine/types";
import { canonicalJson } from "./canonicalJson";
import { INGEST_MATERIALS, INGEST_TECHNIQUES } from "./metadata";
import { THRESHOLD_NAMES, THRESHOLD_SPECS, type ThresholdName } from "@/lib/registry/flagKinds";
import { thresholdsSchemaOf } from "@/lib/registry/schemas";
import { normalizationSchema, type NormalizationParameter } from "./normalization";

/**
 * Everything that decides what one analysis run computes, besides the raw bytes, the
 * reference and the engine version. Stored on the run (`parameters`) and hashed into
 * `parameter_hash`; the worker turns it into parse and analysis options.
 */
export type AnalysisParameters = {
  technique: (typeof INGEST_TECHNIQUES)[number];
  column?: string | number;
  /** How to read the file besides the column (see ReadChoice); absent means "as the file says". */
  block?: number;
  pair?: number;
  sheet?: string;
  xUnit?: XUnit;
  yKind?: YKind;
  material?: (typeof INGEST_MATERIALS)[number];
  pathLengthCm?: number;
  excitationNm?: number;
  smoothingWindow?: number;
  smoothingPolynomial?: number;
  baseline?: "none" | "offset" | "scatter";
  thresholds?: Partial<Record<ThresholdName, number>>;
  /**
   * Scaling of the sample against its reference. "auto" (the engine's default since engine 2) is
   * stored as absent; "none" is kept, so a run that asked for no scaling re-runs without it.
   */
  normalization?: Exclude<NormalizationParameter, { mode: "auto" }>;
};

/** One threshold per flag kind plus the general ones (lib/registry/flagKinds.ts). */
export { THRESHOLD_NAMES, type ThresholdName };

/** sha256 of the canonical JSON of the parameters and the reference spectrum id. */
export function parameterHash(parameters: AnalysisParameters, referenceSpectrumId: string | null): string {
  return sha256Hex(canonicalJson({ parameters, referenceSpectrumId }));
}

/** A column choice as typed by a person: digits mean a zero-based column index. */
export function columnChoice(raw: string | undefined): string | number | undefined {
  if (raw === undefined) return undefined;
  return /^\d+$/.test(raw) ? Number(raw) : raw;
}

/** The read choice stored with a run's parameters (the column included). */
export function readChoiceOf(parameters: Pick<AnalysisParameters, "column" | "block" | "pair" | "sheet" | "xUnit" | "yKind">): ReadChoice {
  const out: ReadChoice = {};
  for (const key of ["column", "block", "pair", "sheet", "xUnit", "yKind"] as const) {
    if (parameters[key] !== undefined) (out as Record<string, unknown>)[key] = parameters[key];
  }
  return out;
}

/** Guesses the engine's material name from a sample's free-text material ("CdSe/ZnS" → CdSe). */
export function materialFromText(text: string | null | undefined): AnalysisParameters["material"] {
  if (!text) return undefined;
  const core =
    text
      .split(/[\/\s,;(]/)[0]
      ?.trim()
      .toLowerCase() ?? "";
  return INGEST_MATERIALS.find((m) => m.toLowerCase() === core);
}

const thresholdsSchema = thresholdsSchemaOf(THRESHOLD_SPECS);

const positive = (label: string) => z.number({ error: `${label} must be a number` }).positive(`${label} must be positive`);

/** Changes a person may ask for when re-running an analysis; absent members keep the earlier value, null clears. */
export const reanalysisSchema = z
  .object({
    column: z
      .union([columnNameSchema, z.number().int().min(1)])
      .nullable()
      .optional(),
    material: z.enum(INGEST_MATERIALS).nullable().optional(),
    block: z.number().int().min(1).max(1000).nullable().optional(),
    pair: z.number().int().min(1).max(1000).nullable().optional(),
    sheet: z.string().trim().min(1).max(100).nullable().optional(),
    xUnit: z
      .enum(X_UNIT_NAMES, { error: `xUnit must be one of ${X_UNIT_NAMES.join(", ")}` })
      .nullable()
      .optional(),
    yKind: z
      .enum(Y_KIND_NAMES, { error: `yKind must be one of ${Y_KIND_NAMES.join(", ")}` })
      .nullable()
      .optional(),
    pathLengthCm: positive("pathLengthCm").max(100).nullable().optional(),
    excitationNm: positive("excitationNm").min(100).max(3000).nullable().optional(),
    smoothingWindow: z
      .number()
      .int()
      .min(5, "smoothingWindow must be at least 5")
      .max(301, "smoothingWindow must be at most 301")
      .refine((n) => n % 2 === 1, "smoothingWindow must be odd")
      .nullable()
      .optional(),
    smoothingPolynomial: z.number().int().min(1).max(6).nullable().optional(),
    baseline: z.enum(["none", "offset", "scatter"]).nullable().optional(),
    thresholds: thresholdsSchema.optional(),
    normalization: normalizationSchema.nullable().optional(),
    referenceSpectrumId: z.string().uuid("referenceSpectrumId must be an id (UUID)").nullable().optional(),
  })
  .strict();

export type ReanalysisInput = z.input<typeof reanalysisSchema>;

/**
 * Applies re-analysis overrides to earlier parameters; returns new parameters without undefined
 * members. Normalisation `{ mode: "auto" }` clears it like null, so "auto" and "never set" hash alike.
 */
export function mergeParameters(base: AnalysisParameters, changes: z.output<typeof reanalysisSchema>): AnalysisParameters {
  const out: Record<string, unknown> = { ...base };
  for (const [key, value] of Object.entries(changes)) {
    if (key === "referenceSpectrumId" || value === undefined) continue;
    if (value === null || (key === "normalization" && (value as { mode: string }).mode === "auto")) delete out[key];
    else if (key === "thresholds") out.thresholds = { ...(base.thresholds ?? {}), ...(value as object) };
    else out[key] = value;
  }
  return JSON.parse(canonicalJson(out)) as AnalysisParameters;
}
