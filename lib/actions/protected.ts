import { z } from "zod";
import type { Actor } from "@/lib/auth/actor";
import { currentActor } from "@/lib/auth/actor";
import { Refusal } from "@/lib/errors";

export { initialActionState, type ActionState } from "./protected-state";
import type { ActionState } from "./protected-state";

function formValues(formData: FormData): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [key, value] of formData.entries()) if (typeof value === "string" && !key.startsWith("$")) out[key] = value;
  return out;
}

/**
 * Every server action goes through here: the session is checked first, the form is
 * parsed with zod, and refusals come back as messages beside the fields, never as
 * stack traces or database errors.
 */
export function protectedAction<S extends z.ZodType>(schema: S, run: (input: z.infer<S>, actor: Actor) => Promise<ActionState | void>) {
  return async (_previous: ActionState, formData: FormData): Promise<ActionState> => {
    // The caller first, before anything of the request is read: every export of a
    // "use server" module is an endpoint anyone can call with any arguments.
    const actor = await currentActor();
    if (!actor) return { ok: false, message: "Your session has ended. Sign in again." };
    if (!(formData instanceof FormData)) return { ok: false, message: "This action takes a form." };
    const values = formValues(formData);
    const raw: Record<string, unknown> = { ...values };
    for (const key of new Set(formData.keys())) {
      const all = formData.getAll(key).filter((v): v is string => typeof v === "string");
      if (all.length > 1 || key.endsWith("[]")) raw[key.replace(/\[\]$/, "")] = all;
    }
    const parsed = schema.safeParse(raw);
    if (!parsed.success) {
      const fieldErrors: Record<string, string[]> = {};
      for (const issue of parsed.error.issues) {
        const key = issue.path.join(".") || "form";
        (fieldErrors[key] ??= []).push(issue.message);
      }
      return { ok: false, message: "Check the highlighted fields.", fieldErrors, values };
    }
    try {
      return (await run(parsed.data, actor)) ?? { ok: true };
    } catch (error) {
      // Next's redirect() works by throwing; let it through.
      if (error && typeof error === "object" && "digest" in error && String((error as { digest: unknown }).digest).startsWith("NEXT_"))
        throw error;
      if (error instanceof Refusal) {
        // Shown beside its field, a message does not need to start with the field's name.
        const message =
          error.field && error.message.startsWith(`${error.field}: `) ? error.message.slice(error.field.length + 2) : error.message;
        return { ok: false, message, fieldErrors: error.field ? { [error.field]: [message] } : undefined, values };
      }
      console.error(error);
      return { ok: false, message: "Something went wrong on our side; nothing was saved. Try again.", values };
    }
  };
}
