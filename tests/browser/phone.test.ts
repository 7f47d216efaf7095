import type { Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { DEMO, url } from "../helpers/app";
import { demoBrowser, screenshot, signInThroughForm } from "../helpers/browser";

// A phone-sized window (390 × 844 CSS px, a common phone viewport; common practice): each main page
// fits the width, so nothing scrolls sideways except a wide table inside its own card.
const demo = demoBrowser();

async function pageWidth(page: Page): Promise<{ scroll: number; client: number }> {
  return page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, client: document.documentElement.clientWidth }));
}

async function expectFits(page: Page, path: string, shot: string) {
  const response = await page.goto(url(path));
  expect(response?.status(), path).toBe(200);
  await page.getByRole("heading", { level: 1 }).first().waitFor();
  const { scroll, client } = await pageWidth(page);
  expect(scroll, `${path}: page is ${scroll} px wide in a ${client} px window`).toBeLessThanOrEqual(client);
  await screenshot(page, shot);
}

describe("pages on a phone", () => {
  it("the lead's pages fit 390 px and the navigation folds into a menu", async () => {
    const page = await demo.browser.newPage({ viewport: { width: 390, height: 844 } });
    await signInThroughForm(page, DEMO.lead);
    expect(await page.getByRole("navigation", { name: "Main" }).count()).toBe(0); // folded away
    await page.getByRole("button", { name: "Menu" }).click();
    await page
      .getByRole("navigation", { name: "Main" })
      .getByRole("link", { name: /Spectra/ })
      .click();
    await page.waitForURL(/\/spectra$/);
    await expect.poll(() => page.getByRole("navigation", { name: "Main" }).count()).toBe(0); // closed again after navigating
    await screenshot(page, "phone-lead-spectra");
    for (const [path, shot] of [
      ["/", "phone-lead-overview"],
      ["/samples", "phone-lead-samples"],
      ["/series", "phone-lead-series"],
      [`/series/${demo.ids.sharedSeries.id}`, "phone-lead-series-detail"],
      [`/spectra/${demo.ids.privateSpectrum.id}`, "phone-lead-spectrum"],
      ["/review", "phone-lead-review"],
      ["/settings", "phone-lead-settings"],
    ] as const) {
      await expectFits(page, path, shot);
    }
    await page.close();
  });

  it("the steward's data-care pages fit 390 px", async () => {
    const page = await demo.browser.newPage({ viewport: { width: 390, height: 844 } });
    await signInThroughForm(page, DEMO.steward);
    for (const path of [
      "/stewardship",
      "/stewardship/policies",
      "/stewardship/holds",
      "/stewardship/sharing",
      "/stewardship/audit",
      "/stewardship/storage",
    ]) {
      await expectFits(page, path, `phone-steward-${path.split("/").pop()}`);
    }
    await page.close();
  });
});
