import { afterAll, expect, it } from "vitest";
import { canReadSeries, sharedTargets } from "@/lib/auth/access";
import { loadActor } from "@/lib/auth/actor";
import { closeDb } from "@/lib/db";
import { acceptInvitation, usableInvitation } from "@/lib/stewardship/acceptInvitation";
import { sendInvitation } from "@/lib/stewardship/invitations";
import { Invitation, Membership, Share, User } from "@/models";
import { createLab, createSeries, uniq } from "../helpers/fixtures";
import { waitFor } from "../helpers/waitFor";
import { Refusal } from "@/lib/errors";

// Sources: every count checked here is of records this test itself created (known truth of its fixtures).
// An invitation travels through the SMTP fake; its one-time link creates the account,
// the collaborator membership and the read-only share; a second use is refused; a
// revoked share ends access at once.

afterAll(closeDb);

type Captured = { to: string[]; subject: string; raw: string };

async function linkFor(email: string): Promise<string> {
  const base = process.env.MAIL_VIEW_URL ?? "http://127.0.0.1:25350";
  const found = await waitFor(
    `the invitation mail to ${email}`,
    async () => {
      const list = (await (await fetch(`${base}/messages`)).json()) as Captured[];
      return list.find((m) => m.to.includes(email));
    },
    15_000,
  );
  const text = found.raw.replace(/=\r?\n/g, "").replace(/=3D/g, "=");
  const match = text.match(/\/invite\/([A-Za-z0-9_-]{20,100})/);
  if (!match) throw new Error(`no invitation link in:\n${text}`);
  return match[1]!;
}

it("invites a collaborator by e-mail: one-time link, account, membership, share; revocation takes effect at once", async () => {
  const lab = await createLab("steward");
  const series = await createSeries(lab);
  const email = `guest-${uniq()}@partner.test`;
  await sendInvitation({
    groupId: lab.group.id,
    groupName: lab.group.name,
    email,
    role: "collaborator",
    invitedBy: { id: lab.user.id, name: lab.user.name },
    share: { type: "series", id: series.id, label: series.name },
  });
  const token = await linkFor(email);
  const stored = await Invitation.findOne({ where: { email } });
  expect(stored!.tokenHash).not.toContain(token); // only the hash is stored
  expect((await usableInvitation(token)).view).toMatchObject({ email, role: "collaborator", accountExists: false });

  await expect(acceptInvitation(token, { signedInUserId: null, name: "Guest", password: undefined })).rejects.toThrow(/name: required/);
  const { userId, created } = await acceptInvitation(token, { signedInUserId: null, name: "Guest Reader", password: "a long password" });
  expect(created).toBe(true);
  expect(await Membership.findOne({ where: { groupId: lab.group.id, userId } })).toMatchObject({ role: "collaborator" });
  await expect(acceptInvitation(token, { signedInUserId: userId })).rejects.toBeInstanceOf(Refusal); // single use
  await expect(usableInvitation(token)).rejects.toThrow(/already used/);

  const guest = (await loadActor(userId, "session"))!;
  expect(await canReadSeries(guest, series)).toBe(true);
  const other = await createSeries(lab);
  expect(await canReadSeries(guest, other)).toBe(false); // sees nothing else
  await Share.update({ revokedAt: new Date() }, { where: { granteeUserId: userId } });
  expect(await canReadSeries(guest, series)).toBe(false);
  expect((await sharedTargets(guest)).seriesIds).toEqual([]);
  expect(await User.count({ where: { email } })).toBe(1);
});

it("refuses an expired or unknown invitation with a reason", async () => {
  const lab = await createLab("lead");
  const email = `late-${uniq()}@example.test`;
  await sendInvitation({
    groupId: lab.group.id,
    groupName: lab.group.name,
    email,
    role: "spectroscopist",
    invitedBy: { id: lab.user.id, name: lab.user.name },
  });
  const token = await linkFor(email);
  await Invitation.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { email } });
  await expect(usableInvitation(token)).rejects.toThrow(/expired/);
  await expect(usableInvitation("x".repeat(43))).rejects.toThrow(/not valid/);
});
