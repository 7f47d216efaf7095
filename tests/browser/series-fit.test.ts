import { describe, expect, it } from "vitest";
import { DEMO, url } from "../helpers/app";
import { demoBrowser, screenshot, signInThroughForm } from "../helpers/browser";

// The demo titration saturates at 1 equivalent and the PL series has K = 0.08 µM⁻¹
// (scripts/seed.ts): their pages show those fits and the plots.

const demo = demoBrowser();

describe("series pages", () => {
  it("show the saturation fit of the titration and the Stern–Volmer fit of the PL series", async () => {
    const page = await demo.browser.newPage({ viewport: { width: 1360, height: 1000 } });
    await signInThroughForm(page, DEMO.lead);
    await page.goto(url(`/series/${demo.ids.sharedSeries.id}`));
    const saturation = page.getByTestId("fit-saturation");
    await saturation.getByText("at saturation").waitFor();
    const breakpoint = Number(/([\d.]+) ±/.exec((await saturation.textContent()) ?? "")?.[1]);
    expect(Math.abs(breakpoint - 1)).toBeLessThan(0.1); // made saturating at 1 equivalent
    await page.locator("[data-testid=series-plot-bleach] canvas").first().waitFor();
    await screenshot(page, "series-titration");

    await page.goto(url(`/series/${demo.ids.privateSeries.id}`));
    const sv = page.getByTestId("fit-stern-volmer");
    await sv.getByText("± ").first().waitFor();
    const k = Number(/=\s*([\d.]+) ±/.exec((await sv.textContent()) ?? "")?.[1]);
    expect(Math.abs(k - 0.08) / 0.08).toBeLessThan(0.05); // made with K = 0.08 µM⁻¹
    expect(await sv.textContent()).toMatch(/µM⁻¹/); // K_SV carries the reciprocal of the variable's unit

    // The PL series' panels come from its technique: Stern–Volmer F₀/F against [Q] with the fitted
    // line and K_SV (Lakowicz, Principles of Fluorescence Spectroscopy, 3rd ed., ch. 8), no bleach
    // and no first-exciton panel.
    const panel = page.getByTestId("series-plot-stern-volmer");
    await panel.locator("canvas").first().waitFor();
    expect(await panel.locator("figcaption").textContent()).toBe("Stern–Volmer: F₀/F against [Q]");
    const ksv = Number(/=\s*([\d.]+) ±/.exec((await panel.getByTestId("ksv").textContent()) ?? "")?.[1]);
    expect(Math.abs(ksv - 0.08) / 0.08).toBeLessThan(0.05); // made with K = 0.08 µM⁻¹
    expect(await panel.getByTestId("ksv").textContent()).toMatch(/µM⁻¹/);
    expect(await panel.textContent()).toMatch(/measured.*fitted line/); // our legend names the points and the fitted line
    expect(await page.getByTestId("series-plot-bleach").count()).toBe(0);
    expect((await page.locator("figure").allTextContents()).join(" ")).not.toMatch(/exciton|bleach/i);
    expect(await page.getByTestId("series-table").locator("thead").textContent()).not.toMatch(/exciton|bleach/i);
    expect(await page.locator(".u-legend").count()).toBe(0); // no library legend with "--" placeholders
    await screenshot(page, "series-pl-quench");
  });
});
