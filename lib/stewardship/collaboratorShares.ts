import type { Actor } from "@/lib/auth/actor";
import { groupOfTarget } from "@/lib/auth/access";
import { refuse } from "@/lib/errors";
import { Membership, Share, User } from "@/models";
import { sendInvitation } from "./invitations";
import { groupNameOf, shareTargetOf, type ShareTargetType } from "./members";
import { auditAs, requireStewardOf } from "./stewardGuards";

// Read-only shares of a project or series with a named collaborator (stewards only). A person
// without an account is invited instead; the share starts when they accept.

export type ShareOutcome = { kind: "invited"; email: string } | { kind: "shared"; email: string; type: ShareTargetType; label: string };

export async function shareWithCollaborator(
  actor: Actor,
  input: { email: string; type: ShareTargetType; targetId: string; expiresAt: Date | null },
): Promise<ShareOutcome> {
  const groupId = requireStewardOf(actor, await groupOfTarget(input.type, input.targetId), "shareTarget");
  const share = await shareTargetOf(input.type, input.targetId, groupId);
  const user = await User.findOne({ where: { email: input.email } });
  if (!user) {
    const { invitation } = await sendInvitation({
      groupId,
      groupName: groupNameOf(actor, groupId),
      email: input.email,
      role: "collaborator",
      invitedBy: { id: actor.id, name: actor.name },
      share,
    });
    await auditAs(actor, groupId, "invitation-sent", "invitation", invitation.id, {
      email: input.email,
      role: "collaborator",
      share: `${input.type}:${input.targetId}`,
    });
    return { kind: "invited", email: input.email };
  }
  const membership = await Membership.findOne({ where: { groupId, userId: user.id } });
  if (membership && membership.role !== "collaborator")
    throw refuse(400, "email: this person is a member of the group and already reads its data.", "email");
  if (!membership) await Membership.create({ groupId, userId: user.id, role: "collaborator" });
  const row = await Share.create({
    groupId,
    targetType: input.type,
    targetId: input.targetId,
    granteeUserId: user.id,
    linkTokenHash: null,
    expiresAt: input.expiresAt,
    revokedAt: null,
    createdBy: actor.id,
  });
  await auditAs(actor, groupId, "share-created", input.type, input.targetId, {
    shareId: row.id,
    grantee: user.email,
    expiresAt: row.expiresAt,
  });
  return { kind: "shared", email: user.email, type: input.type, label: share.label };
}

export async function revokeShare(actor: Actor, id: string): Promise<void> {
  const share = await Share.findByPk(id);
  const groupId = requireStewardOf(actor, share?.groupId ?? null);
  if (share!.revokedAt) throw refuse(400, "This share was already revoked.");
  await share!.update({ revokedAt: new Date() });
  await auditAs(actor, groupId, "share-revoked", share!.targetType, share!.targetId, { shareId: share!.id });
}
