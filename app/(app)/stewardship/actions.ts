"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { protectedAction } from "@/lib/actions/protected";
import { UUID_PATTERN } from "@/lib/ids";
import { revokeShare as endShare, shareWithCollaborator as shareOne } from "@/lib/stewardship/collaboratorShares";
import { liftHold as lift, placeHold as place } from "@/lib/stewardship/legalHolds";
import {
  changeRole as setRole,
  inviteMember as invite,
  removeMember as remove,
  revokeInvitation as revoke,
} from "@/lib/stewardship/members";
import { decideRetentionFlag, removePolicy, savePolicy as save } from "@/lib/stewardship/retention";
import { createShareLink, revokeShareLink } from "@/lib/stewardship/shareLinks";

// The stewardship pages' server actions: each validates its form and calls the write in
// lib/stewardship/, which checks the role in the owning group and records the audit event.

const SHARE_TARGET = new RegExp(`^(project|series):${UUID_PATTERN}$`, "i");
const id = (field: string) => z.string({ error: `${field}: required.` }).uuid(`${field}: not a valid id.`);
const byId = z.object({ id: id("id") });
const roleSchema = z.enum(["spectroscopist", "lead", "steward", "collaborator"], { error: "role: choose a role." });
const email = z
  .string({ error: "email: required." })
  .trim()
  .toLowerCase()
  .email("email: not a valid e-mail address.")
  .max(200, "email: too long.");
const shareTarget = z
  .string({ error: "shareTarget: choose a project or series." })
  .regex(SHARE_TARGET, "shareTarget: choose a project or series.")
  .transform((v) => {
    const [type, targetId] = v.split(":") as ["project" | "series", string];
    return { type, id: targetId };
  });
const optional = z
  .string()
  .optional()
  .transform((v) => v || undefined);

// --- retention ---

const policySchema = z.object({
  projectId: id("projectId"),
  dataClass: z.enum(["raw", "processed", "drafts"], { error: "dataClass: choose raw, processed or drafts." }),
  keepDays: z.coerce
    .number({ error: "keepDays: a whole number of days." })
    .int("keepDays: a whole number of days.")
    .min(1, "keepDays: at least 1 day.")
    .max(36500, "keepDays: at most 36500 days (100 years)."),
  onExpiry: z.enum(["delete", "flag"], { error: "onExpiry: choose delete or flag." }),
});

export const savePolicy = protectedAction(policySchema, async (input, actor) => {
  await save(actor, input);
  revalidatePath("/stewardship", "layout");
  redirect("/stewardship/policies?saved=1");
});

export const deletePolicy = protectedAction(byId, async (input, actor) => {
  await removePolicy(actor, input.id);
  revalidatePath("/stewardship", "layout");
  return { ok: true, message: "Policy removed: nothing in that class expires any more." };
});

export const decideFlag = protectedAction(
  z.object({ id: id("id"), decision: z.enum(["keep", "delete"], { error: "decision: keep or delete." }) }),
  async (input, actor) => {
    const label = await decideRetentionFlag(actor, input.id, input.decision);
    revalidatePath("/stewardship", "layout");
    return { ok: true, message: input.decision === "keep" ? `Kept "${label}".` : `Deleted "${label}"; a tombstone records it.` };
  },
);

// --- legal holds ---

export const placeHold = protectedAction(
  z.object({
    targetType: z.enum(["project", "series", "sample", "spectrum"], { error: "targetType: choose project, series, sample or spectrum." }),
    targetId: id("targetId"),
    reason: z
      .string({ error: "reason: required." })
      .trim()
      .min(5, "reason: say why, in at least 5 characters.")
      .max(1000, "reason: at most 1000 characters."),
  }),
  async (input, actor) => {
    await place(actor, input);
    revalidatePath("/stewardship", "layout");
    return { ok: true, message: "Hold placed: nothing under it can be deleted until it is lifted." };
  },
);

export const liftHold = protectedAction(byId, async (input, actor) => {
  await lift(actor, input.id);
  revalidatePath("/stewardship", "layout");
  return { ok: true, message: "Hold lifted." };
});

// --- members and invitations (group leads and stewards) ---

export const inviteMember = protectedAction(
  z.object({ groupId: id("groupId"), email, role: roleSchema, shareTarget: optional.pipe(shareTarget.optional()) }),
  async (input, actor) => {
    await invite(actor, input);
    revalidatePath("/stewardship/sharing");
    return { ok: true, message: `Invitation sent to ${input.email}; the link works once within 7 days.` };
  },
);

export const revokeInvitation = protectedAction(byId, async (input, actor) => {
  await revoke(actor, input.id);
  revalidatePath("/stewardship/sharing");
  return { ok: true, message: "Invitation revoked: its link no longer works." };
});

export const changeRole = protectedAction(z.object({ id: id("id"), role: roleSchema }), async (input, actor) => {
  await setRole(actor, input.id, input.role);
  revalidatePath("/stewardship/sharing");
  return { ok: true, message: "Role changed." };
});

export const removeMember = protectedAction(byId, async (input, actor) => {
  await remove(actor, input.id);
  revalidatePath("/stewardship/sharing");
  return { ok: true, message: "Member removed; their access ended at once." };
});

// --- shares with collaborators (stewards) ---

export const shareWithCollaborator = protectedAction(
  z.object({
    email,
    shareTarget,
    expiresOn: optional
      .refine((v) => !v || (/^\d{4}-\d{2}-\d{2}$/.test(v) && !Number.isNaN(Date.parse(v))), "expiresOn: use a date as YYYY-MM-DD.")
      .refine((v) => !v || Date.parse(`${v}T23:59:59Z`) > Date.now(), "expiresOn: choose a date in the future."),
  }),
  async (input, actor) => {
    const outcome = await shareOne(actor, {
      email: input.email,
      type: input.shareTarget.type,
      targetId: input.shareTarget.id,
      expiresAt: input.expiresOn ? new Date(`${input.expiresOn}T23:59:59Z`) : null,
    });
    revalidatePath("/stewardship/sharing");
    return {
      ok: true,
      message:
        outcome.kind === "invited"
          ? `${outcome.email} has no account yet: an invitation was sent; the share starts when they accept.`
          : `Shared ${outcome.type} "${outcome.label}" with ${outcome.email}, read-only.`,
    };
  },
);

export const revokeShare = protectedAction(byId, async (input, actor) => {
  await endShare(actor, input.id);
  revalidatePath("/stewardship/sharing");
  return { ok: true, message: "Share revoked: access ended at once." };
});

// --- read-only share links (stewards) ---

/**
 * Creates a share link (intent "create": shareTarget, optional expiresAt as YYYY-MM-DDTHH:MM in UTC) or revokes
 * one (intent "revoke": id). On creation the message is the link's path, shown once by
 * components/stewardship/ShareLinkPanel.tsx.
 */
export const shareLinkAction = protectedAction(
  z.discriminatedUnion(
    "intent",
    [
      z.object({
        intent: z.literal("create"),
        shareTarget,
        expiresAt: optional.refine(
          (v) => !v || (/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/.test(v) && !Number.isNaN(Date.parse(`${v}:00Z`))),
          "expiresAt: use a date and time as YYYY-MM-DDTHH:MM (UTC).",
        ),
      }),
      z.object({ intent: z.literal("revoke"), id: id("id") }),
    ],
    { error: "intent: create or revoke." },
  ),
  async (input, actor) => {
    if (input.intent === "revoke") {
      await revokeShareLink(actor, input.id);
      revalidatePath("/stewardship/sharing");
      return { ok: true, message: "Link revoked: it stopped working at once." };
    }
    const link = await createShareLink(actor, {
      targetType: input.shareTarget.type,
      targetId: input.shareTarget.id,
      expiresAt: input.expiresAt ? new Date(`${input.expiresAt}:00Z`) : null,
    });
    revalidatePath("/stewardship/sharing");
    return { ok: true, message: `/shared/${link.token}` };
  },
);
