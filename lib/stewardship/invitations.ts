import { randomBytes } from "node:crypto";
import { hashToken } from "@/lib/auth/actor";
import { config } from "@/lib/config";
import { sendMail } from "@/lib/mail";
import { Invitation } from "@/models";
import type { Role } from "@/models/Membership";

export const INVITATION_DAYS = 7;

/** Creates an invitation (token stored as its sha256) and e-mails the one-time link. */
export async function sendInvitation(input: {
  groupId: string;
  groupName: string;
  email: string;
  role: Role;
  invitedBy: { id: string; name: string };
  share?: { type: "project" | "series"; id: string; label: string } | null;
}): Promise<{ invitation: Invitation; link: string }> {
  const token = randomBytes(32).toString("base64url");
  const invitation = await Invitation.create({
    groupId: input.groupId,
    email: input.email,
    role: input.role,
    shareTargetType: input.share?.type ?? null,
    shareTargetId: input.share?.id ?? null,
    tokenHash: hashToken(token),
    invitedBy: input.invitedBy.id,
    expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000),
    acceptedAt: null,
    acceptedBy: null,
    revokedAt: null,
  });
  const link = `${config().APP_URL.replace(/\/$/, "")}/invite/${token}`;
  const what =
    input.role === "collaborator"
      ? `read-only access to the ${input.share?.type} "${input.share?.label}"`
      : `membership as ${input.role === "lead" ? "group lead" : input.role === "steward" ? "data steward" : "spectroscopist"}`;
  await sendMail(
    input.email,
    `Invitation to ${input.groupName} on Bandkeep`,
    [
      `${input.invitedBy.name} invites you to ${input.groupName} on Bandkeep, with ${what}.`,
      "",
      `Accept here (the link works once and expires in ${INVITATION_DAYS} days):`,
      link,
      "",
      "If you did not expect this, ignore this message.",
    ].join("\n"),
  );
  return { invitation, link };
}
