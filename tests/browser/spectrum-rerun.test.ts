import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { AnalysisRun, Spectrum } from "@/models";
import { DEMO, url } from "../helpers/app";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";

// Re-running an analysis with other parameters from the spectrum page: a bad value is
// refused beside its field, a good one queues a new run, the page follows it to the
// end, and the earlier run stays listed for provenance.
let browser: Browser;
let spectrumId: string;
let repeatId: string;
let parentId: string;
async function demoSpectrumId(fileName: string): Promise<string> {
  const spectrum = await Spectrum.findOne({ where: { fileName } });
  if (!spectrum) throw new Error(`demo spectrum ${fileName} is missing: did the seed run?`);
  return spectrum.id;
}
beforeAll(async () => {
  spectrumId = await demoSpectrumId("cdse-0412-n-abs.csv");
  // a repeat of the parent that no other test reads, so its new run changes nothing they check
  repeatId = await demoSpectrumId("cdse-0412-repeat.csv");
  parentId = await demoSpectrumId("cdse-0412-abs.csv");
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
    await expect.poll(async () => await page.getByTestId("runs").locator("li").count(), { timeout: 30_000 }).toBeGreaterThanOrEqual(2);
    expect(await AnalysisRun.count({ where: { spectrumId } })).toBe(runsBefore + 1);
    const latest = await AnalysisRun.findOne({ where: { spectrumId }, order: [["createdAt", "DESC"]] });
    expect(latest?.status).toBe("done");
    expect((latest?.parameters as { smoothingWindow?: number }).smoothingWindow).toBe(window);
    await screenshot(page, "spectrum-rerun-done");
    await page.close();
  });

  it("normalises by concentration: a wavelength out of bounds is refused beside its field, then the new run shows its factor", async () => {
    const runsBefore = await AnalysisRun.count({ where: { spectrumId: repeatId } });
    const page = await browser.newPage({ viewport: { width: 1440, height: 1600 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url(`/spectra/${repeatId}`));
    const rerun = page.getByTestId("rerun");
    const mode = rerun.getByLabel("Scale the sample");
    await mode.selectOption({ label: "at a wavelength" });
    await rerun.getByLabel("Wavelength (nm)").fill("40");
    await rerun.getByRole("button", { name: "Re-run analysis" }).click();
    await expect
      .poll(() => rerun.locator("#rerun-normalizationWavelengthNm-error").textContent())
      .toBe("Wavelength must lie between 100 and 25000 nm");
    await screenshot(page, "spectrum-rerun-normalisation-refused");

    // Within 3 % of the parent's concentration (a repeat of it), so the new run raises no flag;
    // a value not used before, so the parameters are new and a new run is made.
    const sampleConcentration = (1.001 + (Math.floor(Date.now() / 1000) % 29) / 1000).toFixed(3);
    await mode.selectOption({ label: "by concentration" });
    await expect.poll(() => rerun.getByLabel("Wavelength (nm)").count()).toBe(0);
    await rerun.getByLabel("Sample concentration").fill(sampleConcentration);
    await rerun.getByLabel("Reference concentration").fill("1");
    await rerun.getByRole("button", { name: "Re-run analysis" }).click();
    await expect.poll(() => page.getByTestId("run-progress").textContent(), { timeout: 60_000 }).toMatch(/finished/);
    // the factor is reference ÷ sample concentration (docs/analysis-json.md), shown to 4 significant digits
    const factor = (1 / Number(sampleConcentration)).toPrecision(4);
    await expect
      .poll(() => page.getByTestId("provenance-normalization").textContent(), { timeout: 30_000 })
      .toBe(`by concentration, sample ${Number(sampleConcentration)} : reference 1 (× ${factor})`);
    expect(await AnalysisRun.count({ where: { spectrumId: repeatId } })).toBe(runsBefore + 1);
    const latest = await AnalysisRun.findOne({ where: { spectrumId: repeatId }, order: [["createdAt", "DESC"]] });
    expect(latest?.status).toBe("done");
    expect((latest?.parameters as { normalization?: unknown }).normalization).toEqual({
      mode: "concentration",
      sampleConcentration: Number(sampleConcentration),
      referenceConcentration: 1,
    });
    await expect.poll(async () => page.getByTestId("runs").locator("li").count(), { timeout: 30_000 }).toBe(runsBefore + 1);
    await screenshot(page, "spectrum-rerun-normalised");

    // 900–996 nm is inside the accepted bounds but outside the data (the demo files span 400–750 nm):
    // the run fails with the engine's message, and the page keeps the concentration run. (A value
    // not used before, so that a second run of this test against the same database asks anew.)
    const outside = 900 + (Math.floor(Date.now() / 1000) % 97);
    await expect.poll(() => mode.inputValue()).toBe("");
    await mode.selectOption({ label: "at a wavelength" });
    await rerun.getByLabel("Wavelength (nm)").fill(String(outside));
    await rerun.getByRole("button", { name: "Re-run analysis" }).click();
    await expect
      .poll(() => page.getByTestId("run-progress").textContent(), { timeout: 30_000 })
      .toMatch(
        new RegExp(
          `The new run failed: cdse-0412-repeat\\.csv: normalisation wavelength ${outside} nm lies outside the range shared by the sample and its reference \\(400\\.0–750\\.0 nm\\)`,
        ),
      );
    expect(await page.getByTestId("provenance-normalization").textContent()).toContain("by concentration");
    await expect.poll(() => page.getByTestId("runs").textContent(), { timeout: 30_000 }).toContain(`${outside} nm lies outside`);
    expect(await page.getByRole("button", { name: "Re-run analysis" }).isVisible()).toBe(true);
    expect((await Spectrum.findByPk(repeatId))?.status).toBe("analysed");
    await screenshot(page, "spectrum-rerun-normalisation-failed");
    await page.close();
  });

  it("offers no normalisation for a spectrum without a parent reference", async () => {
    const page = await browser.newPage({ viewport: { width: 1440, height: 1000 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url(`/spectra/${parentId}`));
    const rerun = page.getByTestId("rerun");
    expect(await rerun.getByLabel("Scale the sample").isDisabled()).toBe(true);
    expect(await rerun.getByTestId("rerun-normalization").textContent()).toContain("this spectrum has none");
    await screenshot(page, "spectrum-rerun-no-reference");
    await page.close();
  });
});
