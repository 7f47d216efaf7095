"use server";

import { z } from "zod";
import type { ActionState } from "@/lib/actions/protected-state";
import { recordAudit } from "@/lib/audit";
import { redeemUnlockToken } from "@/lib/auth/rate-limit";

// Open to people without a session, like accepting an invitation: the one-time token mailed
// to the account's owner is the credential (random, stored hashed in Redis, expiring).

const schema = z.object({
  token: z.string({ error: "token: this link is not complete." }).regex(/^[A-Za-z0-9_-]{20,64}$/, "token: this link is not complete."),
});

export async function unlockAccountAction(_previous: ActionState, formData: FormData): Promise<ActionState> {
  const parsed = schema.safeParse({ token: formData.get("token") });
  if (!parsed.success) return { ok: false, message: parsed.error.issues[0]!.message };
  try {
    const email = await redeemUnlockToken(parsed.data.token);
    if (!email)
      return { ok: false, message: "This link was used already or has expired. Sign in, or wait 15 minutes for the lock to end." };
    await recordAudit({ actorId: null, actorLabel: email, action: "sign-in-unlocked", details: {} });
    return { ok: true, message: "Your account is unlocked. You can sign in now." };
  } catch (error) {
    console.error("unlock failed:", error);
    return { ok: false, message: "Unlocking is not possible right now. Try again in a few minutes." };
  }
}
