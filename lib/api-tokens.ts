import { randomBytes } from "node:crypto";
import { hashToken } from "@/lib/auth/actor";
import { ApiToken, models } from "@/models";

/** Makes a token for lab scripts. The secret is returned once; only its sha256 is stored. */
export async function issueApiToken(userId: string, name: string): Promise<{ id: string; secret: string }> {
  models();
  const secret = `bk_${randomBytes(24).toString("base64url")}`;
  const row = await ApiToken.create({ userId, name, tokenHash: hashToken(secret), prefix: secret.slice(0, 7), lastUsedAt: null, revokedAt: null });
  return { id: row.id, secret };
}

export async function listApiTokens(userId: string) {
  models();
  const rows = await ApiToken.findAll({ where: { userId }, order: [["createdAt", "DESC"]] });
  return rows.map((t) => ({
    id: t.id, name: t.name, prefix: t.prefix, createdAt: t.createdAt.toISOString(),
    lastUsedAt: t.lastUsedAt?.toISOString() ?? null, revokedAt: t.revokedAt?.toISOString() ?? null,
  }));
}
