import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { absorptionCsv } from "@/lib/demo/synthetic";
import { DEMO, url } from "../helpers/app";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";

// The spectroscopist's daily flow: drop exports, describe the batch once, watch them
// go through upload and analysis, open the flagged one.
let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("uploading exports in the browser", () => {
  it("stores and analyses a charged spectrum, refuses a bad file, and opens the flag", async () => {
    const page = await browser.newPage({ viewport: { width: 1360, height: 1100 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url("/upload"));
    await page.getByLabel("Project").selectOption({ label: "Interdot charge transfer (Aurora Nanocrystal Lab)" });
    await page.getByLabel("Technique").selectOption("absorption");
    await page.getByLabel("Sample").selectOption({ label: "AUR-CdSe-0412-n · CdSe" });
    const reference = page.getByLabel("Parent reference spectrum");
    const referenceValue = await reference.locator("option", { hasText: "cdse-0412-abs.csv" }).first().getAttribute("value");
    await reference.selectOption(referenceValue!);
    // A fresh noise seed makes the bytes new, so the file is stored rather than linked.
    const seed = Date.now() % 100000;
    const charged = absorptionCsv({ firstExcitonEv: 2.148, bleach: 0.3, seed }, "browser upload");
    await page.getByLabel("Choose files").setInputFiles([
      { name: `charged-${seed}.csv`, mimeType: "text/csv", buffer: Buffer.from(charged) },
      { name: "not-a-spectrum.csv", mimeType: "text/csv", buffer: Buffer.from("wavelength,absorbance\nfoo,bar\nbaz,qux\n") },
    ]);
    await page.getByTestId("start-upload").click();
    const list = page.getByTestId("file-list");
    await expect.poll(() => list.textContent(), { timeout: 60_000 }).toMatch(/analysed/);
    await expect.poll(() => list.textContent(), { timeout: 60_000 }).toMatch(/not-a-spectrum\.csv/);
    await expect
      .poll(async () => (await list.locator("[role=alert]").allTextContents()).join(" "), { timeout: 60_000 })
      .toMatch(/not-a-spectrum\.csv/);
    await screenshot(page, "upload-batch");

    await list
      .locator("li", { hasText: `charged-${seed}.csv` })
      .getByRole("link", { name: "open" })
      .click();
    await expect.poll(() => page.getByRole("heading", { level: 1 }).textContent()).toBe(`charged-${seed}.csv`);
    await expect.poll(() => page.getByTestId("flags-table").textContent(), { timeout: 30_000 }).toContain("Exciton bleach");
    await screenshot(page, "upload-opened-flag");
    await page.close();
  });
});
