import { z } from "zod";
import { TECHNIQUES } from "@/lib/registry/techniques";
import { registryEnum } from "@/lib/registry/schemas";
import { parseDecimal } from "@/lib/text/parseDecimal";
import { columnNameSchema, isPlainText, plainTextMessage } from "@/lib/text/plainText";
import { X_UNIT_NAMES, Y_KIND_NAMES } from "@/lib/engine/parse/readChoice";

// The metadata that travels with an upload, checked with the same schema in the
// browser form, the HTTP API and the seed script. Every field arrives as a string from
// multipart forms, so numbers are coerced and an empty string means "not given".

/** The techniques an upload may name (lib/registry/techniques.ts). */
export const INGEST_TECHNIQUES = TECHNIQUES;
export const INGEST_MATERIALS = ["CdSe", "CdTe", "CdS", "PbS", "PbSe"] as const;

const blankToUndefined = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);

/** Form text to a number, strictly ("0x10" is not 16); anything else is passed on for zod to refuse. */
const strictNumber = (v: unknown) => (typeof v === "string" ? parseDecimal(v) : v);

function optionalText(label: string, max: number) {
  return z.preprocess(
    blankToUndefined,
    z.string().trim().max(max, `${label} is longer than ${max} characters`).refine(isPlainText, plainTextMessage(label)).optional(),
  );
}

function optionalNumber(label: string, min: number, max: number, unit: string) {
  return z.preprocess(
    (v) => strictNumber(blankToUndefined(v)),
    z
      .number({ error: `${label} must be a number` })
      .refine(Number.isFinite, `${label} must be a finite number`)
      .refine((n) => n > min && n <= max, `${label} must be above ${min} and at most ${max} ${unit}`)
      .optional(),
  );
}

const optionalCount = (label: string) =>
  z.preprocess(
    blankToUndefined,
    z.coerce
      .number({ error: `${label} must be a whole number` })
      .int(`${label} must be a whole number`)
      .min(1, `${label} counts from 1`)
      .max(1000)
      .optional(),
  );

const optionalId = (label: string) => z.preprocess(blankToUndefined, z.string().trim().uuid(`${label} must be an id (UUID)`).optional());

/** How to read a file (column, units, block, pair, sheet): shared by uploads and previews. */
export const readFields = {
  column: z.preprocess(blankToUndefined, columnNameSchema.optional()),
  xUnit: z.preprocess(blankToUndefined, z.enum(X_UNIT_NAMES, { error: `xUnit must be one of ${X_UNIT_NAMES.join(", ")}` }).optional()),
  yKind: z.preprocess(blankToUndefined, z.enum(Y_KIND_NAMES, { error: `yKind must be one of ${Y_KIND_NAMES.join(", ")}` }).optional()),
  block: optionalCount("block"),
  pair: optionalCount("pair"),
  sheet: optionalText("sheet", 100),
};

/** Whether to store every trace of the file (Y column, pair or block) as its own spectrum. */
const splitField = z.preprocess(
  blankToUndefined,
  z.enum(["all"], { error: 'split must be "all" (one spectrum per Y column, pair or block) or empty' }).optional(),
);

/** An import profile by name, or "none" for no profile; empty: the profile matching the file, if any (docs/ingest.md). */
const profileField = z.preprocess(
  blankToUndefined,
  z.string().trim().min(1).max(80, "profile is longer than 80 characters").refine(isPlainText, plainTextMessage("profile")).optional(),
);

/** One trace of a split file given its own sample or series value (or left out). */
const assignmentSchema = z
  .object({
    trace: z.string({ error: "assignments: each needs trace (a label from the preview's traces)" }).trim().min(1).max(300),
    sampleId: z.string().uuid("assignments: sampleId must be an id (UUID)").optional(),
    seriesValue: z
      .number({ error: "assignments: seriesValue must be a number" })
      .refine(Number.isFinite, "assignments: seriesValue must be finite")
      .optional(),
    skip: z.boolean().optional(),
  })
  .strict();
export type TraceAssignment = z.infer<typeof assignmentSchema>;

const assignmentsField = z.preprocess(
  (v) => {
    const b = blankToUndefined(v);
    if (typeof b !== "string") return b;
    try {
      return JSON.parse(b);
    } catch {
      return "not JSON";
    }
  },
  z.array(assignmentSchema, { error: "assignments must be a JSON array of {trace, sampleId?, seriesValue?, skip?}" }).max(500).optional(),
);

/** The fields of a preview: how to read the file, and the technique (which settles an unstated Y kind). */
export const previewFieldsSchema = z
  .object({
    projectId: z.preprocess(blankToUndefined, z.string({ error: "choose a project" }).trim().uuid("projectId must be an id (UUID)")),
    technique: z.preprocess(blankToUndefined, registryEnum("technique", INGEST_TECHNIQUES).optional()),
    /** For PL: keeps the excitation line out of the bands the preview reports (as the analysis does). */
    excitationNm: optionalNumber("excitationNm", 100, 3000, "nm"),
    ...readFields,
    split: splitField,
    profile: profileField,
  })
  .strict();
export const PREVIEW_FIELDS = [
  "projectId",
  "technique",
  "excitationNm",
  "column",
  "xUnit",
  "yKind",
  "block",
  "pair",
  "sheet",
  "split",
  "profile",
] as const;

export const ingestMetadataSchema = z
  .object({
    projectId: z.preprocess(blankToUndefined, z.string({ error: "choose a project" }).trim().uuid("projectId must be an id (UUID)")),
    technique: z.preprocess(blankToUndefined, registryEnum("technique", INGEST_TECHNIQUES)),
    sampleId: optionalId("sampleId"),
    referenceSpectrumId: optionalId("referenceSpectrumId"),
    seriesId: optionalId("seriesId"),
    seriesValue: z.preprocess(
      (v) => strictNumber(blankToUndefined(v)),
      z.number({ error: "seriesValue must be a number" }).refine(Number.isFinite, "seriesValue must be a finite number").optional(),
    ),
    pathLengthCm: optionalNumber("pathLengthCm", 0, 100, "cm"),
    excitationNm: optionalNumber("excitationNm", 100, 3000, "nm"),
    solvent: optionalText("solvent", 100),
    ...readFields,
    split: splitField,
    assignments: assignmentsField,
    profile: profileField,
    onDuplicate: z.preprocess(blankToUndefined, z.enum(["keep", "update"], { error: 'onDuplicate must be "keep" or "update"' }).optional()),
    material: z.preprocess(
      blankToUndefined,
      z.enum(INGEST_MATERIALS, { error: `material must be one of ${INGEST_MATERIALS.join(", ")}` }).optional(),
    ),
  })
  .superRefine((m, ctx) => {
    if (m.seriesValue !== undefined && m.seriesId === undefined) {
      ctx.addIssue({ code: "custom", path: ["seriesValue"], message: "seriesValue needs a seriesId" });
    }
    if (m.assignments !== undefined && m.split === undefined) {
      ctx.addIssue({ code: "custom", path: ["assignments"], message: "assignments need split=all" });
    }
    if (m.assignments?.some((a) => a.seriesValue !== undefined) && m.seriesId === undefined) {
      ctx.addIssue({ code: "custom", path: ["assignments"], message: "assignments: a seriesValue needs a seriesId" });
    }
  });

export type IngestMetadataInput = z.input<typeof ingestMetadataSchema>;
export type IngestMetadata = z.output<typeof ingestMetadataSchema>;

/** Field names the HTTP API reads from a multipart form besides `file`. */
export const INGEST_FIELDS = [
  "projectId",
  "technique",
  "sampleId",
  "referenceSpectrumId",
  "seriesId",
  "seriesValue",
  "pathLengthCm",
  "excitationNm",
  "solvent",
  "column",
  "material",
  "xUnit",
  "yKind",
  "block",
  "pair",
  "sheet",
  "split",
  "assignments",
  "profile",
  "onDuplicate",
] as const;
