import type { Page } from "playwright-core";
import { Op } from "sequelize";
import { beforeAll, describe, expect, it } from "vitest";
import { Signature, Spectrum } from "@/models";
import { DEMO, url } from "../helpers/app";
import { demoBrowser, screenshot, signInThroughForm } from "../helpers/browser";

// What a chemist reads on each main page, at a desktop (1440 × 900) and a phone (390 × 844)
// window (common practice). Units are written as the SI Brochure (9th ed., §5.4) and the IUPAC Green
// Book (3rd ed.) write them: case matters ("meV" is not "MeV"), so no text-transform may touch a text
// holding a unit or symbol. Band words by technique: absorption bands of dots are excitonic
// transitions, PL bands emission bands, mid-IR bands vibrational bands or intraband candidates, and
// mid-IR spectra are read on a wavenumber axis running high to low (common practice).
const demo = demoBrowser();
const ids: Record<string, string> = {};

beforeAll(async () => {
  for (const [key, fileName] of [
    ["pl", "pl-quench-10uM.csv"],
    ["ir", "cdse-0412-n-midir.csv"],
    ["abs", "cdse-0412-n-abs.csv"],
  ] as const) {
    ids[key] = (await Spectrum.findOne({ where: { fileName } }))!.id;
  }
  // a flag on its band's peak: the bleach of titration-1.00eq.csv sits on the first exciton, so the
  // flag's marker and the peak's marker share one place on the chart
  ids.overlap = demo.ids.sharedSpectrum.id;
  ids.overlapA = (await Signature.findOne({ where: { spectrumId: ids.overlap, kind: "bleach", supersededAt: null } }))!.id;
  const flags = await Signature.findAll({ where: { supersededAt: null, energyEv: { [Op.ne]: null } }, attributes: ["id", "spectrumId"] });
  ids.signature = flags.find((f) => f.spectrumId === ids.abs)?.id ?? demo.ids.sharedSignature.id;
}, 60_000);

const UNIT = /(\beV\b|\bmeV\b|\bnm\b|cm⁻¹|µM|\bMiB\b|\bKiB\b|ε|F₀\/F|K_?SV|%)/;

/** Elements whose own text holds a unit or symbol but is drawn with a text-transform. */
async function transformedUnits(page: Page): Promise<string[]> {
  return page.evaluate((source) => {
    const unit = new RegExp(source);
    const out: string[] = [];
    for (const el of Array.from(document.querySelectorAll("body *"))) {
      const own = Array.from(el.childNodes)
        .filter((n) => n.nodeType === Node.TEXT_NODE)
        .map((n) => n.textContent ?? "")
        .join("");
      if (!unit.test(own)) continue;
      const t = getComputedStyle(el).textTransform;
      if (t !== "none") out.push(`${el.tagName.toLowerCase()} "${own.trim().slice(0, 40)}" (${t})`);
    }
    return out;
  }, UNIT.source);
}

async function visibleText(page: Page): Promise<string> {
  return page.evaluate(() => document.body.innerText);
}

async function checkPage(page: Page, path: string, shot: string, phone: boolean) {
  const response = await page.goto(url(path));
  expect(response?.status(), path).toBe(200);
  await page.getByRole("heading", { level: 1 }).first().waitFor();
  await page.waitForLoadState("networkidle");
  expect(await transformedUnits(page), `${path}: units drawn in another case`).toEqual([]);
  const text = await visibleText(page);
  // internal codes and broken quantities never reach the screen
  expect(text, path).not.toMatch(/\bcm-1\b|percent-transmittance/);
  expect(text, path).not.toMatch(/(^|[\s(])[-−]0\.0+(?![\d])/); // no "−0.0"
  expect(text, path).not.toMatch(/(^|\D)1 (peaks|flags|spectra|points|signatures|samples)\b/); // plurals agree
  expect(text, path).not.toMatch(/per equivalents/);
  if (phone) {
    const { scroll, client } = await page.evaluate(() => ({
      scroll: document.documentElement.scrollWidth,
      client: document.documentElement.clientWidth,
    }));
    expect(scroll, `${path}: ${scroll} px wide in a ${client} px window`).toBeLessThanOrEqual(client);
  }
  await screenshot(page, shot);
}

describe("units and words on every main page", () => {
  for (const [width, height, tag] of [
    [1440, 900, "wide"],
    [390, 844, "phone"],
  ] as const) {
    it(`reads right at ${width} px`, async () => {
      const page = await demo.browser.newPage({ viewport: { width, height } });
      await signInThroughForm(page, DEMO.lead);
      const paths: [string, string][] = [
        ["/", "overview"],
        ["/samples", "samples"],
        ["/spectra", "spectra"],
        [`/spectra/${ids.abs}`, "spectrum-absorption"],
        [`/spectra/${ids.pl}`, "spectrum-pl"],
        [`/spectra/${ids.ir}`, "spectrum-ir"],
        ["/series", "series"],
        [`/series/${demo.ids.sharedSeries.id}`, "series-titration"],
        [`/series/${demo.ids.privateSeries.id}`, "series-pl"],
        ["/review", "review"],
        [`/review/${ids.signature}`, "review-signature"],
        ["/upload", "upload"],
        ["/settings", "settings"],
      ];
      for (const [path, name] of paths) await checkPage(page, path, `units-${tag}-${name}`, tag === "phone");
      await page.close();
      const steward = await demo.browser.newPage({ viewport: { width, height } });
      await signInThroughForm(steward, DEMO.steward);
      for (const path of [
        "/stewardship",
        "/stewardship/policies",
        "/stewardship/holds",
        "/stewardship/sharing",
        "/stewardship/audit",
        "/stewardship/storage",
      ]) {
        await checkPage(steward, path, `units-${tag}-steward-${path.split("/").pop()}`, tag === "phone");
      }
      await steward.close();
    }, 240_000);
  }
});

/** Positions (on the axis of the labels) and left edges of the peak markers on the chart. */
async function peakMarkers(page: Page): Promise<{ at: number; left: number }[]> {
  const out: { at: number; left: number }[] = [];
  for (const m of await page.getByTestId("marker-peak").all()) {
    const label = (await m.getAttribute("aria-label")) ?? "";
    const box = await m.boundingBox();
    const at = Number(/at ([\d.]+)/.exec(label)?.[1]);
    if (box && Number.isFinite(at)) out.push({ at, left: box.x });
  }
  return out.sort((a, b) => a.at - b.at);
}

describe("words by technique", () => {
  it("a PL spectrum lists emission bands and calls none of them an exciton", async () => {
    const page = await demo.browser.newPage({ viewport: { width: 1440, height: 900 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url(`/spectra/${ids.pl}`));
    await page.locator("[data-testid=spectrum-chart] canvas").waitFor({ timeout: 30_000 });
    const bands = page.getByTestId("bands-section");
    expect(await bands.locator("h2").textContent()).toBe("Emission bands");
    expect(await bands.textContent()).not.toMatch(/exciton/i);
    expect(await bands.textContent()).toMatch(/emission maximum/);
    for (const m of await page.getByTestId("marker-peak").all()) expect(await m.getAttribute("aria-label")).not.toMatch(/exciton/i);
    expect(await page.getByTestId("axis-direction").textContent()).toBe("Low → high"); // wavelength reads low to high
    await screenshot(page, "words-pl-spectrum");
    await page.close();
  });

  it("a mid-IR spectrum lists vibrational bands and the intraband candidate in cm⁻¹, on an axis running high to low", async () => {
    const page = await demo.browser.newPage({ viewport: { width: 1440, height: 900 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url(`/spectra/${ids.ir}`));
    await page.locator("[data-testid=spectrum-chart] canvas").waitFor({ timeout: 30_000 });
    const bands = page.getByTestId("bands-section");
    expect(await bands.locator("h2").textContent()).toBe("Vibrational bands");
    const head = await page.getByTestId("peaks-table").locator("thead").textContent();
    expect(head).toMatch(/Wavenumber \(cm⁻¹\)/);
    expect(head).toMatch(/FWHM \(cm⁻¹\)/);
    expect(head).not.toMatch(/eV|nm/);
    // the seed's reduced dots carry an intraband band at 0.27 eV = 2178 cm⁻¹ (lib/demo/synthetic.ts
    // midIrCsv; 1 eV = 8065.54 cm⁻¹, CODATA 2018)
    const intraband = page.getByTestId("intraband-section");
    expect(await intraband.locator("h2").textContent()).toBe("Intraband candidates");
    const cm1 = Number((await intraband.locator("tbody tr td").first().textContent())?.replace(/[^\d.]/g, ""));
    expect(Math.abs(cm1 - 0.27 * 8065.54)).toBeLessThan(60); // within the band's fitted width
    // high to low: a larger wavenumber sits further left
    expect(await page.getByTestId("axis-direction").textContent()).toBe("High → low");
    await expect(page.getByTestId("axis-caption").textContent()).resolves.toMatch(/Wavenumber \(cm⁻¹\), high to low/);
    const before = await peakMarkers(page);
    if (before.length >= 2) expect(before[0]!.left).toBeGreaterThan(before.at(-1)!.left);
    await screenshot(page, "words-ir-spectrum-high-to-low");
    await page.getByTestId("axis-direction").click();
    await expect.poll(() => page.getByTestId("axis-caption").textContent()).not.toMatch(/high to low/);
    expect(page.url()).toMatch(/dir=asc/);
    const after = await peakMarkers(page);
    if (after.length >= 2) expect(after[0]!.left).toBeLessThan(after.at(-1)!.left);
    await screenshot(page, "words-ir-spectrum-low-to-high");
    await page.close();
  });

  it("markers at one place can each be picked: by their labels and through the chooser", async () => {
    const page = await demo.browser.newPage({ viewport: { width: 1440, height: 900 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url(`/spectra/${ids.overlap}`));
    await page.locator("[data-testid=spectrum-chart] canvas").waitFor({ timeout: 30_000 });
    const peak = page.locator(`[data-testid=marker-peak][aria-label^="First exciton"]`);
    const peakId = (await peak.getAttribute("data-marker-id"))!;
    // each label picks its own marker, though both sit at one place
    for (const id of [ids.overlapA!, peakId]) {
      await page.locator(`[data-marker-id="${id}"]`).click();
      await expect.poll(() => page.locator(`[data-row-id="${id}"]`).getAttribute("aria-selected")).toBe("true");
      await page.locator(`[data-marker-id="${id}"]`).click(); // unpin
    }
    // the shared strip opens a chooser that offers both
    const a = (await page.locator(`[data-marker-id="${ids.overlapA}"]`).boundingBox())!;
    await page.mouse.click(a.x + a.width / 2, a.y + 200);
    const chooser = page.getByTestId("marker-chooser");
    await chooser.waitFor();
    expect(await chooser.getByRole("menuitem").count()).toBeGreaterThanOrEqual(2);
    await screenshot(page, "markers-chooser");
    const peakLabel = (await peak.getAttribute("aria-label"))!;
    await chooser.getByRole("menuitem", { name: peakLabel }).click();
    await expect.poll(() => page.locator(`[data-row-id="${peakId}"]`).getAttribute("aria-selected")).toBe("true");
    expect(await chooser.count()).toBe(0);
    await page.close();
  });

  it("the review evidence is drawn in the house look with the uncertainty's unit", async () => {
    const page = await demo.browser.newPage({ viewport: { width: 1440, height: 900 } });
    await signInThroughForm(page, DEMO.lead);
    await page.goto(url(`/review/${ids.signature}`));
    const chart = page.getByTestId("evidence-chart");
    await chart.locator("canvas").waitFor({ timeout: 30_000 });
    expect(await page.locator(".u-legend").count()).toBe(0); // not the library's legend with "--" placeholders
    expect(await chart.textContent()).toMatch(/sample .*reference/);
    expect(await chart.getByTestId("plot-marker").count()).toBe(1);
    expect(await page.locator("dl").first().textContent()).toMatch(
      /standard uncertainty [\d.]+ (%|meV|eV|cm⁻¹|absorbance|counts|\(ratio\))/,
    );
    await screenshot(page, "review-evidence");
    await page.close();
  });
});
