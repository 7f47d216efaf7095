import http from "node:http";
import { afterAll, describe, expect, it } from "vitest";
import { hashToken } from "@/lib/auth/actor";
import { announceTokenRevoked } from "@/lib/auth/tokenRevocations";
import { closeDb } from "@/lib/db";
import { redis } from "@/lib/redis";
import { ApiToken } from "@/models";
import { url } from "../helpers/app";
import { createLab } from "../helpers/fixtures";

// The app runs as several processes (scripts/serve.mjs), each caching API tokens for a few
// seconds. A revoked token must be refused by every one of them at once. Each request below
// opens its own connection, so the cluster's round-robin spreads them over the processes.
afterAll(async () => {
  await closeDb();
  redis().disconnect();
});

function statusOnNewConnection(path: string, token: string): Promise<number> {
  return new Promise((resolve, reject) => {
    http
      .get(url(path), { agent: false, headers: { Authorization: `Bearer ${token}` } }, (res) => {
        res.resume();
        res.on("end", () => resolve(res.statusCode ?? 0));
      })
      .on("error", reject);
  });
}

describe("revoking an API token", () => {
  it("is refused by every app process at once, however warm their caches are", async () => {
    const lab = await createLab("spectroscopist");
    const warm = await Promise.all(Array.from({ length: 24 }, () => statusOnNewConnection("/api/v1/projects", lab.token)));
    expect(new Set(warm)).toEqual(new Set([200]));

    // What the settings page's revoke action does: mark it revoked, then announce it.
    const tokenHash = hashToken(lab.token);
    await ApiToken.update({ revokedAt: new Date() }, { where: { tokenHash } });
    await announceTokenRevoked(tokenHash);
    await new Promise((r) => setTimeout(r, 100)); // pub/sub delivery on loopback

    const after = await Promise.all(Array.from({ length: 24 }, () => statusOnNewConnection("/api/v1/projects", lab.token)));
    // 401 is "authentication required or failed" (RFC 9110 §15.5.2)
    expect(
      after.filter((s) => s !== 401),
      "answers other than 401 after the revoke",
    ).toEqual([]);
  });
});
