import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, url } from "../helpers/app";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 304, 400, 401, 403, 404, 409, 413, 415, 422, 503);
// every other number checked here is a count or value this test itself created (known truth of its fixtures).

// A lab script's token: made in the app, shown once, usable with a Bearer header,
// refused from the moment it is revoked.
let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const projects = (token: string) => fetch(url("/api/v1/projects"), { headers: { authorization: `Bearer ${token}` } });

describe("API tokens in settings", () => {
  it("creates a token shown once, which works until it is revoked", async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url("/settings"));
    const name = `robot-${Date.now().toString(36)}`;
    await page.getByLabel("Token name").fill(name);
    await page.getByRole("button", { name: "Create token" }).click();
    const secret = (await page.getByTestId("new-token").textContent({ timeout: 30_000 }))!.trim();
    expect(secret).toMatch(/^bk_[A-Za-z0-9_-]{32}$/);
    await screenshot(page, "settings-token-created");

    const ok = await projects(secret);
    expect(ok.status).toBe(200);
    const body = (await ok.json()) as { projects: { name: string }[] };
    expect(body.projects.map((p) => p.name)).toContain("Interdot charge transfer");

    // Shown once: after a reload only the prefix is listed.
    await page.reload();
    expect(await page.getByTestId("new-token").count()).toBe(0);
    const row = page.locator("li", { hasText: name });
    expect(await row.textContent()).toContain(secret.slice(0, 7));
    expect(await row.textContent()).not.toContain(secret);

    await row.getByRole("button", { name: "Revoke" }).click();
    await expect.poll(() => row.textContent(), { timeout: 30_000 }).toContain("revoked");
    const refused = await projects(secret);
    expect(refused.status).toBe(401);
    await screenshot(page, "settings-token-revoked");
    await page.close();
  });

  it("refuses a made-up token", async () => {
    expect((await projects("bk_not-a-real-token-at-all-000000000000")).status).toBe(401);
  });
});
