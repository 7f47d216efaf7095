import { getServerSession } from "next-auth";
import { redirect } from "next/navigation";
import { Op } from "sequelize";
import { selectRows } from "@/lib/db";
import { sha256Hex } from "@/lib/hash";
import { ApiToken } from "@/models";
import type { Role } from "@/models/Membership";
import { authOptions } from "./options";
import { FORGET_ALL, onTokenRevoked, revocationEpoch } from "./tokenRevocations";
import { processSingleton, processSlot } from "@/lib/processSingleton";

export type ActorMembership = { groupId: string; groupName: string; groupSlug: string; role: Role };
export type Actor = {
  id: string;
  email: string;
  name: string;
  isSiteAdmin: boolean;
  memberships: ActorMembership[];
  via: "session" | "token";
};

type ActorRow = {
  id: string;
  email: string;
  name: string;
  is_site_admin: boolean;
  session_version: number;
  group_id: string | null;
  group_name: string | null;
  group_slug: string | null;
  role: Role | null;
};

/** A person with their memberships, in one query. */
export async function loadActor(userId: string, via: Actor["via"], sessionVersion?: number): Promise<Actor | null> {
  const rows = await selectRows<ActorRow>(
    `SELECT u.id, u.email, u.name, u.is_site_admin, u.session_version, m.group_id, g.name AS group_name, g.slug AS group_slug, m.role
     FROM users u LEFT JOIN memberships m ON m.user_id = u.id LEFT JOIN groups g ON g.id = m.group_id
     WHERE u.id = :userId`,
    { userId },
  );
  const first = rows[0];
  if (!first) return null;
  // A session signed out (or otherwise revoked) since it was issued.
  if (sessionVersion !== undefined && first.session_version !== sessionVersion) return null;
  const memberships = rows
    .filter((r) => r.group_id !== null && r.role !== null)
    .map((r) => ({ groupId: r.group_id!, groupName: r.group_name ?? "", groupSlug: r.group_slug ?? "", role: r.role! }))
    .sort((a, b) => a.groupName.localeCompare(b.groupName));
  return { id: first.id, email: first.email, name: first.name, isSiteAdmin: first.is_site_admin, memberships, via };
}

/** The signed-in person of this request, or null. */
export async function currentActor(): Promise<Actor | null> {
  const session = await getServerSession(authOptions);
  const user = session?.user as { id?: string; sessionVersion?: number } | undefined;
  return user?.id ? loadActor(user.id, "session", user.sessionVersion ?? 0) : null;
}

/** For pages: the signed-in person, or a redirect to sign-in. */
export async function requireActor(returnTo = "/"): Promise<Actor> {
  const actor = await currentActor();
  if (!actor) redirect(`/signin?callbackUrl=${encodeURIComponent(returnTo)}`);
  return actor;
}

export function hashToken(token: string): string {
  return sha256Hex(token);
}

// Lab scripts call in bursts with one token: the token's person is kept for a few
// seconds so each call does not repeat the same two queries. A revoked token is forgotten
// by every app process at once (tokenRevocations.ts); a role change shows within AUTH_CACHE_MS.
const TOKEN_CACHE_MS = Number.isFinite(Number(process.env.AUTH_CACHE_MS)) ? Number(process.env.AUTH_CACHE_MS) : 5000;
// On globalThis: the server action that revokes and the route handler that reads may be
// bundled as separate module copies in one process.
const tokenCache = processSingleton("bandkeepTokenCache", () => new Map<string, { actor: Actor; until: number }>());

export function forgetApiToken(tokenHash: string): void {
  if (tokenHash === FORGET_ALL) tokenCache.clear();
  else tokenCache.delete(tokenHash);
}

const listening = processSlot<boolean>("bandkeepTokenListener");
function listenForRevocations(): void {
  if (listening.get()) return;
  listening.set(true);
  onTokenRevoked(forgetApiToken);
}

async function actorFromToken(token: string): Promise<Actor | null> {
  const tokenHash = hashToken(token);
  const cached = tokenCache.get(tokenHash);
  if (cached && cached.until > Date.now()) return cached.actor;
  if (TOKEN_CACHE_MS > 0) listenForRevocations();
  const epoch = TOKEN_CACHE_MS > 0 ? revocationEpoch() : null;
  const row = await ApiToken.findOne({
    where: { tokenHash, revokedAt: null, [Op.or]: [{ expiresAt: null }, { expiresAt: { [Op.gt]: new Date() } }] },
  });
  if (!row) {
    tokenCache.delete(tokenHash);
    return null;
  }
  // Touch at most once a minute to keep the hot path free of writes.
  if (!row.lastUsedAt || Date.now() - row.lastUsedAt.getTime() > 60_000) {
    await row.update({ lastUsedAt: new Date() });
  }
  const actor = await loadActor(row.userId, "token");
  // Cached only while revocations are heard, and not when one arrived during this lookup.
  if (actor && epoch !== null && revocationEpoch() === epoch) {
    if (tokenCache.size > 1000) tokenCache.clear();
    // Never past the token's expiry.
    tokenCache.set(tokenHash, { actor, until: Math.min(Date.now() + TOKEN_CACHE_MS, row.expiresAt?.getTime() ?? Infinity) });
  }
  return actor;
}

/** For route handlers: a Bearer API token, else the browser session. */
export async function actorFromRequest(request: Request): Promise<Actor | null> {
  const header = request.headers.get("authorization");
  if (header?.toLowerCase().startsWith("bearer ")) {
    const token = header.slice(7).trim();
    return token ? actorFromToken(token) : null;
  }
  return currentActor();
}
