import { randomBytes } from "node:crypto";
import { afterAll, describe, expect, it } from "vitest";
import { hashToken } from "@/lib/auth/actor";
import { issueApiToken } from "@/lib/api-tokens";
import { closeDb } from "@/lib/db";
import { ApiToken } from "@/models";
import { url } from "../helpers/app";
import { createUser } from "../helpers/fixtures";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 401); expiry periods are this
// project's own choices (30, 90, 365 days: common practice for API tokens).

// Issue #11, item 8: API tokens may expire. Status codes as RFC 9110 defines them (200, 401);
// the times are this test's own fixtures.
afterAll(closeDb);
const projects = (token: string) => fetch(url("/api/v1/projects"), { headers: { authorization: `Bearer ${token}` } });

describe("API token expiry", () => {
  it("a token with a lifetime works until it ends, then is refused even by a process that cached it", async () => {
    const { user } = await createUser("expiry");
    const secret = `bk_${randomBytes(24).toString("base64url")}`;
    await ApiToken.create({
      userId: user.id,
      name: "short-lived",
      tokenHash: hashToken(secret),
      prefix: secret.slice(0, 7),
      lastUsedAt: null,
      revokedAt: null,
      expiresAt: new Date(Date.now() + 2500),
    });
    expect((await projects(secret)).status).toBe(200);
    expect((await ApiToken.findOne({ where: { tokenHash: hashToken(secret) } }))!.lastUsedAt).not.toBeNull(); // "last used" is recorded
    await new Promise((r) => setTimeout(r, 3000));
    expect((await projects(secret)).status).toBe(401);
  });

  it("issueApiToken sets the chosen lifetime, and none for never", async () => {
    const { user } = await createUser("lifetime");
    const a = await issueApiToken(user.id, "a", "30");
    const b = await issueApiToken(user.id, "b");
    const rowA = await ApiToken.findByPk(a.id);
    const rowB = await ApiToken.findByPk(b.id);
    const days = (rowA!.expiresAt!.getTime() - rowA!.createdAt.getTime()) / 86_400_000;
    expect(days).toBeGreaterThan(29.99);
    expect(days).toBeLessThan(30.01);
    expect(rowB!.expiresAt).toBeNull();
    expect((await projects(a.secret)).status).toBe(200);
  });
});
