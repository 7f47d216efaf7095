import type { Browser } from "playwright-core";
import { afterAll, beforeAll, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { LegalHold, RetentionPolicy, Spectrum } from "@/models";
import { url } from "../helpers/app";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";
import { createLab, type Lab } from "../helpers/fixtures";
import { storedSpectrum } from "../integration/stewardship-fixtures";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 304, 400, 401, 403, 404, 409, 413, 415, 422, 503);
// every other number checked here is a count or value this test itself created (known truth of its fixtures).

// A data steward sets a retention policy, reads its dry run, saves it, and places a
// legal hold — in a group and project made for this test, never the demo's.

let browser: Browser;
let lab: Lab;
let old: Spectrum[];
beforeAll(async () => {
  browser = await launchBrowser();
  lab = await createLab("steward");
  old = [await storedSpectrum(lab, { ageDays: 400 }), await storedSpectrum(lab, { ageDays: 200 })];
  await storedSpectrum(lab, { ageDays: 3 });
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

it("steward: policy with dry run, then a legal hold", async () => {
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  const page = await context.newPage();
  await signInThroughForm(page, lab.user.email, "test-password");
  await page.goto(url("/stewardship/policies"));
  const draft = page.getByRole("form", { name: "Policy draft" });
  await draft.getByLabel("Project").selectOption(lab.project.id);
  await draft.getByLabel("Data class").selectOption("raw");
  await draft.getByLabel("Keep for (days)").fill("180");
  await draft.getByLabel("At the end").selectOption("delete");
  await screenshot(page, "stewardship-policy-form");
  await draft.getByRole("button", { name: "Preview (dry run)" }).click();
  await page.getByTestId("dry-run").waitFor();
  expect(await page.getByTestId("dry-run-count").textContent()).toBe("2");
  const listed = await page.getByTestId("would-delete").locator("li").allTextContents();
  for (const s of old) expect(listed.join("\n")).toContain(s.fileName);
  expect(await RetentionPolicy.count({ where: { projectId: lab.project.id } })).toBe(0); // nothing saved by a preview
  await screenshot(page, "stewardship-policy-dry-run");

  await page.getByRole("button", { name: "Save this policy" }).click();
  await page.getByText("Policy saved.").waitFor();
  await page.getByTestId("policies-table").getByText("Delete", { exact: true }).waitFor();
  expect(await RetentionPolicy.findOne({ where: { projectId: lab.project.id } })).toMatchObject({
    keepDays: 180,
    onExpiry: "delete",
    dataClass: "raw",
  });
  await screenshot(page, "stewardship-policy-saved");

  await page.goto(url("/stewardship/holds"));
  const form = page.getByRole("form", { name: "Place hold" });
  await form.getByLabel("Hold on").selectOption("project");
  await form.getByLabel("Which").selectOption(lab.project.id);
  await form.getByLabel("Reason").fill("x"); // too short: refused beside the form, naming the field
  await form.getByRole("button", { name: "Place hold" }).click();
  await form.getByRole("alert").waitFor();
  expect(await form.getByRole("alert").textContent()).toContain("reason:");
  await form.getByLabel("Reason").fill("Patent filing: keep every spectrum until the examiner decides");
  await form.getByRole("button", { name: "Place hold" }).click();
  await page.getByTestId("holds-table").getByText("Patent filing").waitFor();
  expect(await LegalHold.count({ where: { targetId: lab.project.id, liftedAt: null } })).toBe(1);
  await screenshot(page, "stewardship-hold-placed");

  // The dry run now keeps everything, and says why.
  await page.goto(url(`/stewardship/policies?preview=1&projectId=${lab.project.id}&dataClass=raw&keepDays=180&onExpiry=delete`));
  expect(await page.getByTestId("dry-run-count").textContent()).toBe("0");
  expect(await page.getByTestId("would-keep").textContent()).toContain("Under legal hold (project): Patent filing");
  await screenshot(page, "stewardship-dry-run-under-hold");
  await context.close();
}, 120_000);
