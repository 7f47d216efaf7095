import { mkdirSync } from "node:fs";
import { join } from "node:path";
import { chromium, type Browser, type Page } from "playwright-core";
import { afterAll, beforeAll } from "vitest";
import { closeDb } from "@/lib/db";
import { DEMO_PASSWORD, url } from "./app";
import { demoIds } from "./demo-ids";

export const SCREENSHOT_DIR = join(process.cwd(), "test-results", "screenshots");

/** Debian's chromium, headless; playwright gives each launch a fresh temporary profile. */
export async function launchBrowser(): Promise<Browser> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: [
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
  });
}

/** Signs in through the sign-in form, as a person would, and waits for the app shell. */
export async function signInThroughForm(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto(url("/signin"));
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  // The rail on wide screens, the menu button on phones.
  await page.locator('nav[aria-label="Main"]:visible, button[aria-controls="mobile-menu"]:visible').first().waitFor({ timeout: 30_000 });
}

export async function screenshot(page: Page, name: string): Promise<string> {
  const path = join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path, fullPage: true });
  return path;
}

export type DemoBrowser = { browser: Browser; ids: Awaited<ReturnType<typeof demoIds>> };

/**
 * For a test file that drives the demo scenario: launches chromium and looks up the demo's ids
 * before its tests, and closes the browser and the database pool after them. The returned
 * object is filled in by then.
 */
export function demoBrowser(): DemoBrowser {
  const suite = {} as DemoBrowser;
  beforeAll(async () => {
    suite.ids = await demoIds();
    suite.browser = await launchBrowser();
  });
  afterAll(async () => {
    await suite.browser?.close();
    await closeDb();
  });
  return suite;
}
