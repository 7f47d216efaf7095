import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { User } from "@/models";
import { url } from "../helpers/app";
import { createLab } from "../helpers/fixtures";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";

// Issue #11, item 6: an unticked checkbox sends no field at all (HTML Living Standard,
// "constructing the entry list": unchecked checkboxes are skipped), so the form must read a
// missing field as "off". Every combination is saved, read back from the database, and
// shown again after a reload.
let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

const COMBINATIONS = [
  { notifyDigest: false, notifyDecisions: false },
  { notifyDigest: true, notifyDecisions: false },
  { notifyDigest: false, notifyDecisions: true },
  { notifyDigest: true, notifyDecisions: true },
];

describe("notification settings", () => {
  it("round-trip every combination of the two boxes", async () => {
    const { user } = await createLab("spectroscopist");
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signInThroughForm(page, user.email, "test-password");
    const digest = page.getByLabel(/digest of new signatures/);
    const decisions = page.getByLabel(/when a lead decides/);
    for (const combo of COMBINATIONS) {
      await page.goto(url("/settings"));
      await digest.setChecked(combo.notifyDigest);
      await decisions.setChecked(combo.notifyDecisions);
      const form = page.locator("form", { has: digest });
      await form.getByRole("button", { name: "Save" }).click();
      await expect.poll(() => form.getByRole("status").textContent(), { timeout: 30_000 }).toBe("Saved.");
      const stored = await User.findByPk(user.id);
      expect({ notifyDigest: stored!.notifyDigest, notifyDecisions: stored!.notifyDecisions }).toEqual(combo);
      await page.reload();
      expect(await digest.isChecked()).toBe(combo.notifyDigest);
      expect(await decisions.isChecked()).toBe(combo.notifyDecisions);
    }
    await screenshot(page, "settings-notifications-both-on");
    await page.close();
  }, 120_000);
});
