"use server";

import { revalidatePath } from "next/cache";
import { ActionRefused, protectedAction } from "@/lib/actions/protected";
import { decideSignatures } from "@/lib/review/decide";
import { ReviewRefused } from "@/lib/review/errors";
import { batchDecisionSchema } from "@/lib/review/schemas";

/** Confirms or dismisses one or more signatures with a comment (group leads of the owning group only). */
export const decideAction = protectedAction(batchDecisionSchema, async (input, actor) => {
  try {
    const { outcomes, mailed } = await decideSignatures(actor, input.signatureIds, input.decision, input.comment);
    revalidatePath("/review", "layout");
    revalidatePath("/spectra", "layout");
    revalidatePath("/series", "layout");
    const n = outcomes.length;
    const revised = outcomes.filter((o) => o.previousState !== "awaiting").length;
    return {
      ok: true,
      message: `${n === 1 ? "1 signature" : `${n} signatures`} ${input.decision}${revised ? ` (${revised} revised)` : ""}.${mailed ? ` ${mailed === 1 ? "The uploader was" : `${mailed} uploaders were`} told by e-mail.` : ""}`,
    };
  } catch (error) {
    if (error instanceof ReviewRefused) throw new ActionRefused(error.message, error.field);
    throw error;
  }
});
