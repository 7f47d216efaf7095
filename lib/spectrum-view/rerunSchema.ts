import { z } from "zod";
import { THRESHOLD_SPECS } from "@/lib/registry/flagKinds";
import { thresholdFieldsOf } from "@/lib/registry/derive";
import { thresholdSchema } from "@/lib/registry/schemas";
import { parseDecimal } from "@/lib/text/parseDecimal";
import {
  MAX_CONCENTRATION_RATIO,
  NORMALIZATION_MODES,
  NORMALIZATION_WAVELENGTH_NM,
  concentrationRatioInRange,
} from "@/lib/ingest/normalization";

// The re-run form, parsed with the same schema in the browser (before sending) and in the server
// action. Empty fields keep the earlier run's value. Field names are the form's input names.

const blank = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);
const numberField = (label: string) =>
  z.preprocess(
    (v) => {
      const b = blank(v);
      return typeof b === "string" ? parseDecimal(b) : b;
    },
    z
      .number({ error: `${label} must be a number` })
      .refine(Number.isFinite, `${label} must be a number`)
      .optional(),
  );

/** One field per threshold of the flag-kind registry (name, label, default hint, bounds). */
export const THRESHOLD_FIELDS = thresholdFieldsOf(THRESHOLD_SPECS);

export const rerunFormSchema = z
  .object({
    spectrumId: z.string().uuid("spectrumId must be a spectrum id"),
    smoothingWindow: numberField("Smoothing window").pipe(
      z
        .number()
        .int("Smoothing window must be a whole number of points")
        .min(5, "Smoothing window must be at least 5 points")
        .max(301, "Smoothing window must be at most 301 points")
        .refine((n) => n % 2 === 1, "Smoothing window must be an odd number of points")
        .optional(),
    ),
    smoothingPolynomial: numberField("Polynomial order").pipe(
      z
        .number()
        .int("Polynomial order must be a whole number")
        .min(2, "Polynomial order must be at least 2")
        .max(6, "Polynomial order must be at most 6")
        .optional(),
    ),
    baseline: z.preprocess(blank, z.enum(["none", "offset", "scatter"], { error: "Baseline must be none, offset or scatter" }).optional()),
    /** Sent only when the parent picker changed: a spectrum id, or "none" for no parent. */
    referenceSpectrumId: z.preprocess(
      blank,
      z.union([z.literal("none"), z.string().uuid("Parent reference must be one of the listed spectra")]).optional(),
    ),
    ...Object.fromEntries(
      THRESHOLD_FIELDS.map((f) => [
        f.name,
        numberField(f.label).pipe(
          thresholdSchema(
            THRESHOLD_SPECS.find((t) => t.name === f.name)!,
            f.label,
          ).optional(),
        ),
      ]),
    ),
    normalizationMode: z.preprocess(
      blank,
      z.enum(NORMALIZATION_MODES, { error: "Normalisation must be automatic, none, at a wavelength or by concentration" }).optional(),
    ),
    normalizationWavelengthNm: numberField("Wavelength"),
    sampleConcentration: numberField("Sample concentration"),
    referenceConcentration: numberField("Reference concentration"),
  })
  .superRefine((v, ctx) => {
    const w = v.smoothingWindow as number | undefined;
    const p = v.smoothingPolynomial as number | undefined;
    if (w !== undefined && p !== undefined && p >= w) {
      ctx.addIssue({
        code: "custom",
        path: ["smoothingPolynomial"],
        message: "Polynomial order must be smaller than the smoothing window",
      });
    }
    for (const issue of normalizationIssues(v)) ctx.addIssue({ code: "custom", ...issue });
  });

/** The normalisation fields that the chosen mode needs, checked against the API's bounds (lib/ingest/normalization.ts). */
function normalizationIssues(v: {
  normalizationMode?: string;
  normalizationWavelengthNm?: number;
  sampleConcentration?: number;
  referenceConcentration?: number;
}): { path: string[]; message: string }[] {
  const issues: { path: string[]; message: string }[] = [];
  if (v.normalizationMode === "wavelength") {
    const { min, max } = NORMALIZATION_WAVELENGTH_NM;
    const nm = v.normalizationWavelengthNm;
    if (nm === undefined)
      issues.push({ path: ["normalizationWavelengthNm"], message: "Enter the wavelength to scale the sample to its reference at" });
    else if (nm < min || nm > max)
      issues.push({ path: ["normalizationWavelengthNm"], message: `Wavelength must lie between ${min} and ${max} nm` });
  }
  if (v.normalizationMode === "concentration") {
    const fields = [
      ["sampleConcentration", "Sample concentration", v.sampleConcentration],
      ["referenceConcentration", "Reference concentration", v.referenceConcentration],
    ] as const;
    for (const [name, label, value] of fields) {
      if (value === undefined) issues.push({ path: [name], message: `Enter the ${label.toLowerCase()}` });
      else if (!(value > 0)) issues.push({ path: [name], message: `${label} must be positive` });
    }
    const [s, r] = [v.sampleConcentration, v.referenceConcentration];
    if (issues.length === 0 && s !== undefined && r !== undefined && !concentrationRatioInRange(s, r)) {
      issues.push({
        path: ["referenceConcentration"],
        message: `The two concentrations must lie within a factor of ${MAX_CONCENTRATION_RATIO} of each other`,
      });
    }
  }
  return issues;
}

export type RerunForm = z.output<typeof rerunFormSchema>;

/** The form's values as requestReanalysis changes (lib/ingest/parameters.ts reanalysisSchema). */
export function toReanalysisChanges(v: RerunForm): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  if (v.smoothingWindow !== undefined) out.smoothingWindow = v.smoothingWindow;
  if (v.smoothingPolynomial !== undefined) out.smoothingPolynomial = v.smoothingPolynomial;
  if (v.referenceSpectrumId !== undefined) out.referenceSpectrumId = v.referenceSpectrumId === "none" ? null : v.referenceSpectrumId;
  if (v.baseline !== undefined) out.baseline = v.baseline;
  const thresholds: Record<string, number> = {};
  for (const f of THRESHOLD_FIELDS) {
    const t = (v as Record<string, unknown>)[f.name];
    if (typeof t === "number") thresholds[f.name] = t;
  }
  if (Object.keys(thresholds).length) out.thresholds = thresholds;
  const normalization = normalizationChange(v);
  if (normalization) out.normalization = normalization;
  return out;
}

function normalizationChange(v: RerunForm): Record<string, unknown> | undefined {
  switch (v.normalizationMode) {
    case "auto":
      return { mode: "auto" };
    case "none":
      return { mode: "none" };
    case "wavelength":
      return { mode: "wavelength", wavelengthNm: v.normalizationWavelengthNm };
    case "concentration":
      return { mode: "concentration", sampleConcentration: v.sampleConcentration, referenceConcentration: v.referenceConcentration };
    default:
      return undefined;
  }
}

/** Where an API field of a refusal (requestReanalysis) is shown in the form, and its message without the field name. */
export function formFieldOf(apiField: string | undefined, message: string): { field: string | undefined; message: string } {
  if (!apiField) return { field: undefined, message };
  const bare = message.startsWith(`${apiField}: `) ? message.slice(apiField.length + 2) : message;
  if (apiField.startsWith("thresholds.")) return { field: apiField.slice("thresholds.".length), message };
  if (apiField === "normalization.wavelengthNm") return { field: "normalizationWavelengthNm", message: `Wavelength ${bare}` };
  if (apiField === "normalization.sampleConcentration") return { field: "sampleConcentration", message: `Sample concentration ${bare}` };
  if (apiField === "normalization.referenceConcentration")
    return { field: "referenceConcentration", message: `Reference concentration ${bare}` };
  if (apiField.startsWith("normalization")) return { field: "normalizationMode", message: `Normalisation ${bare}` };
  return { field: apiField, message };
}

/** Field errors of a failed parse, keyed by input name (the same shape protectedAction returns). */
export function fieldErrorsOf(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) (out[issue.path.join(".") || "form"] ??= []).push(issue.message);
  return out;
}
