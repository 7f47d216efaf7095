import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, selectRows } from "@/lib/db";
import { absorptionCsv } from "@/lib/demo/synthetic";
import { AnalysisRun } from "@/models";
import { settled, upload } from "../helpers/api";
import { url } from "../helpers/app";
import { launchBrowser, screenshot, signInThroughForm } from "../helpers/browser";
import { addMember, createLab, createSample, type Lab } from "../helpers/fixtures";
import { enc } from "../helpers/spectra";
import { waitFor } from "../helpers/waitFor";

// A lead confirms a bleach in the browser; the spectroscopist's re-run with another smoothing
// window is started from the spectrum page; the confirmed flag's page then says which run replaced
// it, and the new run's bleach shows the decision "carried from run …" in its history.
// Source of the spectra: lib/demo/synthetic.ts absorptionCsv (first exciton 2.1 eV, 30 % bleach), known truth.

let browser: Browser;
let lab: Lab;
let sampleId: string;

const currentBleach = async () =>
  (
    await selectRows<{ id: string; run_id: string; review_state: string }>(
      `SELECT id, run_id, review_state FROM signatures WHERE spectrum_id = :id AND superseded_at IS NULL AND kind = 'bleach' ORDER BY abs(energy_ev - 2.1) LIMIT 1`,
      { id: sampleId },
    )
  )[0];

beforeAll(async () => {
  browser = await launchBrowser();
  lab = await createLab("lead");
  const spectroscopist = await addMember(lab, "spectroscopist");
  const sample = await createSample(lab, "CdSe");
  const seed = Date.now() % 100000;
  const send = async (fileName: string, csv: string, fields: Record<string, string>) => {
    const { body } = await upload(spectroscopist.token, [{ fileName, bytes: enc(csv) }], {
      projectId: lab.project.id,
      technique: "absorption",
      ...fields,
    });
    const out = body.files![0]!;
    if (!out.ok) throw new Error(out.error.message);
    await settled(spectroscopist.token, out.spectrumId);
    return out.spectrumId;
  };
  const parentId = await send(`lot-B${seed} parent.csv`, absorptionCsv({ firstExcitonEv: 2.1, seed }, "lot B parent"), {
    sampleId: sample.id,
  });
  sampleId = await send(`lot-B${seed} charged.csv`, absorptionCsv({ firstExcitonEv: 2.1, bleach: 0.3, seed: seed + 1 }, "lot B charged"), {
    sampleId: sample.id,
    referenceSpectrumId: parentId,
  });
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("a decision survives re-analysis, in the browser", () => {
  it("confirm → re-run from the spectrum page → the decision is carried and the old flag names its successor", async () => {
    const page = await browser.newPage({ viewport: { width: 1360, height: 900 } });
    await signInThroughForm(page, lab.user.email, "test-password");
    const first = (await currentBleach())!;
    expect(first.review_state).toBe("awaiting");

    await page.goto(url(`/review/${first.id}`));
    await page.getByLabel("Comment").fill("Bleach of the first exciton; confirmed.");
    await page.getByRole("button", { name: "Confirm" }).click();
    await page.getByText("1 signature confirmed").waitFor();

    await page.goto(url(`/spectra/${sampleId}`));
    const rerun = page.getByTestId("rerun");
    await rerun.getByLabel("Smoothing window (points, odd)").fill("31");
    await rerun.getByRole("button", { name: "Re-run analysis" }).click();
    await rerun.getByText("A new analysis run was queued").waitFor();
    const second = await waitFor(
      "the re-run's bleach",
      async () => {
        const now = await currentBleach();
        if (!now || now.run_id === first.run_id) return undefined;
        return (await AnalysisRun.findByPk(now.run_id))?.status === "done" ? now : undefined;
      },
      60_000,
    );
    expect(second.review_state).toBe("confirmed");

    await page.goto(url(`/review/${first.id}`));
    const notice = page.getByTestId("superseded-notice");
    await notice.waitFor();
    expect(await notice.textContent()).toContain(`run ${second.run_id.slice(0, 8)}`);
    await screenshot(page, "review-superseded");
    await notice.getByRole("link", { name: "its signature" }).click();
    await page.waitForURL(`**/review/${second.id}`);
    const history = page.getByTestId("review-history");
    await history.getByRole("link", { name: `carried from run ${first.run_id.slice(0, 8)}` }).waitFor();
    expect(await page.getByTestId("review-state").textContent()).toContain("confirmed");
    await screenshot(page, "review-carried");
    await page.close();
  }, 120_000);
});
