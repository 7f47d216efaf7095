import { z } from "zod";
import { X_UNIT_NAMES, Y_KIND_NAMES } from "@/lib/engine/parse/readChoice";
import { columnNameSchema, isPlainText, plainTextMessage } from "@/lib/text/plainText";

/** What an import profile keeps: how to read a file, and whether to split it into one spectrum per trace. */
export const profileChoiceSchema = z
  .object({
    column: columnNameSchema.optional(),
    xUnit: z.enum(X_UNIT_NAMES).optional(),
    yKind: z.enum(Y_KIND_NAMES).optional(),
    block: z.number().int().min(1).max(1000).optional(),
    pair: z.number().int().min(1).max(1000).optional(),
    sheet: z.string().trim().min(1).max(100).refine(isPlainText, plainTextMessage("sheet")).optional(),
    split: z.literal(true).optional(),
  })
  .strict();
export type ProfileChoice = z.infer<typeof profileChoiceSchema>;

/** The form fields a profile fills in, in form-field spelling (the upload and preview fields). */
export const PROFILE_FIELDS = ["column", "xUnit", "yKind", "block", "pair", "sheet", "split"] as const;

/** A profile's name: plain text, 1–80 characters; "none" is kept to switch automatic matching off. */
export const profileNameSchema = z
  .string({ error: "profile must be a name" })
  .trim()
  .min(1, "profile name must not be empty")
  .max(80, "profile name is longer than 80 characters")
  .refine(isPlainText, plainTextMessage("profile name"))
  .refine((n) => n.toLowerCase() !== "none", 'profile name "none" is kept for "use no profile"');

/** The body of POST /api/v1/projects/{id}/import-profiles. */
export const saveProfileSchema = z
  .object({
    name: profileNameSchema,
    choice: profileChoiceSchema,
    /** The file the profile is made from, by its header signature (as the preview reports it). */
    signature: z.string().min(1).max(2000),
  })
  .strict();

/** A profile's choice as upload/preview form fields (strings), for merging under what the person sent. */
export function profileFields(choice: ProfileChoice): Record<string, string> {
  const out: Record<string, string> = {};
  for (const key of PROFILE_FIELDS) {
    const v = choice[key];
    if (v === undefined) continue;
    out[key] = key === "split" ? "all" : String(v);
  }
  return out;
}
