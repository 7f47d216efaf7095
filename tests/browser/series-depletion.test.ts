import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { Op } from "sequelize";
import { Spectrum } from "@/models";
import { DEMO, url } from "../helpers/app";
import { SCREENSHOT_DIR, demoBrowser, screenshot, signInThroughForm } from "../helpers/browser";

// The demo titration (scripts/seed.ts): 0.5 µM CdSe in every mixture binds PbS 1:1, and each
// point's supernatant spectrum is linked to it. The panel must read them and find that ratio.

const HC = 1239.841984; // eV·nm, CODATA 2018
const E1 = 2.148; // the demo CdSe's first exciton, eV (scripts/seed.ts)
// Yu, Qu, Guo, Peng, Chem. Mater. 2003, 15, 2854: CdSe diameter from the first exciton, ε = 5857·D^2.65.
const yuEpsilon = (l: number) => 5857 * (1.6122e-9 * l ** 4 - 2.6575e-6 * l ** 3 + 1.6242e-3 * l ** 2 - 0.4277 * l + 41.57) ** 2.65;

const demo = demoBrowser();

describe("composition from supernatant depletion", () => {
  it("reads the linked supernatant spectra and finds the 1:1 product; names a bad typed line", async () => {
    const page = await demo.browser.newPage({ viewport: { width: 1360, height: 1000 } });
    await signInThroughForm(page, DEMO.lead);
    await page.goto(url(`/series/${demo.ids.sharedSeries.id}`));
    const panel = page.getByTestId("depletion-panel");
    const readings = panel.getByTestId("depletion-readings");
    await readings.waitFor({ timeout: 60_000 });
    const cells = await readings
      .locator("tbody tr")
      .evaluateAll((rows) => rows.map((r) => [...r.querySelectorAll("td")].map((td) => td.textContent ?? "")));
    expect(cells.length).toBe(6); // one supernatant per point
    // At 0.25 equivalents 0.375 µM CdSe is left and no PbS: Beer–Lambert A = ε·c·l with Yu 2003 ε
    // (the seed's own noise is 0.0005 and the panel reads at the analysed first exciton).
    expect(cells[0]![0]).toBe("0.25");
    expect(Math.abs(Number(cells[0]![2]) - yuEpsilon(HC / E1) * 0.375e-6)).toBeLessThan(0.003);

    await panel.getByLabel("added A in each mixture (µM)").fill("0.5");
    const summary = panel.getByTestId("depletion-summary");
    await summary.waitFor();
    const text = (await summary.textContent()) ?? "";
    const ratio = Number(/X:A ([\d.]+)/.exec(text)?.[1]);
    expect(Math.abs(ratio - 1)).toBeLessThan(0.1); // made as a 1:1 product
    expect(text).toContain("constant: a definite composition");
    await panel.getByTestId("depletion-composition").scrollIntoViewIfNeeded();
    await screenshot(page, "series-depletion-linked");
    await panel.screenshot({ path: join(SCREENSHOT_DIR, "series-depletion-linked-panel.png") });

    // The typed fallback names the line it cannot read.
    await panel.getByLabel("typed in").check();
    await panel.getByLabel(/Points, one per line/).fill("0.5, 0.25, 0.07, 0.001\n0.5, 0.5, 0.05");
    await expect.poll(async () => panel.getByTestId("depletion-errors").textContent()).toContain("Points, line 2: give four numbers");

    // A supernatant's own page says whose supernatant it is and links back to the series.
    const points = await Spectrum.findAll({ where: { seriesId: demo.ids.sharedSeries.id }, attributes: ["id"] });
    const supernatant = await Spectrum.findOne({ where: { supernatantOfSpectrumId: { [Op.in]: points.map((p) => p.id) } } });
    const point = await Spectrum.findByPk(supernatant!.supernatantOfSpectrumId!);
    await page.goto(url(`/spectra/${supernatant!.id}`));
    const note = page.getByTestId("supernatant-of");
    await note.waitFor();
    expect(await note.textContent()).toContain(`Supernatant of ${point!.fileName}`);
    expect(await note.locator(`a[href="/series/${point!.seriesId}"]`).count()).toBe(1);
    await screenshot(page, "spectrum-supernatant-of");
    await page.close();
  });

  it("tells how to link a supernatant where none is linked yet, and links and unlinks one", async () => {
    const page = await demo.browser.newPage({ viewport: { width: 1360, height: 1000 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url(`/series/${demo.ids.privateSeries.id}`)); // a titration kind of series with no supernatants
    const panel = page.getByTestId("depletion-panel");
    expect(await panel.getByLabel("from linked supernatant spectra (0 linked)").isChecked()).toBe(true);
    const empty = panel.getByTestId("depletion-empty");
    await empty.waitFor();
    expect(await empty.textContent()).toContain("No supernatant spectra linked yet.");
    expect(await empty.getByRole("link", { name: "upload" }).getAttribute("href")).toBe("/upload");
    await panel.screenshot({ path: join(SCREENSHOT_DIR, "series-depletion-empty-panel.png") });

    // Link a stored absorption spectrum to a point through the form, then unlink it again.
    const links = panel.getByTestId("supernatant-links");
    const summary = () => links.locator("summary").textContent();
    expect(await summary()).toContain("Links: 0 of 5 points");
    await links.getByLabel(/^Supernatant spectrum/).selectOption({ label: "cdse-0412-repeat.csv" });
    await links.getByLabel(/^is the supernatant of the point/).selectOption({ index: 1 });
    await links.getByRole("button", { name: "Link", exact: true }).click();
    await links.getByRole("status").filter({ hasText: "Supernatant linked." }).waitFor();
    await expect.poll(summary).toContain("Links: 1 of 5 points");
    await links.getByRole("button", { name: "Unlink cdse-0412-repeat.csv" }).click();
    await expect.poll(summary).toContain("Links: 0 of 5 points");
    await page.close();
  });
});
