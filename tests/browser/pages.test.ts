import type { Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { DEMO, url } from "../helpers/app";
import { demoBrowser, screenshot, signInThroughForm } from "../helpers/browser";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 304, 400, 401, 403, 404, 409, 413, 415, 422, 503);
// every other number checked here is a count or value this test itself created (known truth of its fixtures).

// Every page of the shell, opened by the people who use it, renders its own heading
// and never the error page.
const demo = demoBrowser();

async function expectPage(page: Page, path: string, heading: string | RegExp, shot: string) {
  const response = await page.goto(url(path));
  expect(response?.status(), path).toBe(200);
  await expect.poll(() => page.getByRole("heading", { level: 1 }).first().textContent(), { message: path }).toMatch(heading);
  expect(await page.getByText("This page could not be shown").count(), path).toBe(0);
  await screenshot(page, shot);
}

describe("pages as the people who use them see them", () => {
  it("a group lead walks the shell", async () => {
    const page = await demo.browser.newPage({ viewport: { width: 1360, height: 900 } });
    await signInThroughForm(page, DEMO.lead);
    await expectPage(page, "/", /Welcome, Mira Castellan/, "lead-overview");
    await expectPage(page, "/samples", "Samples", "lead-samples");
    await expectPage(page, "/spectra", "Spectra", "lead-spectra");
    await expectPage(page, `/spectra/${demo.ids.privateSpectrum.id}`, "cdse-0412-abs.csv", "lead-spectrum");
    await expectPage(page, "/series", "Series", "lead-series");
    await expectPage(page, `/series/${demo.ids.sharedSeries.id}`, "CdSe + PbS titration", "lead-series-detail");
    await expectPage(page, "/review", "Review", "lead-review");
    await expectPage(page, "/settings", "Settings", "lead-settings");
    await page.close();
  });

  it("a data steward reads the audit trail, including sign-ins", async () => {
    const page = await demo.browser.newPage({ viewport: { width: 1360, height: 900 } });
    await signInThroughForm(page, DEMO.steward);
    await expectPage(page, "/stewardship", "Clean-up due", "steward-cleanup-due");
    await expectPage(page, "/stewardship/audit", "Audit trail", "steward-audit");
    // Each event is a sentence (sign-ins folded per person), not a code: the steward's own sign-in reads "… signed in".
    expect(await page.getByTestId("audit-lines").textContent()).toMatch(/signed in/);
    expect(await page.locator('[data-testid="audit-line"][data-action="sign-in"]').count()).toBeGreaterThan(0);
    await page.close();
  });

  it("a collaborator sees the shared series and nothing else", async () => {
    const page = await demo.browser.newPage({ viewport: { width: 1360, height: 900 } });
    await signInThroughForm(page, DEMO.collaborator);
    await expectPage(page, "/", /Welcome/, "collaborator-overview");
    expect(await page.getByRole("link", { name: "CdSe + PbS titration" }).count()).toBe(1);
    expect(await page.getByText("CdSe PL quench by PbS").count()).toBe(0);
    const refused = await page.goto(url(`/spectra/${demo.ids.privateSpectrum.id}`));
    expect(refused?.status()).toBe(404);
    await page.close();
  });

  it("a spectroscopist registers a sample and sees the cautions for it", async () => {
    const page = await demo.browser.newPage({ viewport: { width: 1360, height: 1000 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url("/samples/new"));
    const name = `AUR-PbSe-${Date.now().toString(36)}`;
    await page.getByLabel("Batch name").fill(name);
    await page.getByLabel("Material").fill("PbSe");
    await page.getByLabel("Solvent").fill("toluene");
    expect(await page.getByRole("note", { name: "Safety cautions" }).textContent()).toContain(
      "Lead compound: may damage fertility or the unborn child",
    );
    await page.getByRole("button", { name: "Register sample" }).click();
    await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe(name);
    expect(await page.getByRole("note", { name: "Safety cautions" }).textContent()).toContain(
      "Toluene: highly flammable liquid and vapour",
    );
    await screenshot(page, "spectroscopist-new-sample");
    // The same name again is refused beside the field, and the form keeps its values.
    await page.goto(url("/samples/new"));
    await page.getByLabel("Batch name").fill(name);
    await page.getByLabel("Material").fill("PbSe");
    await page.getByRole("button", { name: "Register sample" }).click();
    await expect.poll(() => page.locator("#name-error").textContent()).toContain("already exists");
    await screenshot(page, "spectroscopist-duplicate-sample");
    await page.close();
  });
});
