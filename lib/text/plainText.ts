import { z } from "zod";

// Unicode's explicit directional formatting characters (Unicode Standard Annex #9, §2: LRE,
// RLE, PDF, LRO, RLO, LRI, RLI, FSI, PDI, and the marks ALM, LRM, RLM). In a name they make
// "evil\u202Efdp.csv" display as "evilvsc.pdf"; names never need them.
const BIDI_CONTROLS = /[\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/;
const CONTROLS = /[\u0000-\u001f\u007f]/;

/** One rule for names people type or send (metadata text, column names, file names): no markup, control or direction characters. */
export function isPlainText(text: string): boolean {
  return !/[<>]/.test(text) && !CONTROLS.test(text) && !BIDI_CONTROLS.test(text);
}

export const plainTextMessage = (label: string) => `${label} must be plain text (no <, >, control or text-direction characters)`;

/** A file name's problem, or null: control and text-direction characters are refused, not silently dropped. */
export function fileNameProblem(name: string): string | null {
  return CONTROLS.test(name) || BIDI_CONTROLS.test(name)
    ? "the file name holds control or text-direction characters; rename the file"
    : null;
}

/** The column of a multi-column export, by name: the same rule for upload and re-run. */
export const columnNameSchema = z
  .string()
  .trim()
  .min(1, "column must not be empty")
  .max(100, "column is longer than 100 characters")
  .refine(isPlainText, plainTextMessage("column"));
