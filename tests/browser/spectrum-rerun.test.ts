import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { AnalysisRun, Spectrum, models } from "@/models";
import { DEMO, url } from "../helpers/app";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";

// Re-running an analysis with other parameters from the spectrum page: a bad value is
// refused beside its field, a good one queues a new run, the page follows it to the
// end, and the earlier run stays listed for provenance.
let browser: Browser;
let spectrumId: string;
beforeAll(async () => {
  models();
  const spectrum = await Spectrum.findOne({ where: { fileName: "cdse-0412-n-abs.csv" } });
  if (!spectrum) throw new Error("demo spectrum cdse-0412-n-abs.csv is missing: did the seed run?");
  spectrumId = spectrum.id;
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("re-running an analysis from the spectrum page", () => {
  it("refuses an even window, then runs with an odd one and keeps the earlier run", async () => {
    const runsBefore = await AnalysisRun.count({ where: { spectrumId } });
    const page = await browser.newPage({ viewport: { width: 1440, height: 1600 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url(`/spectra/${spectrumId}`));
    const rerun = page.getByTestId("rerun");
    const windowField = rerun.getByLabel("Smoothing window (points, odd)");
    await windowField.fill("4");
    await rerun.getByRole("button", { name: "Re-run analysis" }).click();
    await expect.poll(() => rerun.locator("#rerun-smoothingWindow-error").textContent()).toMatch(/odd/i);

    // A window not used before, so the parameters are new and a new run is made.
    const window = 15 + 2 * (Math.floor(Date.now() / 1000) % 12);
    await windowField.fill(String(window));
    await rerun.getByRole("button", { name: "Re-run analysis" }).click();
    await expect.poll(() => page.getByTestId("run-progress").textContent(), { timeout: 60_000 }).toMatch(/finished/);
    await expect.poll(async () => (await page.getByTestId("runs").locator("li").count()), { timeout: 30_000 }).toBeGreaterThanOrEqual(2);
    expect(await AnalysisRun.count({ where: { spectrumId } })).toBe(runsBefore + 1);
    const latest = await AnalysisRun.findOne({ where: { spectrumId }, order: [["createdAt", "DESC"]] });
    expect(latest?.status).toBe("done");
    expect((latest?.parameters as { smoothingWindow?: number }).smoothingWindow).toBe(window);
    await screenshot(page, "spectrum-rerun-done");
    await page.close();
  });
});
