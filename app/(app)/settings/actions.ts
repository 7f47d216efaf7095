"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { protectedAction } from "@/lib/actions/protected";
import { TOKEN_LIFETIMES, issueApiToken, type TokenLifetime } from "@/lib/api-tokens";
import { forgetApiToken } from "@/lib/auth/actor";
import { announceTokenRevoked } from "@/lib/auth/tokenRevocations";
import { recordAudit } from "@/lib/audit";
import { ApiToken, User } from "@/models";
import { refuse } from "@/lib/errors";

export const createApiToken = protectedAction(
  z.object({
    name: z.string().trim().min(1, "Name the token after the script that uses it.").max(100, "At most 100 characters."),
    lifetime: z
      .enum(Object.keys(TOKEN_LIFETIMES) as [TokenLifetime, ...TokenLifetime[]], { error: "lifetime: choose never, 30, 90 or 365 days." })
      .default("never"),
  }),
  async ({ name, lifetime }, actor) => {
    const { id, secret } = await issueApiToken(actor.id, name, lifetime);
    await recordAudit({
      actorId: actor.id,
      actorLabel: actor.email,
      action: "api-token-created",
      targetType: "api-token",
      targetId: id,
      details: { name, lifetime },
    });
    revalidatePath("/settings");
    return { ok: true, message: secret };
  },
);

export const revokeApiToken = protectedAction(z.object({ id: z.string().uuid() }), async ({ id }, actor) => {
  const token = await ApiToken.findByPk(id);
  if (!token || token.userId !== actor.id) throw refuse(400, "That token is not yours.");
  if (!token.revokedAt) await token.update({ revokedAt: new Date() });
  forgetApiToken(token.tokenHash);
  // Every other app process forgets it too; if Redis is down they do not cache tokens anyway.
  await announceTokenRevoked(token.tokenHash).catch(() => {});
  await recordAudit({ actorId: actor.id, actorLabel: actor.email, action: "api-token-revoked", targetType: "api-token", targetId: id });
  revalidatePath("/settings");
  return { ok: true, message: "Token revoked: scripts using it are refused from now on." };
});

// An unticked checkbox sends no field at all: a missing key is "off" (optional, not a union with undefined).
const checkbox = z
  .literal("on")
  .optional()
  .transform((v) => v === "on");

export const saveNotifications = protectedAction(z.object({ notifyDigest: checkbox, notifyDecisions: checkbox }), async (input, actor) => {
  await User.update(input, { where: { id: actor.id } });
  revalidatePath("/settings");
  return { ok: true, message: "Saved." };
});
