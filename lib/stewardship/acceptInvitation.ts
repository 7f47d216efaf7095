import bcrypt from "bcryptjs";
import { hashToken } from "@/lib/auth/actor";
import { recordAudit } from "@/lib/audit";
import { Group, Invitation, Membership, Share, User } from "@/models";
import { refuse } from "@/lib/errors";
import { sequelize } from "@/lib/db";

export type InvitationView = { email: string; groupName: string; role: string; accountExists: boolean };

/** The invitation behind a token if it can still be used; otherwise a Refusal saying why. */
export async function usableInvitation(token: string): Promise<{ invitation: Invitation; view: InvitationView }> {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) throw refuse(400, "This invitation link is not valid.");
  const invitation = await Invitation.findOne({ where: { tokenHash: hashToken(token) } });
  if (!invitation) throw refuse(400, "This invitation link is not valid.");
  if (invitation.acceptedAt) throw refuse(400, "This invitation was already used. Sign in instead.");
  if (invitation.revokedAt) throw refuse(400, "This invitation was withdrawn. Ask the person who sent it for a new one.");
  if (invitation.expiresAt.getTime() <= Date.now())
    throw refuse(400, "This invitation has expired. Ask the person who sent it for a new one.");
  const group = await Group.findByPk(invitation.groupId);
  const accountExists = (await User.count({ where: { email: invitation.email } })) > 0;
  return { invitation, view: { email: invitation.email, groupName: group?.name ?? "", role: invitation.role, accountExists } };
}

/**
 * Uses an invitation once: creates the account when there is none (name and password
 * given), then the membership, and for a collaborator the read-only share. The row is
 * locked so that two clicks on the same link accept it once.
 */
export async function acceptInvitation(
  token: string,
  who: { signedInUserId: string | null; name?: string; password?: string },
): Promise<{ userId: string; created: boolean }> {
  const db = sequelize();
  const { invitation } = await usableInvitation(token);
  const passwordHash = who.password ? await bcrypt.hash(who.password, 10) : null;
  return db.transaction(async (transaction) => {
    const inv = await Invitation.findByPk(invitation.id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!inv || inv.acceptedAt || inv.revokedAt || inv.expiresAt.getTime() <= Date.now())
      throw refuse(400, "This invitation can no longer be used.");
    let user = await User.findOne({ where: { email: inv.email }, transaction });
    let created = false;
    if (who.signedInUserId) {
      if (!user || user.id !== who.signedInUserId)
        throw refuse(
          400,
          `This invitation is for ${inv.email}. Sign out and open the link again, or ask for an invitation to your own address.`,
        );
    } else if (user) {
      throw refuse(400, `An account for ${inv.email} exists: sign in first, then open the link again.`);
    } else {
      if (!who.name || !passwordHash) throw refuse(400, "name: required.", "name");
      user = await User.create({ email: inv.email, name: who.name, passwordHash }, { transaction });
      created = true;
    }
    const membership = await Membership.findOne({ where: { groupId: inv.groupId, userId: user.id }, transaction });
    if (!membership) await Membership.create({ groupId: inv.groupId, userId: user.id, role: inv.role }, { transaction });
    else if (membership.role === "collaborator" && inv.role !== "collaborator")
      await membership.update({ role: inv.role }, { transaction });
    if (inv.role === "collaborator" && inv.shareTargetType && inv.shareTargetId) {
      await Share.create(
        {
          groupId: inv.groupId,
          targetType: inv.shareTargetType,
          targetId: inv.shareTargetId,
          granteeUserId: user.id,
          linkTokenHash: null,
          expiresAt: null,
          revokedAt: null,
          createdBy: inv.invitedBy,
        },
        { transaction },
      );
    }
    await inv.update({ acceptedAt: new Date(), acceptedBy: user.id }, { transaction });
    await recordAudit(
      {
        actorId: user.id,
        actorLabel: user.email,
        groupId: inv.groupId,
        action: "invitation-accepted",
        targetType: "invitation",
        targetId: inv.id,
        details: {
          role: inv.role,
          accountCreated: created,
          share: inv.shareTargetId ? `${inv.shareTargetType}:${inv.shareTargetId}` : null,
        },
      },
      transaction,
    );
    return { userId: user.id, created };
  });
}
