import { z } from "zod";

// The re-run form, parsed with the same schema in the browser (before sending) and in the server
// action. Empty fields keep the earlier run's value. Field names are the form's input names.

const blank = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);
const numberField = (label: string) =>
  z.preprocess(
    (v) => {
      const b = blank(v);
      return typeof b === "string" ? Number(b.trim().replace(",", ".")) : b;
    },
    z.number({ error: `${label} must be a number` }).refine(Number.isFinite, `${label} must be a number`).optional(),
  );

export const THRESHOLD_FIELDS = [
  { name: "minSignificance", label: "Least significance (σ)", hint: "default 5" },
  { name: "minBleachFraction", label: "Least bleach (fraction)", hint: "default 0.05" },
  { name: "minQuenchFraction", label: "Least PL quench (fraction)", hint: "default 0.10" },
  { name: "minShiftMeV", label: "Least shift (meV)", hint: "default 3" },
  { name: "minBroadeningFraction", label: "Least broadening (fraction)", hint: "default 0.10" },
  { name: "minNewBandFraction", label: "Least new band (fraction of 1st exciton)", hint: "default 0.03" },
] as const;

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
      z.number().int("Polynomial order must be a whole number").min(2, "Polynomial order must be at least 2").max(6, "Polynomial order must be at most 6").optional(),
    ),
    baseline: z.preprocess(blank, z.enum(["none", "offset", "scatter"], { error: "Baseline must be none, offset or scatter" }).optional()),
    ...Object.fromEntries(
      THRESHOLD_FIELDS.map((f) => [
        f.name,
        numberField(f.label).pipe(
          f.name === "minSignificance" || f.name === "minShiftMeV"
            ? z.number().positive(`${f.label} must be positive`).max(1000, `${f.label} must be at most 1000`).optional()
            : z.number().positive(`${f.label} must be positive`).max(1, `${f.label} must be at most 1`).optional(),
        ),
      ]),
    ),
  })
  .superRefine((v, ctx) => {
    const w = v.smoothingWindow as number | undefined;
    const p = v.smoothingPolynomial as number | undefined;
    if (w !== undefined && p !== undefined && p >= w) {
      ctx.addIssue({ code: "custom", path: ["smoothingPolynomial"], message: "Polynomial order must be smaller than the smoothing window" });
    }
  });

export type RerunForm = z.output<typeof rerunFormSchema>;

/** The form's values as requestReanalysis changes (lib/ingest/parameters.ts reanalysisSchema). */
export function toReanalysisChanges(v: RerunForm): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  if (v.smoothingWindow !== undefined) out.smoothingWindow = v.smoothingWindow;
  if (v.smoothingPolynomial !== undefined) out.smoothingPolynomial = v.smoothingPolynomial;
  if (v.baseline !== undefined) out.baseline = v.baseline;
  const thresholds: Record<string, number> = {};
  for (const f of THRESHOLD_FIELDS) {
    const t = (v as Record<string, unknown>)[f.name];
    if (typeof t === "number") thresholds[f.name] = t;
  }
  if (Object.keys(thresholds).length) out.thresholds = thresholds;
  return out;
}

/** Field errors of a failed parse, keyed by input name (the same shape protectedAction returns). */
export function fieldErrorsOf(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) (out[issue.path.join(".") || "form"] ??= []).push(issue.message);
  return out;
}
