import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, selectRows } from "@/lib/db";
import { DEMO, url } from "../helpers/app";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";

// The upload form's parent picker on the demo lab (scripts/seed.ts: AUR-CdSe-0412-n's registered
// parent is AUR-CdSe-0412, whose absorption spectrum is cdse-0412-abs.csv): the registered parent
// comes first, failed uploads and other techniques are never offered, and a choice the engine's
// rule refuses (lib/engine/compare/checkReferenceMatch.ts) is named beside the field.

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("parent picker on the upload form", () => {
  it("offers the registered parent first, no failed or other-technique files, and names a refused choice", async () => {
    const page = await browser.newPage({ viewport: { width: 1360, height: 1000 } });
    await signInThroughForm(page, DEMO.spectroscopist);
    await page.goto(url("/upload"));
    await page.getByLabel("Project").selectOption({ label: "Interdot charge transfer (Aurora Nanocrystal Lab)" });
    await page.getByLabel("Technique").selectOption("absorption");
    await page.getByLabel("Sample").selectOption({ label: "AUR-CdSe-0412-n · CdSe" });
    const picker = page.getByLabel("Parent reference spectrum");
    const groups = await picker.locator("optgroup").evaluateAll((els) =>
      els.map((g) => ({
        label: g.getAttribute("label"),
        files: [...g.querySelectorAll("option")].map((o) => (o.textContent ?? "").split(" · ")[0]),
      })),
    );
    expect(groups[0]!.label).toBe("Registered parents of AUR-CdSe-0412-n");
    expect(groups[0]!.files).toContain("cdse-0412-abs.csv");
    const offered = groups.flatMap((g) => g.files);
    const notOffered = await selectRows<{ file_name: string }>(
      `SELECT s.file_name FROM spectra s JOIN projects p ON p.id = s.project_id WHERE p.name = 'Interdot charge transfer' AND (s.status <> 'analysed' OR s.technique <> 'absorption')`,
    );
    expect(notOffered.length).toBeGreaterThan(0);
    for (const row of notOffered) expect(offered).not.toContain(row.file_name);

    const value = await picker.locator("option", { hasText: "cdse-0412-abs.csv" }).first().getAttribute("value");
    await picker.selectOption(value!);
    await expect.poll(() => page.getByTestId("parent-mismatch").count()).toBe(0);
    await page.getByLabel("Technique").selectOption("pl");
    const note = page.getByTestId("parent-mismatch");
    await note.waitFor();
    expect(await note.textContent()).toBe("The analysis will refuse this parent: the sample is pl, the reference absorption.");
    await screenshot(page, "upload-parent-picker");
    await page.close();
  });
});
