import { randomUUID } from "node:crypto";
import bcrypt from "bcryptjs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { AuditEvent, User, models } from "@/models";
import { DEMO, DEMO_PASSWORD, url } from "../helpers/app";
import { signInOverHttp } from "../helpers/session";

describe("sign-in", () => {
  const email = `rate-${randomUUID().slice(0, 8)}@example.test`;
  beforeAll(async () => {
    models();
    await User.create({ email, name: "Rate Limit Probe", passwordHash: await bcrypt.hash("right-password", 4) });
  });
  afterAll(closeDb);

  it("gives a session for the right password and records the sign-in", async () => {
    const result = await signInOverHttp(DEMO.spectroscopist, DEMO_PASSWORD);
    expect(result.ok).toBe(true);
    const session = await (await fetch(url("/api/auth/session"), { headers: { cookie: result.cookie } })).json();
    expect(session.user.email).toBe(DEMO.spectroscopist);
    const events = await AuditEvent.count({ where: { action: "sign-in", actorLabel: DEMO.spectroscopist } });
    expect(events).toBeGreaterThan(0);
  });

  it("refuses a wrong password without a session", async () => {
    const result = await signInOverHttp(DEMO.spectroscopist, "not-the-password");
    expect(result.ok).toBe(false);
  });

  it("stores passwords as bcrypt hashes, never in clear", async () => {
    const user = await User.findOne({ where: { email: DEMO.lead } });
    expect(user?.passwordHash).toMatch(/^\$2[aby]\$\d{2}\$/);
    expect(await bcrypt.compare(DEMO_PASSWORD, user!.passwordHash)).toBe(true);
  });

  it("locks an account after 10 attempts in the window, even with the right password", async () => {
    for (let i = 0; i < 10; i++) {
      const wrong = await signInOverHttp(email, `wrong-${i}`);
      expect(wrong.ok).toBe(false);
    }
    const locked = await signInOverHttp(email, "right-password");
    expect(locked.ok).toBe(false);
    expect(locked.error).toMatch(/Too many sign-in attempts/);
  });
});
