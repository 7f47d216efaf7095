"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { protectedAction } from "@/lib/actions/protected";
import type { Actor } from "@/lib/auth/actor";
import { canManageMembers, canSteward, groupOfTarget } from "@/lib/auth/access";
import { recordAudit } from "@/lib/audit";
import type { AuditAction } from "@/lib/auditTrail/eventKinds";
import { selectRows } from "@/lib/db";
import { deleteAnalysisRun, deleteSpectrum, isGone } from "@/lib/stewardship/deletion";
import { sendInvitation } from "@/lib/stewardship/invitations";
import { createShareLink, revokeShareLink } from "@/lib/stewardship/shareLinks";
import { Invitation, LegalHold, Membership, Project, RetentionFlag, RetentionPolicy, Share, User, models } from "@/models";
import { UUID_PATTERN } from "@/lib/ids";
import { refuse } from "@/lib/errors";

// Writes of the stewardship pages. Every one checks the role in the owning group;
// another group's ids are answered as "not found".

const SHARE_TARGET = new RegExp(`^(project|series):${UUID_PATTERN}$`, "i");
const id = (field: string) => z.string({ error: `${field}: required.` }).uuid(`${field}: not a valid id.`);
const NOT_FOUND = "Not found, or not in a group you steward.";

async function requireStewardOf(actor: Actor, groupId: string | null, field?: string): Promise<string> {
  if (!groupId || !canSteward(actor, groupId)) throw refuse(400, NOT_FOUND, field);
  return groupId;
}
const audit = (
  actor: Actor,
  groupId: string,
  action: AuditAction,
  targetType: string,
  targetId: string,
  details: Record<string, unknown> = {},
) => recordAudit({ actorId: actor.id, actorLabel: actor.email, groupId, action, targetType, targetId, details });

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
  models();
  const project = await Project.findByPk(input.projectId);
  const groupId = await requireStewardOf(actor, project?.groupId ?? null, "projectId");
  const existing = await RetentionPolicy.findOne({ where: { projectId: input.projectId, dataClass: input.dataClass } });
  const before = existing ? { keepDays: existing.keepDays, onExpiry: existing.onExpiry } : null;
  const policy = existing
    ? await existing.update({ keepDays: input.keepDays, onExpiry: input.onExpiry })
    : await RetentionPolicy.create({
        projectId: input.projectId,
        dataClass: input.dataClass,
        keepDays: input.keepDays,
        onExpiry: input.onExpiry,
        createdBy: actor.id,
      });
  await audit(actor, groupId, existing ? "retention-policy-changed" : "retention-policy-created", "retention-policy", policy.id, {
    project: project!.name,
    dataClass: input.dataClass,
    keepDays: input.keepDays,
    onExpiry: input.onExpiry,
    before,
  });
  revalidatePath("/stewardship", "layout");
  redirect("/stewardship/policies?saved=1");
});

export const deletePolicy = protectedAction(z.object({ id: id("id") }), async (input, actor) => {
  models();
  const policy = await RetentionPolicy.findByPk(input.id);
  const project = policy ? await Project.findByPk(policy.projectId) : null;
  const groupId = await requireStewardOf(actor, project?.groupId ?? null);
  await policy!.destroy();
  await audit(actor, groupId, "retention-policy-removed", "retention-policy", input.id, {
    project: project!.name,
    dataClass: policy!.dataClass,
  });
  revalidatePath("/stewardship", "layout");
  return { ok: true, message: "Policy removed: nothing in that class expires any more." };
});

export const decideFlag = protectedAction(
  z.object({ id: id("id"), decision: z.enum(["keep", "delete"], { error: "decision: keep or delete." }) }),
  async (input, actor) => {
    models();
    const flag = await RetentionFlag.findByPk(input.id);
    const groupId = await requireStewardOf(actor, flag?.groupId ?? null);
    if (flag!.decision) throw refuse(400, "This item was already decided.");
    if (input.decision === "delete") {
      const request = { cause: "steward" as const, actorId: actor.id, actorLabel: actor.email, policyId: flag!.policyId };
      try {
        if (flag!.targetType === "spectrum") await deleteSpectrum(flag!.targetId, request);
        else await deleteAnalysisRun(flag!.targetId, request);
      } catch (error) {
        if (!isGone(error)) throw error; // already deleted: record the decision all the same
      }
    }
    await flag!.update({ decision: input.decision, decidedBy: actor.id, decidedAt: new Date() });
    await audit(
      actor,
      groupId,
      input.decision === "keep" ? "retention-flag-kept" : "retention-flag-deleted",
      flag!.targetType,
      flag!.targetId,
      { label: flag!.label },
    );
    revalidatePath("/stewardship", "layout");
    return {
      ok: true,
      message: input.decision === "keep" ? `Kept "${flag!.label}".` : `Deleted "${flag!.label}"; a tombstone records it.`,
    };
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
    models();
    const groupId = await requireStewardOf(actor, await groupOfTarget(input.targetType, input.targetId), "targetId");
    const hold = await LegalHold.create({
      groupId,
      targetType: input.targetType,
      targetId: input.targetId,
      reason: input.reason,
      placedBy: actor.id,
      liftedBy: null,
      liftedAt: null,
    });
    await audit(actor, groupId, "hold-placed", input.targetType, input.targetId, { holdId: hold.id, reason: input.reason });
    revalidatePath("/stewardship", "layout");
    return { ok: true, message: "Hold placed: nothing under it can be deleted until it is lifted." };
  },
);

export const liftHold = protectedAction(z.object({ id: id("id") }), async (input, actor) => {
  models();
  const hold = await LegalHold.findByPk(input.id);
  const groupId = await requireStewardOf(actor, hold?.groupId ?? null);
  if (hold!.liftedAt) throw refuse(400, "This hold was already lifted.");
  await hold!.update({ liftedAt: new Date(), liftedBy: actor.id });
  await audit(actor, groupId, "hold-lifted", hold!.targetType, hold!.targetId, { holdId: hold!.id, reason: hold!.reason });
  revalidatePath("/stewardship", "layout");
  return { ok: true, message: "Hold lifted." };
});

// --- members and invitations (group leads and stewards) ---

const roleSchema = z.enum(["spectroscopist", "lead", "steward", "collaborator"], { error: "role: choose a role." });
const email = z
  .string({ error: "email: required." })
  .trim()
  .toLowerCase()
  .email("email: not a valid e-mail address.")
  .max(200, "email: too long.");

async function requireManagerOf(actor: Actor, groupId: string | null, field?: string): Promise<string> {
  if (!groupId || !canManageMembers(actor, groupId)) throw refuse(400, "Not found, or not a group whose members you manage.", field);
  return groupId;
}

async function shareTargetOf(type: "project" | "series" | undefined, targetId: string | undefined, groupId: string) {
  if (!type || !targetId) return null;
  const owner = await groupOfTarget(type, targetId);
  if (owner !== groupId) throw refuse(400, "shareTargetId: not a project or series of this group.", "shareTargetId");
  const [row] = await selectRows<{ name: string }>(`SELECT name FROM ${type === "project" ? "projects" : "series"} WHERE id = :targetId`, {
    targetId,
  });
  return { type, id: targetId, label: row?.name ?? "" };
}

export const inviteMember = protectedAction(
  z.object({
    groupId: id("groupId"),
    email,
    role: roleSchema,
    shareTarget: z
      .string()
      .optional()
      .transform((v) => v || undefined)
      .refine((v) => !v || SHARE_TARGET.test(v), "shareTarget: choose a project or series."),
  }),
  async (input, actor) => {
    models();
    const groupId = await requireManagerOf(actor, input.groupId, "groupId");
    if (input.role === "steward" && !canSteward(actor, groupId))
      throw refuse(400, "role: only a data steward can make someone a data steward.", "role");
    const [type, targetId] = (input.shareTarget?.split(":") ?? []) as ["project" | "series" | undefined, string | undefined];
    if (input.role === "collaborator" && !type)
      throw refuse(400, "shareTarget: a collaborator needs a project or series to read.", "shareTarget");
    const share = input.role === "collaborator" ? await shareTargetOf(type, targetId, groupId) : null;
    const user = await User.findOne({ where: { email: input.email } });
    if (user && (await Membership.findOne({ where: { groupId, userId: user.id } })) && !share) {
      throw refuse(400, "email: this person is already a member; change their role below.", "email");
    }
    const groupName = actor.memberships.find((m) => m.groupId === groupId)?.groupName ?? "";
    const { invitation } = await sendInvitation({
      groupId,
      groupName,
      email: input.email,
      role: input.role,
      invitedBy: { id: actor.id, name: actor.name },
      share,
    });
    await audit(actor, groupId, "invitation-sent", "invitation", invitation.id, {
      email: input.email,
      role: input.role,
      share: share ? `${share.type}:${share.id}` : null,
    });
    revalidatePath("/stewardship/sharing");
    return { ok: true, message: `Invitation sent to ${input.email}; the link works once within 7 days.` };
  },
);

export const revokeInvitation = protectedAction(z.object({ id: id("id") }), async (input, actor) => {
  models();
  const inv = await Invitation.findByPk(input.id);
  const groupId = await requireManagerOf(actor, inv?.groupId ?? null);
  if (inv!.acceptedAt) throw refuse(400, "This invitation was already accepted.");
  await inv!.update({ revokedAt: new Date() });
  await audit(actor, groupId, "invitation-revoked", "invitation", inv!.id, { email: inv!.email });
  revalidatePath("/stewardship/sharing");
  return { ok: true, message: "Invitation revoked: its link no longer works." };
});

export const changeRole = protectedAction(z.object({ id: id("id"), role: roleSchema }), async (input, actor) => {
  models();
  const m = await Membership.findByPk(input.id);
  const groupId = await requireManagerOf(actor, m?.groupId ?? null);
  if (m!.userId === actor.id) throw refuse(400, "role: you cannot change your own role; ask another lead or steward.", "role");
  if ((input.role === "steward" || m!.role === "steward") && !canSteward(actor, groupId))
    throw refuse(400, "role: only a data steward can give or take the data steward role.", "role");
  const before = m!.role;
  await m!.update({ role: input.role });
  await audit(actor, groupId, "member-role-changed", "user", m!.userId, { from: before, to: input.role });
  revalidatePath("/stewardship/sharing");
  return { ok: true, message: "Role changed." };
});

export const removeMember = protectedAction(z.object({ id: id("id") }), async (input, actor) => {
  models();
  const m = await Membership.findByPk(input.id);
  const groupId = await requireManagerOf(actor, m?.groupId ?? null);
  if (m!.userId === actor.id) throw refuse(400, "You cannot remove yourself; ask another lead or steward.");
  if (m!.role === "steward" && !canSteward(actor, groupId)) throw refuse(400, "Only a data steward can remove a data steward.");
  await m!.destroy();
  // Shares given to this person by this group end with the membership.
  await Share.update({ revokedAt: new Date() }, { where: { groupId, granteeUserId: m!.userId, revokedAt: null } });
  await audit(actor, groupId, "member-removed", "user", m!.userId, { role: m!.role });
  revalidatePath("/stewardship/sharing");
  return { ok: true, message: "Member removed; their access ended at once." };
});

// --- shares with collaborators (stewards) ---

export const shareWithCollaborator = protectedAction(
  z.object({
    email,
    shareTarget: z
      .string({ error: "shareTarget: choose a project or series." })
      .regex(SHARE_TARGET, "shareTarget: choose a project or series."),
    expiresOn: z
      .string()
      .optional()
      .transform((v) => v || undefined)
      .refine((v) => !v || (/^\d{4}-\d{2}-\d{2}$/.test(v) && !Number.isNaN(Date.parse(v))), "expiresOn: use a date as YYYY-MM-DD.")
      .refine((v) => !v || Date.parse(`${v}T23:59:59Z`) > Date.now(), "expiresOn: choose a date in the future."),
  }),
  async (input, actor) => {
    models();
    const [type, targetId] = input.shareTarget.split(":") as ["project" | "series", string];
    const groupId = await requireStewardOf(actor, await groupOfTarget(type, targetId), "shareTarget");
    const share = await shareTargetOf(type, targetId, groupId);
    const user = await User.findOne({ where: { email: input.email } });
    const groupName = actor.memberships.find((m) => m.groupId === groupId)?.groupName ?? "";
    if (!user) {
      const { invitation } = await sendInvitation({
        groupId,
        groupName,
        email: input.email,
        role: "collaborator",
        invitedBy: { id: actor.id, name: actor.name },
        share,
      });
      await audit(actor, groupId, "invitation-sent", "invitation", invitation.id, {
        email: input.email,
        role: "collaborator",
        share: input.shareTarget,
      });
      revalidatePath("/stewardship/sharing");
      return { ok: true, message: `${input.email} has no account yet: an invitation was sent; the share starts when they accept.` };
    }
    const membership = await Membership.findOne({ where: { groupId, userId: user.id } });
    if (membership && membership.role !== "collaborator")
      throw refuse(400, "email: this person is a member of the group and already reads its data.", "email");
    if (!membership) await Membership.create({ groupId, userId: user.id, role: "collaborator" });
    const row = await Share.create({
      groupId,
      targetType: type,
      targetId,
      granteeUserId: user.id,
      linkTokenHash: null,
      expiresAt: input.expiresOn ? new Date(`${input.expiresOn}T23:59:59Z`) : null,
      revokedAt: null,
      createdBy: actor.id,
    });
    await audit(actor, groupId, "share-created", type, targetId, { shareId: row.id, grantee: user.email, expiresAt: row.expiresAt });
    revalidatePath("/stewardship/sharing");
    return { ok: true, message: `Shared ${type} "${share!.label}" with ${user.email}, read-only.` };
  },
);

export const revokeShare = protectedAction(z.object({ id: id("id") }), async (input, actor) => {
  models();
  const share = await Share.findByPk(input.id);
  const groupId = await requireStewardOf(actor, share?.groupId ?? null);
  if (share!.revokedAt) throw refuse(400, "This share was already revoked.");
  await share!.update({ revokedAt: new Date() });
  await audit(actor, groupId, "share-revoked", share!.targetType, share!.targetId, { shareId: share!.id });
  revalidatePath("/stewardship/sharing");
  return { ok: true, message: "Share revoked: access ended at once." };
});

// --- read-only share links (stewards) ---

/**
 * Creates a share link (intent "create": shareTarget, optional expiresAt as YYYY-MM-DDTHH:MM in UTC) or revokes
 * one (intent "revoke": id). The logic and its audit events live in lib/stewardship/shareLinks.ts. On creation
 * the message is the link's path, shown once by components/stewardship/ShareLinkPanel.tsx.
 */
export const shareLinkAction = protectedAction(
  z.discriminatedUnion(
    "intent",
    [
      z.object({
        intent: z.literal("create"),
        shareTarget: z
          .string({ error: "shareTarget: choose a project or series." })
          .regex(SHARE_TARGET, "shareTarget: choose a project or series."),
        expiresAt: z
          .string()
          .optional()
          .transform((v) => v || undefined)
          .refine(
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
    const [targetType, targetId] = input.shareTarget.split(":") as ["project" | "series", string];
    const link = await createShareLink(actor, {
      targetType,
      targetId,
      expiresAt: input.expiresAt ? new Date(`${input.expiresAt}:00Z`) : null,
    });
    revalidatePath("/stewardship/sharing");
    return { ok: true, message: `/shared/${link.token}` };
  },
);
