import { simpleParser } from "mailparser";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, selectRows } from "@/lib/db";
import { DEMO, url } from "../helpers/app";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";
import { waitFor } from "../helpers/waitFor";

// A group lead confirms one signature and dismisses another with a comment, through the
// pages; the decisions land in the database and the uploader's mail in the SMTP fake.

type Mail = { raw: string; subject: string; receivedAt: string };
const MAIL_VIEW = process.env.MAIL_VIEW_URL ?? "http://127.0.0.1:25350";
const body = async (m: Mail) => (await simpleParser(m.raw)).text ?? "";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("review in the browser", () => {
  it("a lead confirms one signature, dismisses another with a comment, and the uploader is mailed", async () => {
    const page = await browser.newPage({ viewport: { width: 1360, height: 900 } });
    await signInThroughForm(page, DEMO.lead);
    await page.goto(url("/review?kind=bleach&sort=significance&dir=desc"));
    const rows = page.locator("[data-testid=review-queue] tbody tr");
    await rows.first().waitFor();
    expect(await rows.count()).toBeGreaterThanOrEqual(2);
    await screenshot(page, "review-queue");
    const [first, second] = [await rows.nth(0).getAttribute("data-signature-id"), await rows.nth(1).getAttribute("data-signature-id")];
    const startedAt = new Date().toISOString();

    // Confirm the first from its evidence page.
    await rows.nth(0).getByRole("link").first().click();
    await page.waitForURL(`**/review/${first}`);
    await page.locator("[data-testid=evidence-chart] canvas").first().waitFor();
    await page.getByLabel("Comment").fill("Bleach with the expected band; confirmed.");
    await page.getByRole("button", { name: "Confirm" }).click();
    await page.getByText("1 signature confirmed").waitFor();
    await screenshot(page, "review-confirmed");

    // Dismiss the second with a comment.
    await page.goto(url(`/review/${second}`));
    await page.getByLabel("Comment").fill("Baseline drift during this run; dismissed.");
    await page.getByRole("button", { name: "Dismiss" }).click();
    await page.getByText("1 signature dismissed").waitFor();
    await page.reload();
    await page.getByTestId("review-history").getByText("Baseline drift during this run; dismissed.").waitFor();
    await screenshot(page, "review-dismissed");

    const states = await selectRows<{ id: string; review_state: string; comment: string }>(
      `SELECT g.id, g.review_state, v.comment FROM signatures g JOIN reviews v ON v.signature_id = g.id WHERE g.id IN (:ids) ORDER BY v.created_at DESC`,
      { ids: [first, second] },
    );
    expect(states.find((s) => s.id === first)).toMatchObject({
      review_state: "confirmed",
      comment: "Bleach with the expected band; confirmed.",
    });
    expect(states.find((s) => s.id === second)).toMatchObject({
      review_state: "dismissed",
      comment: "Baseline drift during this run; dismissed.",
    });

    // Decisions within NOTICE_WINDOW_MS reach the uploader in one message; each names its outcome.
    for (const [id, word] of [
      [first, "confirmed"],
      [second, "dismissed"],
    ] as const) {
      const text = await waitFor(
        `the uploader's mail about ${id}`,
        async () => {
          const list = (await (await fetch(`${MAIL_VIEW}/messages?to=${encodeURIComponent(DEMO.spectroscopist)}`)).json()) as Mail[];
          for (const m of list.filter((x) => x.receivedAt >= startedAt)) {
            const t = await body(m);
            if (t.includes(`/review/${id}`)) return t;
          }
          return undefined;
        },
        20_000,
      );
      const block = text.slice(0, text.indexOf(`/review/${id}`));
      expect(block.slice(block.lastIndexOf("\n- "))).toContain(`: ${word} (was awaiting review)`);
    }
  });
});
