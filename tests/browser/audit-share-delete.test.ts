import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { loadActor } from "@/lib/auth/actor";
import { closeDb } from "@/lib/db";
import { createShareLink } from "@/lib/stewardship/shareLinks";
import { User } from "@/models";
import { DEMO, url } from "../helpers/app";
import { demoIds } from "../helpers/demo-ids";
import { createLab } from "../helpers/fixtures";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";
import { storedSpectrum } from "../integration/stewardship-fixtures";

// What a person sees: the steward's audit trail as sentences with filters and links, a signed-out
// visitor's share page with a plot, and the banner after deleting a spectrum — at 1440 and 390 px.

let browser: Browser;
let ids: Awaited<ReturnType<typeof demoIds>>;
beforeAll(async () => {
  ids = await demoIds();
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

const noSideScroll = (page: import("playwright-core").Page) =>
  page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth + 1);

describe("audit trail", () => {
  it("reads as sentences, filters by category and person, folds sign-ins, links to what it names", { timeout: 240_000 }, async () => {
    const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    const page = await context.newPage();
    // two sign-ins in a row, so there is something to fold
    await signInThroughForm(page, DEMO.steward);
    await context.clearCookies();
    await signInThroughForm(page, DEMO.steward);
    await page.goto(url("/stewardship/audit"));
    const lines = page.getByTestId("audit-line");
    await lines.first().waitFor();
    expect(await page.getByTestId("audit-count").textContent()).toMatch(/^(about )?[\d,]+ events?$/);
    const all = await lines.allTextContents();
    expect(all.some((t) => / uploaded .+\.csv/.test(t))).toBe(true);
    expect(all.join("\n")).not.toMatch(/spectrum\.upload|signature-decided|\{"/); // no raw codes or JSON on screen
    await screenshot(page, "audit-trail-1440");

    await page.getByLabel("What").selectOption("sign-in");
    await page.getByRole("button", { name: "Apply" }).click();
    await page.waitForURL(/category=sign-in/);
    expect(await lines.first().textContent()).toMatch(/signed in \d+ times (between .+ UTC and|at) .+ UTC/);
    await screenshot(page, "audit-trail-sign-ins");

    await page.goto(url("/stewardship/audit?category=upload"));
    const link = lines.first().getByRole("link").first();
    const href = await link.getAttribute("href");
    expect(href).toMatch(/^\/spectra\/[0-9a-f-]{36}$/);
    await link.click();
    await page.waitForURL(new RegExp(`${href}$`));
    await page.getByRole("heading", { level: 1 }).waitFor();

    const lead = await User.findOne({ where: { email: DEMO.lead } });
    await page.goto(url(`/stewardship/audit?person=${lead!.id}`));
    await lines.first().waitFor();
    const byLead = await lines.allTextContents();
    expect(byLead.length).toBeGreaterThan(0);
    for (const t of byLead) expect(t).toContain(lead!.name);
    await context.close();
  });

  it("fits a phone", { timeout: 240_000 }, async () => {
    const context = await browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true });
    const page = await context.newPage();
    await signInThroughForm(page, DEMO.steward);
    await page.goto(url("/stewardship/audit"));
    await page.getByTestId("audit-line").first().waitFor();
    expect(await noSideScroll(page)).toBe(true);
    await screenshot(page, "audit-trail-390");
    await context.close();
  });
});

describe("share page", () => {
  it(
    "shows a signed-out visitor a plot, peaks, flags and processed downloads of the shared series, supernatants included",
    { timeout: 240_000 },
    async () => {
      const steward = await User.findOne({ where: { email: DEMO.steward } });
      const { token } = await createShareLink((await loadActor(steward!.id, "session"))!, {
        targetType: "series",
        targetId: ids.sharedSeries.id,
        expiresAt: null,
      });
      for (const width of [1440, 390]) {
        const context = await browser.newContext({ viewport: { width, height: 900 } });
        const page = await context.newPage();
        await page.goto(url(`/shared/${token}`));
        const panel = page.getByTestId("shared-spectrum");
        await panel.locator("canvas").first().waitFor({ timeout: 30_000 });
        await page.getByTestId("shared-peaks").waitFor();
        expect(await page.getByTestId("shared-csv").getAttribute("href")).toMatch(/\/curves\/[0-9a-f-]{36}\?format=csv&axis=nm$/);
        expect((await page.content()).toLowerCase()).not.toContain("awaiting review");
        await screenshot(page, `share-page-${width}`);
        if (width === 390) expect(await noSideScroll(page)).toBe(true);
        if (width === 1440) {
          await page.getByTestId("shared-supernatants").getByRole("link", { name: "Plot" }).first().click();
          await page.waitForURL(/spectrum=/);
          await panel.locator("canvas").first().waitFor({ timeout: 30_000 });
          expect(await panel.locator("h2").textContent()).not.toBe("");
          await screenshot(page, "share-page-supernatant");
        }
        await context.close();
      }
    },
  );
});

describe("deletion", () => {
  it("confirms with 'Delete' typed with a capital and shows what was deleted", { timeout: 240_000 }, async () => {
    const lab = await createLab("spectroscopist");
    const spectrum = await storedSpectrum(lab);
    const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    const page = await context.newPage();
    await signInThroughForm(page, lab.user.email, "test-password");
    await page.goto(url(`/spectra/${spectrum.id}`));
    const form = page.getByRole("form", { name: "Delete spectrum" });
    await form.getByLabel("Type delete to confirm").fill("Delete");
    await form.getByRole("button", { name: "Delete" }).click();
    const banner = page.getByTestId("deleted-banner");
    await banner.waitFor();
    expect(await banner.textContent()).toContain(`Deleted ${spectrum.fileName} from ${lab.project.name}`);
    expect(await banner.textContent()).toContain("cannot be restored");
    await screenshot(page, "deleted-banner");
    await context.close();
  });
});
