import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, url } from "../helpers/app";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";

// What each demo role sees in the navigation rail after signing in through the form.
const EXPECTED_NAV: Record<keyof typeof DEMO, string[]> = {
  lead: ["Overview", "Upload", "Samples", "Spectra", "Series", "Review", "Settings"],
  spectroscopist: ["Overview", "Upload", "Samples", "Spectra", "Series", "Settings"],
  steward: ["Overview", "Samples", "Spectra", "Series", "Data care", "Settings"],
  collaborator: ["Overview", "Series", "Settings"],
  otherGroup: ["Overview", "Upload", "Samples", "Spectra", "Series", "Settings"],
};

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("signing in as each demo role", () => {
  for (const [role, email] of Object.entries(DEMO) as [keyof typeof DEMO, string][]) {
    it(`${role} sees the navigation for that role`, async () => {
      const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
      const page = await context.newPage();
      await signInThroughForm(page, email);
      const labels = await page.getByRole("navigation", { name: "Main" }).getByTestId("nav-label").allTextContents();
      expect(labels).toEqual(EXPECTED_NAV[role]);
      await screenshot(page, `role-${role}`);
      await context.close();
    });
  }

  it("sends a signed-out visitor to the sign-in page and refuses a wrong password", async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await page.goto(url("/samples"));
    expect(new URL(page.url()).pathname).toBe("/signin");
    await page.getByLabel("E-mail").fill(DEMO.lead);
    await page.getByLabel("Password").fill("wrong password");
    await page.getByRole("button", { name: "Sign in" }).click();
    // Scoped to the form: Next.js adds a route announcer of its own with role="alert".
    await expect.poll(() => page.locator("form [role=alert]").textContent()).toContain("do not match");
    await screenshot(page, "sign-in-refused");
    await context.close();
  });

  it("shows cadmium cautions on a cadmium sample", async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url("/samples"));
    await screenshot(page, "samples-list");
    await page.getByRole("link", { name: "AUR-CdSe-0412", exact: true }).click();
    const note = page.getByRole("note", { name: "Safety cautions" });
    await expect.poll(() => note.textContent()).toContain("Cadmium compound: may cause cancer");
    expect(await note.textContent()).toContain("chemical hygiene plan");
    await screenshot(page, "sample-cadmium-caution");
    await context.close();
  });
});
