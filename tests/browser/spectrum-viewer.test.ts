import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { Spectrum } from "@/models";
import { DEMO, url } from "../helpers/app";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 304, 400, 401, 403, 404, 409, 413, 415, 422, 503);
// every other number checked here is a count or value this test itself created (known truth of its fixtures).

// A spectroscopist opens the demo's flagged spectrum (bleach of the first exciton and a new band
// below the gap, against its parent), reads the chart, switches to an energy axis and follows the
// flags between table and chart.
let browser: Browser;
let flaggedId: string;
let plId: string;
beforeAll(async () => {
  flaggedId = (await Spectrum.findOne({ where: { fileName: "cdse-0412-n-abs.csv" } }))!.id;
  plId = (await Spectrum.findOne({ where: { fileName: "pl-quench-10uM.csv" } }))!.id;
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("the spectrum viewer", () => {
  it("shows the flagged spectrum with its parent and difference, on nm and then eV, with linked flag markers", async () => {
    const page = await browser.newPage({ viewport: { width: 1440, height: 1000 } });
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await signInThroughForm(page, DEMO.spectroscopist);
    const response = await page.goto(url(`/spectra/${flaggedId}`));
    expect(response?.status()).toBe(200);
    await page.getByRole("heading", { level: 1, name: "cdse-0412-n-abs.csv" }).waitFor();
    await page.locator("[data-testid=spectrum-chart] canvas").waitFor({ timeout: 30_000 });

    // the four curves, the parent among them; the cadmium caution stays on the page
    const toggles = page.getByTestId("series-toggles");
    for (const name of ["measured", "smoothed", "parent reference", "difference (right axis)"])
      await expect(toggles.getByLabel(name).isChecked()).resolves.toBe(true);
    await expect(page.getByRole("note", { name: "Safety cautions" }).textContent()).resolves.toMatch(/Cadmium/);
    await expect(page.getByTestId("axis-caption").textContent()).resolves.toMatch(
      /Horizontal axis: Wavelength \(nm\)\. Vertical axis: Absorbance/,
    );

    // flags: bleach and new band, in the table and as markers
    const flagsTable = page.getByTestId("flags-table");
    await expect(flagsTable.textContent()).resolves.toMatch(/Exciton bleach/);
    await expect(flagsTable.textContent()).resolves.toMatch(/New band/);
    const rows = await flagsTable.locator("tbody tr").count();
    expect(rows).toBeGreaterThanOrEqual(2);
    await expect(page.getByTestId("marker-flag").count()).resolves.toBe(rows);
    await expect(page.getByTestId("marker-peak").count()).resolves.toBeGreaterThan(0);

    // hovering a row lights its marker; hovering a marker lights its row
    const bleachRow = flagsTable.locator("tbody tr", { hasText: "Exciton bleach" });
    const rowId = await bleachRow.getAttribute("data-row-id");
    await bleachRow.hover();
    await expect(page.locator(`[data-marker-id="${rowId}"]`).getAttribute("aria-pressed")).resolves.toBe("true");
    await page.mouse.move(5, 5);
    const newBandRow = flagsTable.locator("tbody tr", { hasText: "New band" });
    const newBandId = await newBandRow.getAttribute("data-row-id");
    // force: point straight at the marker's centre (the first-exciton peak marker sits 3 nm away)
    await page.locator(`[data-marker-id="${newBandId}"]`).hover({ force: true });
    await expect(newBandRow.getAttribute("aria-selected")).resolves.toBe("true");

    // crosshair readout: a value for every curve at the cursor
    const chart = page.getByTestId("spectrum-chart");
    const box = (await chart.boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.45, box.y + box.height * 0.5);
    await expect.poll(() => page.getByTestId("readout").textContent()).toMatch(/nm.*measured.*smoothed.*parent reference.*difference/);
    await screenshot(page, "spectrum-viewer-nm");

    // switch to eV
    await page.getByRole("group", { name: "Axis" }).getByRole("button", { name: "eV" }).click();
    await expect.poll(() => page.getByTestId("axis-caption").textContent(), { timeout: 30_000 }).toMatch(/Horizontal axis: Energy \(eV\)/);
    expect(page.url()).toMatch(/axis=ev/);
    await expect(flagsTable.textContent()).resolves.toMatch(/\d\.\d{3} eV/);
    await expect(page.getByTestId("marker-flag").count()).resolves.toBe(rows);
    // the chart is redrawn for the new axis: measure it again and point at it afresh
    const evBox = (await chart.boundingBox())!;
    await page.mouse.move(evBox.x - 20, evBox.y - 20);
    await page.mouse.move(evBox.x + evBox.width * 0.55, evBox.y + evBox.height * 0.5, { steps: 5 });
    await expect.poll(() => page.getByTestId("readout").textContent()).toMatch(/eV/);
    await screenshot(page, "spectrum-viewer-ev");

    // provenance and downloads are there
    await expect(page.getByTestId("provenance").textContent()).resolves.toMatch(/Savitzky–Golay/);
    await page.getByText("Downloads ▾").click();
    await expect(
      page
        .getByRole("link", { name: /JCAMP-DX/ })
        .first()
        .getAttribute("href"),
    ).resolves.toMatch(/format=jcamp&axis=ev/);
    expect(errors).toEqual([]);
    await page.close();
  });

  it("a PL spectrum carries the UV/laser light caution and converts emission on the energy axis", async () => {
    const page = await browser.newPage({ viewport: { width: 1440, height: 1000 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url(`/spectra/${plId}?axis=ev`));
    await page.locator("[data-testid=spectrum-chart] canvas").waitFor({ timeout: 30_000 });
    await expect(page.getByRole("note", { name: "Light safety" }).textContent()).resolves.toMatch(/laser safety/);
    await expect(page.getByText(/emission converted per eV \(Jacobian\)/).count()).resolves.toBe(1);
    await expect(page.getByTestId("axis-caption").textContent()).resolves.toMatch(/Vertical axis: Emission \(counts per eV\)/);
    await screenshot(page, "spectrum-viewer-pl-ev");
    await page.close();
  });
});
