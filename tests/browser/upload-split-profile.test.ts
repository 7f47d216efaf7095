import { expect, it, describe } from "vitest";
import { Op } from "sequelize";
import { ImportProfile, Series, Spectrum } from "@/models";
import { DEMO, url } from "../helpers/app";
import { demoBrowser, screenshot, signInThroughForm } from "../helpers/browser";
import { syntheticAbsorptionCsv } from "../helpers/spectra";

// The upload page's preview as a person uses it on the demo lab: change the unit and the column,
// split a three-column file into three spectra of a series (series values from the headers), see a
// parent the analysis would refuse named beside the parent field, save the choices as an import
// profile, and drop a second file of the same habit that is read with it by itself. The files are
// generated (tests/helpers/spectra.ts: a Gaussian first exciton at the wavelength given).
const suite = demoBrowser();

function threeColumnFile(seed: number): Buffer {
  const cols = [500, 505, 512].map((nm, i) =>
    syntheticAbsorptionCsv({ excitonNm: nm, seed: seed + i, points: 300, startNm: 400, endNm: 700 })
      .trim()
      .split("\n")
      .slice(1)
      .map((l) => l.split(",")),
  );
  const rows = cols[0]!.map((_, r) => [cols[0]![r]![0], ...cols.map((c) => c[r]![1])].join(","));
  return Buffer.from(`Channel,0.5 eq,1 eq,2 eq\n${rows.join("\n")}\n`);
}

describe("splitting a file and saving an import profile on the upload page", () => {
  it("changes unit and column, splits into three series points, warns about a parent, saves a profile and reads the next file with it", async () => {
    const seed = Date.now() % 1e6;
    // profiles an earlier run of this test saved would match the same header: start without them
    await ImportProfile.destroy({ where: { projectId: suite.ids.project.id, name: { [Op.like]: "Plate reader %" } } });
    const series = await Series.create({
      projectId: suite.ids.project.id,
      name: `Browser split ${seed}`,
      kind: "titration",
      variableName: "PbS per CdSe",
      variableUnit: "eq",
      createdBy: null,
    });
    const page = await suite.browser.newPage({ viewport: { width: 1360, height: 1500 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url("/upload"));
    await page.getByLabel("Project").selectOption({ label: "Interdot charge transfer (Aurora Nanocrystal Lab)" });
    await page.getByLabel("Technique").selectOption("absorption");
    await page.getByLabel("Series", { exact: true }).selectOption({ label: series.name });

    const first = `plate-${seed}-a.csv`;
    await page.getByLabel("Choose files").setInputFiles([{ name: first, mimeType: "text/csv", buffer: threeColumnFile(seed) }]);
    const preview = page.getByTestId("file-preview");
    await expect
      .poll(() => preview.getByTestId("preview-x-unit").textContent(), { timeout: 30_000 })
      .toBe("nm (wavelength) (inferred from the values)");
    expect(await preview.getByTestId("preview-column").textContent()).toBe("0.5 eq");

    await preview.getByLabel("X unit for this file").selectOption("nm");
    await expect.poll(() => preview.getByTestId("preview-x-unit").textContent(), { timeout: 30_000 }).toBe("nm (wavelength) (chosen)");
    await preview.getByLabel("Column for this file").selectOption("1 eq");
    await expect.poll(() => preview.getByTestId("preview-column").textContent(), { timeout: 30_000 }).toBe("1 eq");

    // the demo's CdSe parent has its first exciton far from this file's (about 2.45 eV): named beside the field before anything is sent
    const picker = page.getByLabel("Parent reference spectrum");
    const parent = await picker.locator("option", { hasText: "cdse-0412-abs.csv" }).first().getAttribute("value");
    await picker.selectOption(parent!);
    const mismatch = page.getByTestId("parent-mismatch");
    await expect
      .poll(() => mismatch.textContent(), { timeout: 10_000 })
      .toMatch(
        new RegExp(
          `^The analysis will refuse this parent for ${first.replace(/\./g, "\\.")}: first excitons 2\\.4\\d\\d eV vs \\d\\.\\d{3} eV \\(\\d+ meV apart, more than \\d+ meV\\)\\.$`,
        ),
      );
    await screenshot(page, "upload-split-parent-refused");
    await picker.selectOption("");
    await expect.poll(() => mismatch.count()).toBe(0);

    await preview.getByTestId("preview-split").check();
    await expect
      .poll(() => preview.getByTestId("preview-creates").textContent(), { timeout: 30_000 })
      .toBe('3 absorption spectra, one per column: "0.5 eq" (0.5 eq), "1 eq" (1 eq), "2 eq" (2 eq)');
    const profileName = `Plate reader ${seed}`;
    await preview.getByLabel("Save these choices as a profile").fill(profileName);
    await preview.getByRole("button", { name: "Save profile" }).click();
    await expect
      .poll(() => preview.getByTestId("profile-saved").textContent(), { timeout: 10_000 })
      .toBe(`Saved as profile "${profileName}": files with the same header will be read this way.`);
    await expect.poll(() => page.getByTestId("profile-list").textContent(), { timeout: 10_000 }).toContain(profileName);
    await screenshot(page, "upload-split-preview");

    await page.getByTestId("start-upload").click();
    const list = page.getByTestId("file-list");
    await expect
      .poll(() => list.getByTestId("outcome-name").allTextContents(), { timeout: 60_000 })
      .toEqual(["0.5 eq → 0.5 eq", "1 eq → 1 eq", "2 eq → 2 eq"]);
    await expect.poll(async () => (await list.textContent())!.match(/analysed/g)?.length ?? 0, { timeout: 120_000 }).toBe(3);
    await screenshot(page, "upload-split-stored");
    await page.getByRole("button", { name: "Clear finished" }).click();

    // a second export of the same habit: the profile is matched by its header, nothing to choose
    const second = `plate-${seed}-b.csv`;
    await page.getByLabel("Choose files").setInputFiles([{ name: second, mimeType: "text/csv", buffer: threeColumnFile(seed + 50) }]);
    const next = page.getByTestId("file-preview");
    await expect
      .poll(() => next.getByTestId("preview-profile").textContent(), { timeout: 30_000 })
      .toBe(`"${profileName}" (matched by the file's header)`);
    expect(await next.getByTestId("preview-x-unit").textContent()).toBe("nm (wavelength) (chosen)");
    expect(await next.getByTestId("preview-creates").textContent()).toBe(
      '3 absorption spectra, one per column: "0.5 eq" (0.5 eq), "1 eq" (1 eq), "2 eq" (2 eq)',
    );
    // per trace: the "2 eq" column's value typed over its header's, the "1 eq" column left out
    const traces = next.getByTestId("preview-traces");
    await traces.locator('[data-trace="2 eq"]').getByLabel("series value").fill("4");
    await traces.locator('[data-trace="1 eq"]').getByLabel("leave out").check();
    expect(await traces.getByTestId("preview-left-out").textContent()).toBe("2 of 3 will be stored; 1 left out.");
    await screenshot(page, "upload-profile-matched");
    await page.getByTestId("start-upload").click();
    await expect.poll(async () => (await list.textContent())!.match(/Read with profile/g)?.length ?? 0, { timeout: 60_000 }).toBe(2);
    await expect.poll(async () => (await list.textContent())!.match(/analysed/g)?.length ?? 0, { timeout: 120_000 }).toBe(2);
    await expect.poll(() => list.getByTestId("outcome-name").allTextContents()).toEqual(["0.5 eq → 0.5 eq", "2 eq → 4 eq"]);
    await screenshot(page, "upload-profile-stored");

    const points = await Spectrum.findAll({
      where: { seriesId: series.id },
      order: [
        ["fileName", "ASC"],
        ["seriesValue", "ASC"],
      ],
    });
    expect(points.map((p) => [p.fileName, p.seriesValue])).toEqual([
      [first, 0.5],
      [first, 1],
      [first, 2],
      [second, 0.5],
      [second, 4],
    ]);
    await page.close();
  }, 300_000);
});
