"use server";

import { revalidatePath } from "next/cache";
import { protectedAction } from "@/lib/actions/protected";
import { decideSignatures, undoDecisions, type DecisionOutcome } from "@/lib/review/decide";
import { batchDecisionSchema, undoSchema } from "@/lib/review/schemas";

const STATE_TEXT = { awaiting: "awaiting review", confirmed: "confirmed", dismissed: "dismissed" } as const;
const count = (n: number) => (n === 1 ? "1 signature" : `${n} signatures`);

function revalidate() {
  revalidatePath("/review", "layout");
  revalidatePath("/spectra", "layout");
  revalidatePath("/series", "layout");
  revalidatePath("/", "layout");
}

function mailNote(mailed: number): string {
  return mailed ? ` ${mailed === 1 ? "The uploader hears" : `${mailed} uploaders hear`} of it in one e-mail shortly.` : "";
}

function decisionMessage(decision: DecisionOutcome["decision"], outcomes: DecisionOutcome[], mailed: number): string {
  const changed = outcomes.filter((o) => !o.unchanged);
  const same = outcomes.length - changed.length;
  const revised = changed.filter((o) => o.previousState !== "awaiting").length;
  const parts: string[] = [];
  if (changed.length)
    parts.push(`${count(changed.length)} ${STATE_TEXT[decision]}${revised ? ` (${revised} revised from the other decision)` : ""}.`);
  if (same)
    parts.push(
      `${count(same)} ${same === 1 ? "was" : "were"} already ${STATE_TEXT[decision]}; nothing recorded for ${same === 1 ? "it" : "them"}.`,
    );
  return parts.join(" ") + (changed.length ? mailNote(mailed) : "");
}

/** Confirms or dismisses one or more signatures with a comment (group leads of the owning group only). */
export const decideAction = protectedAction(batchDecisionSchema, async (input, actor) => {
  const { outcomes, mailed } = await decideSignatures(actor, input.signatureIds, input.decision, input.comment);
  revalidate();
  return {
    ok: true,
    message: decisionMessage(input.decision, outcomes, mailed),
    written: outcomes.map((o) => o.reviewId).filter((id): id is string => id !== null),
  };
});

/** Takes back decisions just made: each signature returns to the state before them. */
export const undoAction = protectedAction(undoSchema, async (input, actor) => {
  const { outcomes } = await undoDecisions(actor, input.reviewIds);
  revalidate();
  const states = [...new Set(outcomes.map((o) => STATE_TEXT[o.decision]))];
  return { ok: true, message: `Undone: ${count(outcomes.length)} back to ${states.join(" or ")}, as before.`, written: [] };
});
