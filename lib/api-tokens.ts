import { randomBytes } from "node:crypto";
import { hashToken } from "@/lib/auth/actor";
import { ApiToken } from "@/models";

/** How long a new token may live: the choices of the settings form (days; "never" is null). */
export const TOKEN_LIFETIMES = { never: null, "30": 30, "90": 90, "365": 365 } as const satisfies Record<string, number | null>;
export type TokenLifetime = keyof typeof TOKEN_LIFETIMES;

/** Makes a token for lab scripts. The secret is returned once; only its sha256 is stored. */
export async function issueApiToken(
  userId: string,
  name: string,
  lifetime: TokenLifetime = "never",
): Promise<{ id: string; secret: string }> {
  const secret = `bk_${randomBytes(24).toString("base64url")}`;
  const days = TOKEN_LIFETIMES[lifetime];
  const expiresAt = days === null ? null : new Date(Date.now() + days * 86_400_000);
  const row = await ApiToken.create({
    userId,
    name,
    tokenHash: hashToken(secret),
    prefix: secret.slice(0, 7),
    lastUsedAt: null,
    revokedAt: null,
    expiresAt,
  });
  return { id: row.id, secret };
}

export async function listApiTokens(userId: string) {
  const rows = await ApiToken.findAll({ where: { userId }, order: [["createdAt", "DESC"]] });
  return rows.map((t) => ({
    id: t.id,
    name: t.name,
    prefix: t.prefix,
    createdAt: t.createdAt.toISOString(),
    lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
    revokedAt: t.revokedAt?.toISOString() ?? null,
    expiresAt: t.expiresAt?.toISOString() ?? null,
  }));
}
