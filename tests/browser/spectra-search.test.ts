import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, selectRows } from "@/lib/db";
import { DEMO, url } from "../helpers/app";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";
import { createSearchFixture, dropSearchFixture, type SearchFixture } from "../integration/search-fixtures";

// Sources: band limits converted with hc = 1239.841984 eV·nm (CODATA 2018); every other number is a
// count or value of rows this test wrote itself (known truth of its fixtures).

// A lead runs a band search from the spectra page's form (first exciton 570–590 nm in the
// fixture project, whose rows' truth search-fixtures.ts states: only cdse-a-001.csv has its
// newest first exciton there, at 580 nm), saves it, and opens it again from the Overview.

let browser: Browser;
let fixture: SearchFixture;
const searchName = `CdSe first exciton 570–590 nm ${process.pid}`;

beforeAll(async () => {
  fixture = await createSearchFixture(`browser-${process.pid}`);
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  if (fixture) await dropSearchFixture(fixture);
  await closeDb();
});

describe("spectra search in the browser", () => {
  it("runs a band search, saves it, and opens it from the Overview", async () => {
    const page = await browser.newPage({ viewport: { width: 1440, height: 1000 } });
    await signInThroughForm(page, DEMO.lead);
    await page.goto(url("/spectra"));
    const form = page.getByRole("search", { name: "Search spectra" });
    await form.getByLabel("Project").selectOption(fixture.projectId);
    await form.getByLabel("Which band").selectOption("first-exciton");
    await form.getByLabel("Band from").fill("570");
    await form.getByLabel("Band to").fill("590");
    await form.getByLabel("Band unit").selectOption("nm");
    await form.getByRole("button", { name: "Search" }).click();
    await page.waitForURL(/band=first-exciton/);
    const shared = new URL(page.url());
    expect(shared.searchParams.get("bandMin")).toBe("570");
    expect(shared.searchParams.get("bandMax")).toBe("590");
    expect(shared.searchParams.get("project")).toBe(fixture.projectId);

    const rows = page.locator("table tbody tr");
    await rows.first().waitFor();
    expect(await rows.count()).toBe(1);
    await expect.poll(() => rows.first().innerText()).toContain("cdse-a-001.csv");
    expect(await rows.first().innerText()).toContain("580 nm");
    await page.getByText("1 found").waitFor();
    await screenshot(page, "spectra-band-search");

    await page.getByLabel("Name this search").fill(searchName);
    await page.getByRole("button", { name: "Save search" }).click();
    await page.getByText(`Saved “${searchName}”`).waitFor();
    const saved = await selectRows<{ query: string }>("SELECT query FROM saved_searches WHERE name = :name", { name: searchName });
    expect(saved).toHaveLength(1);
    expect(saved[0]!.query).toContain(`project=${fixture.projectId}`);

    await page.goto(url("/"));
    const entry = page.getByRole("region", { name: "Saved searches" }).getByRole("listitem").filter({ hasText: searchName });
    await entry.waitFor();
    expect(await entry.innerText()).toContain("1 spectrum");
    await screenshot(page, "overview-saved-search");
    await entry.getByRole("link", { name: searchName }).click();
    await page.waitForURL(/\/spectra\?/);
    expect(new URL(page.url()).searchParams.get("band")).toBe("first-exciton");
    await page.locator("table tbody tr").first().waitFor();
    expect(await page.locator("table tbody tr").count()).toBe(1);
    expect(await page.locator("table tbody tr").first().innerText()).toContain("cdse-a-001.csv");
    await screenshot(page, "spectra-saved-search-opened");

    // removing it asks first: "Keep" leaves it, "Remove" takes it off the Overview and out of the database
    await page.goto(url("/"));
    const again = page.getByRole("region", { name: "Saved searches" }).getByRole("listitem").filter({ hasText: searchName });
    await again.getByRole("button", { name: `Remove saved search ${searchName}` }).click();
    await again.getByRole("button", { name: "Keep" }).click();
    expect(await selectRows("SELECT id FROM saved_searches WHERE name = :name", { name: searchName })).toHaveLength(1);
    await again.getByRole("button", { name: `Remove saved search ${searchName}` }).click();
    await again.getByText(`Remove “${searchName}”?`).waitFor();
    await screenshot(page, "overview-saved-search-remove-asks");
    await again
      .getByRole("group", { name: `Confirm removing ${searchName}` })
      .getByRole("button", { name: "Remove", exact: true })
      .click();
    await expect
      .poll(async () => (await selectRows("SELECT id FROM saved_searches WHERE name = :name", { name: searchName })).length)
      .toBe(0);
    await page.reload();
    await page.getByRole("heading", { level: 1 }).waitFor();
    expect(await page.getByText(searchName).count()).toBe(0);
    await screenshot(page, "overview-saved-search-removed");
  });

  it("shows a bad band range beside the form, naming the field", async () => {
    const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
    await signInThroughForm(page, DEMO.lead);
    await page.goto(url(`/spectra?project=${fixture.projectId}&band=first-exciton&bandMin=570`));
    const alert = page.getByRole("search", { name: "Search spectra" }).getByRole("alert");
    await alert.waitFor();
    expect(await alert.innerText()).toMatch(/bandMin: a band search needs both bandMin and bandMax/);
    expect(await page.getByLabel("Band from").getAttribute("aria-invalid")).toBe("true");
    await screenshot(page, "spectra-search-error");
  });
});
