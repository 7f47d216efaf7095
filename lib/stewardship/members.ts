import type { Actor } from "@/lib/auth/actor";
import { canSteward, groupOfTarget } from "@/lib/auth/access";
import { selectRows } from "@/lib/db";
import { refuse } from "@/lib/errors";
import { Invitation, Membership, Share, User } from "@/models";
import type { Role } from "@/models/Membership";
import { sendInvitation } from "./invitations";
import { auditAs, requireManagerOf } from "./stewardGuards";

// A group's members and invitations, managed by its leads and stewards. Only a steward gives,
// changes or removes the steward role; nobody changes or removes themselves.

export type ShareTargetType = "project" | "series";
export type ShareTarget = { type: ShareTargetType; id: string; label: string };

/** A project or series of the group, with its name; a target of another group is refused. */
export async function shareTargetOf(type: ShareTargetType, targetId: string, groupId: string): Promise<ShareTarget> {
  if ((await groupOfTarget(type, targetId)) !== groupId)
    throw refuse(400, "shareTarget: not a project or series of this group.", "shareTarget");
  const [row] = await selectRows<{ name: string }>(`SELECT name FROM ${type === "project" ? "projects" : "series"} WHERE id = :targetId`, {
    targetId,
  });
  return { type, id: targetId, label: row?.name ?? "" };
}

export const groupNameOf = (actor: Actor, groupId: string) => actor.memberships.find((m) => m.groupId === groupId)?.groupName ?? "";

export async function inviteMember(
  actor: Actor,
  input: { groupId: string; email: string; role: Role; shareTarget?: { type: ShareTargetType; id: string } },
): Promise<void> {
  const groupId = requireManagerOf(actor, input.groupId, "groupId");
  if (input.role === "steward" && !canSteward(actor, groupId))
    throw refuse(400, "role: only a data steward can make someone a data steward.", "role");
  if (input.role === "collaborator" && !input.shareTarget)
    throw refuse(400, "shareTarget: a collaborator needs a project or series to read.", "shareTarget");
  const share =
    input.role === "collaborator" && input.shareTarget ? await shareTargetOf(input.shareTarget.type, input.shareTarget.id, groupId) : null;
  const user = await User.findOne({ where: { email: input.email } });
  if (user && !share && (await Membership.findOne({ where: { groupId, userId: user.id } })))
    throw refuse(400, "email: this person is already a member; change their role below.", "email");
  const { invitation } = await sendInvitation({
    groupId,
    groupName: groupNameOf(actor, groupId),
    email: input.email,
    role: input.role,
    invitedBy: { id: actor.id, name: actor.name },
    share,
  });
  await auditAs(actor, groupId, "invitation-sent", "invitation", invitation.id, {
    email: input.email,
    role: input.role,
    share: share ? `${share.type}:${share.id}` : null,
  });
}

export async function revokeInvitation(actor: Actor, id: string): Promise<void> {
  const inv = await Invitation.findByPk(id);
  const groupId = requireManagerOf(actor, inv?.groupId ?? null);
  if (inv!.acceptedAt) throw refuse(400, "This invitation was already accepted.");
  await inv!.update({ revokedAt: new Date() });
  await auditAs(actor, groupId, "invitation-revoked", "invitation", inv!.id, { email: inv!.email });
}

export async function changeRole(actor: Actor, membershipId: string, role: Role): Promise<void> {
  const m = await Membership.findByPk(membershipId);
  const groupId = requireManagerOf(actor, m?.groupId ?? null);
  if (m!.userId === actor.id) throw refuse(400, "role: you cannot change your own role; ask another lead or steward.", "role");
  if ((role === "steward" || m!.role === "steward") && !canSteward(actor, groupId))
    throw refuse(400, "role: only a data steward can give or take the data steward role.", "role");
  const before = m!.role;
  await m!.update({ role });
  await auditAs(actor, groupId, "member-role-changed", "user", m!.userId, { from: before, to: role });
}

/** Ends a membership and, with it, the shares this group gave that person. */
export async function removeMember(actor: Actor, membershipId: string): Promise<void> {
  const m = await Membership.findByPk(membershipId);
  const groupId = requireManagerOf(actor, m?.groupId ?? null);
  if (m!.userId === actor.id) throw refuse(400, "You cannot remove yourself; ask another lead or steward.");
  if (m!.role === "steward" && !canSteward(actor, groupId)) throw refuse(400, "Only a data steward can remove a data steward.");
  await m!.destroy();
  await Share.update({ revokedAt: new Date() }, { where: { groupId, granteeUserId: m!.userId, revokedAt: null } });
  await auditAs(actor, groupId, "member-removed", "user", m!.userId, { role: m!.role });
}
