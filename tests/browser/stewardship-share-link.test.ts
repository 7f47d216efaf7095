import type { Browser } from "playwright-core";
import { afterAll, beforeAll, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { type Series, type Spectrum } from "@/models";
import { url } from "../helpers/app";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";
import { createLab, createSample, createSeries, type Lab } from "../helpers/fixtures";
import { storedSpectrum } from "../integration/stewardship-fixtures";
import { formatWhen } from "@/lib/format/dates";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 304, 400, 401, 403, 404, 409, 413, 415, 422, 503);
// every other number checked here is a count or value this test itself created (known truth of its fixtures).

// A data steward creates a read-only link on the sharing page (shown once, with a copy
// button), someone without an account opens it, the steward revokes it, and the same
// page reloaded says the link is not valid — in a group made for this test.

let browser: Browser;
let lab: Lab;
let series: Series;
let spectra: Spectrum[];
beforeAll(async () => {
  browser = await launchBrowser();
  lab = await createLab("steward");
  const sample = await createSample(lab, "CdSe/ZnS");
  series = await createSeries(lab);
  spectra = [
    await storedSpectrum(lab, { seriesId: series.id, seriesValue: 0, sampleId: sample.id }),
    await storedSpectrum(lab, { seriesId: series.id, seriesValue: 0.25, sampleId: sample.id }),
  ];
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

it("steward creates a link, an anonymous visitor reads the series, revocation ends it at the next load", async () => {
  const steward = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  await steward.grantPermissions(["clipboard-read", "clipboard-write"], { origin: url("") });
  const page = await steward.newPage();
  await signInThroughForm(page, lab.user.email, "test-password");
  await page.goto(url("/stewardship/sharing"));
  const form = page.getByRole("form", { name: "New share link" });
  await form.getByLabel("What").selectOption(`series:${series.id}`);
  const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 16);
  await form.getByLabel("Expires (UTC, optional)").fill(tomorrow);
  await form.getByRole("button", { name: "Create link" }).click();
  const shown = page.getByTestId("new-share-link-url");
  await shown.waitFor();
  const link = await shown.inputValue();
  expect(link).toMatch(new RegExp(`^${url("/shared/")}[A-Za-z0-9_-]{43}$`));
  const token = link.split("/").pop()!;
  await page.getByRole("button", { name: "Copy link" }).click();
  await page.getByText("Copied.").waitFor();
  expect(await page.evaluate(() => navigator.clipboard.readText())).toBe(link);
  const row = page.getByTestId("share-link-row").filter({ hasText: series.name });
  await expect.poll(() => row.count()).toBe(1);
  expect(await row.textContent()).toContain(`/shared/${token.slice(0, 6)}…`);
  expect(await row.textContent()).toContain("in force");
  expect(await row.textContent()).toContain(formatWhen(`${tomorrow}:00Z`)); // the one on-screen style, e.g. "3 Dec 2026, 13:03 UTC"
  await screenshot(page, "stewardship-share-link-created");

  // Shown once: after a reload only the prefix is left.
  await page.reload();
  await page.getByTestId("share-links-table").waitFor();
  expect(await page.getByTestId("new-share-link").count()).toBe(0);
  expect(await page.content()).not.toContain(token);

  const visitor = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  const anon = await visitor.newPage();
  const first = await anon.goto(link);
  expect(first?.status()).toBe(200);
  expect(await anon.getByTestId("shared-title").textContent()).toBe(series.name);
  for (const s of spectra) await anon.getByRole("link", { name: s.fileName }).waitFor();
  expect(await anon.getByTestId("shared-banner").textContent()).toContain(`Read-only link shared by ${lab.group.name}`);
  await anon.getByRole("note", { name: "Safety cautions" }).waitFor();
  expect(await anon.getByRole("navigation", { name: "Main" }).count()).toBe(0); // not the signed-in shell
  await screenshot(anon, "stewardship-share-link-visitor");

  await row.getByRole("button", { name: "Revoke" }).click();
  // The row's form goes with the refreshed list: its state now reads "revoked" and it has no Revoke button.
  await expect.poll(async () => (await row.textContent()) ?? "", { timeout: 15_000 }).toContain("revoked");
  expect(await row.getByRole("button", { name: "Revoke" }).count()).toBe(0);
  await screenshot(page, "stewardship-share-link-revoked");

  const again = await anon.reload();
  expect(again?.status()).toBe(404);
  await anon.getByTestId("link-not-valid").waitFor();
  expect(await anon.getByRole("heading", { level: 1 }).textContent()).toBe("This link is not valid");
  expect(await anon.content()).not.toContain(spectra[0]!.fileName);
  await screenshot(anon, "stewardship-share-link-invalid");
  await visitor.close();
  await steward.close();
});
