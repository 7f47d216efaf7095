import { readFileSync } from "node:fs";
import path from "node:path";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, url } from "../helpers/app";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";

// The preview on the upload page, with a headerless three-column file made from a real CdSe
// export (real-spectra/cdse-absorbance-growth-series.csv, PROVENANCE.md: 251 rows, 600 → 350 nm).
const realDir = path.resolve(process.cwd(), "..", "shared", "real-spectra");
const lines = readFileSync(path.join(realDir, "cdse-absorbance-growth-series.csv"), "utf8")
  .split(/\r?\n/)
  .filter((l) => l.trim());
const head = lines[0]!.split(",");
const [k30, k240] = [head.indexOf("30 s"), head.indexOf("240 s")];

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("previewing a file before storing it", () => {
  it("shows the inferred unit and columns, follows a change of column and unit, applies it to the batch, and stores the file", async () => {
    const page = await browser.newPage({ viewport: { width: 1360, height: 1300 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url("/upload"));
    await page.getByLabel("Project").selectOption({ label: "Interdot charge transfer (Aurora Nanocrystal Lab)" });
    await page.getByLabel("Technique").selectOption("absorption");
    const seed = Date.now() % 100000;
    // a fresh last digit on one value makes the bytes new, so the file is stored rather than linked
    const body = lines.slice(1).map((l, i) => {
      const c = l.split(",");
      return `${c[0]},${c[k30]},${c[k240]}${i === 0 ? seed : ""}`;
    });
    const name = `bare-three-${seed}.csv`;
    await page.getByLabel("Choose files").setInputFiles([{ name, mimeType: "text/csv", buffer: Buffer.from(body.join("\n")) }]);

    const preview = page.getByTestId("file-preview");
    await expect
      .poll(() => preview.getByTestId("preview-x-unit").textContent(), { timeout: 30_000 })
      .toBe("nm (wavelength) (inferred from the values)");
    expect(await preview.getByTestId("preview-column").textContent()).toBe("column 2");
    expect(await preview.getByTestId("preview-creates").textContent()).toBe(
      'one absorption spectrum from column "column 2" (251 points, 350.01–599.99 nm)',
    );
    await expect.poll(() => preview.getByRole("img").count()).toBe(1);
    await screenshot(page, "upload-preview-inferred");

    await preview.getByLabel("Column for this file").selectOption("column 3");
    await expect.poll(() => preview.getByTestId("preview-column").textContent(), { timeout: 30_000 }).toBe("column 3");
    await preview.getByLabel("X unit for this file").selectOption("nm");
    await expect.poll(() => preview.getByTestId("preview-x-unit").textContent(), { timeout: 30_000 }).toBe("nm (wavelength) (chosen)");
    await screenshot(page, "upload-preview-chosen");

    await preview.getByRole("button", { name: "Use these choices for the whole batch" }).click();
    await expect.poll(() => page.locator("#column").inputValue()).toBe("column 3");
    await expect.poll(() => page.locator("#xUnit").inputValue()).toBe("nm");
    await expect.poll(() => preview.getByTestId("preview-x-unit").textContent(), { timeout: 30_000 }).toBe("nm (wavelength) (chosen)");

    await page.getByTestId("start-upload").click();
    const list = page.getByTestId("file-list");
    await expect.poll(() => list.textContent(), { timeout: 90_000 }).toMatch(/analysed/);
    await screenshot(page, "upload-preview-stored");
    await page.close();
  });

  it("a file the reader refuses says so in its preview, before anything is sent", async () => {
    const page = await browser.newPage({ viewport: { width: 1360, height: 900 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url("/upload"));
    await page.getByLabel("Project").selectOption({ label: "Interdot charge transfer (Aurora Nanocrystal Lab)" });
    // 2000 → 1200 written high to low: nm or cm-1 (docs/ingest.md rule 5)
    const text = Array.from({ length: 100 }, (_, i) => `${2000 - 8 * i}\t0.${100 + i}`).join("\n");
    await page.getByLabel("Choose files").setInputFiles([{ name: "ambiguous.txt", mimeType: "text/plain", buffer: Buffer.from(text) }]);
    const error = page.getByTestId("preview-error");
    await expect
      .poll(() => error.textContent(), { timeout: 30_000 })
      .toMatch(/^ambiguous\.txt, column "column 1": X unit unknown.*could be nm or cm⁻¹; choose the X unit/);
    await page.getByTestId("file-preview").getByLabel("X unit for this file").selectOption("nm");
    await expect.poll(() => page.getByTestId("preview-x-unit").textContent(), { timeout: 30_000 }).toBe("nm (wavelength) (chosen)");
    await screenshot(page, "upload-preview-ambiguous-chosen");
    await page.close();
  });
});
