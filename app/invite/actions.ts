"use server";

import { redirect } from "next/navigation";
import { z } from "zod";
import type { ActionState } from "@/lib/actions/protected-state";
import { currentActor } from "@/lib/auth/actor";
import { acceptInvitation } from "@/lib/stewardship/acceptInvitation";
import { Refusal } from "@/lib/errors";

// The one server action open to people without a session: the invitation token is the
// credential (one-time, hashed, expiring). It therefore does not go through
// protectedAction, but keeps its rules: zod first, field errors, no raw errors.

const schema = z.object({
  token: z.string().min(1, "token: missing."),
  name: z.string().trim().max(200, "name: at most 200 characters.").optional(),
  password: z.string().max(200, "password: at most 200 characters.").optional(),
});

export async function acceptInvitationAction(_previous: ActionState, formData: FormData): Promise<ActionState> {
  const values = Object.fromEntries(
    [...formData.entries()].filter(([k, v]) => typeof v === "string" && !k.startsWith("$") && k !== "password"),
  ) as Record<string, string>;
  const parsed = schema.safeParse(Object.fromEntries([...formData.entries()].filter(([, v]) => typeof v === "string")));
  if (!parsed.success) {
    const fieldErrors: Record<string, string[]> = {};
    for (const i of parsed.error.issues) (fieldErrors[i.path.join(".") || "form"] ??= []).push(i.message);
    return { ok: false, message: "Check the highlighted fields.", fieldErrors, values };
  }
  const actor = await currentActor();
  if (!actor) {
    const fieldErrors: Record<string, string[]> = {};
    if (!parsed.data.name) fieldErrors.name = ["name: say how colleagues should see you."];
    if (!parsed.data.password || parsed.data.password.length < 10) fieldErrors.password = ["password: at least 10 characters."];
    if (Object.keys(fieldErrors).length) return { ok: false, message: "Check the highlighted fields.", fieldErrors, values };
  }
  try {
    await acceptInvitation(parsed.data.token, {
      signedInUserId: actor?.id ?? null,
      name: parsed.data.name,
      password: parsed.data.password,
    });
  } catch (error) {
    if (error instanceof Refusal)
      return { ok: false, message: error.message, fieldErrors: error.field ? { [error.field]: [error.message] } : undefined, values };
    console.error(error);
    return { ok: false, message: "Something went wrong on our side; nothing was saved. Try again.", values };
  }
  redirect(actor ? "/" : "/signin?callbackUrl=%2F&invited=1");
}
