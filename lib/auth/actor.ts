import { createHash } from "node:crypto";
import { getServerSession } from "next-auth";
import { redirect } from "next/navigation";
import { ApiToken, Group, Membership, User, models } from "@/models";
import type { Role } from "@/models/Membership";
import { authOptions } from "./options";

export type ActorMembership = { groupId: string; groupName: string; groupSlug: string; role: Role };
export type Actor = {
  id: string;
  email: string;
  name: string;
  isSiteAdmin: boolean;
  memberships: ActorMembership[];
  via: "session" | "token";
};

export async function loadActor(userId: string, via: Actor["via"]): Promise<Actor | null> {
  models();
  const user = await User.findByPk(userId, {
    include: [{ model: Membership, include: [Group] }],
  });
  if (!user) return null;
  const memberships = ((user as unknown as { Memberships?: (Membership & { Group: Group })[] }).Memberships ?? []).map((m) => ({
    groupId: m.groupId,
    groupName: m.Group.name,
    groupSlug: m.Group.slug,
    role: m.role,
  }));
  memberships.sort((a, b) => a.groupName.localeCompare(b.groupName));
  return { id: user.id, email: user.email, name: user.name, isSiteAdmin: user.isSiteAdmin, memberships, via };
}

/** The signed-in person of this request, or null. */
export async function currentActor(): Promise<Actor | null> {
  const session = await getServerSession(authOptions);
  const id = (session?.user as { id?: string } | undefined)?.id;
  return id ? loadActor(id, "session") : null;
}

/** For pages: the signed-in person, or a redirect to sign-in. */
export async function requireActor(returnTo = "/"): Promise<Actor> {
  const actor = await currentActor();
  if (!actor) redirect(`/signin?callbackUrl=${encodeURIComponent(returnTo)}`);
  return actor;
}

export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

/** For route handlers: a Bearer API token, else the browser session. */
export async function actorFromRequest(request: Request): Promise<Actor | null> {
  const header = request.headers.get("authorization");
  if (header?.toLowerCase().startsWith("bearer ")) {
    const token = header.slice(7).trim();
    if (!token) return null;
    models();
    const row = await ApiToken.findOne({ where: { tokenHash: hashToken(token), revokedAt: null } });
    if (!row) return null;
    // Touch at most once a minute to keep the hot path free of writes.
    if (!row.lastUsedAt || Date.now() - row.lastUsedAt.getTime() > 60_000) {
      await row.update({ lastUsedAt: new Date() });
    }
    return loadActor(row.userId, "token");
  }
  return currentActor();
}
