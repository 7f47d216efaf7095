import { z } from "zod";

/**
 * The delete-a-spectrum form's input. The confirmation word is compared without regard to case
 * or surrounding spaces: "Delete", "DELETE" and " delete " all confirm; anything else names the field.
 */
export const deleteSpectrumInput = z.object({
  spectrumId: z.string({ error: "spectrumId: required." }).uuid("spectrumId: not a valid id."),
  confirm: z
    .string({ error: "confirm: type delete to confirm." })
    .trim()
    .toLowerCase()
    .pipe(z.literal("delete", { error: "confirm: type delete to confirm." })),
});
