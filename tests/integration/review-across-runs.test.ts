// Review that survives re-analysis, through the running app, worker, PostgreSQL and SMTP fake:
// a confirmed bleach keeps its decision when the spectrum is analysed again with another
// smoothing window; a re-run that changes the bleach's size threefold holds the decision back
// with its reason; a re-run that no longer finds the band supersedes it (off the queue, counted
// nowhere, its page naming the run that replaced it); Overview, queue, rail and digest count alike.
import { simpleParser } from "mailparser";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, selectRows } from "@/lib/db";
import { absorptionCsv } from "@/lib/demo/synthetic";
import { getOverview } from "@/lib/queries/overview";
import { awaitingReviewCounts } from "@/lib/review/counts";
import { runReviewDigest } from "@/lib/review/digest";
import { AnalysisRun, User } from "@/models";
import { getJson, settled, upload } from "../helpers/api";
import { addMember, appUrl, createLab, createSample, type Lab } from "../helpers/fixtures";
import { sessionCookie } from "../helpers/session";
import { enc } from "../helpers/spectra";
import { waitFor } from "../helpers/waitFor";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 409); the spectra's truth is
// the generator's settings (lib/demo/synthetic.ts absorptionCsv: first exciton 2.1 eV, σ 45 meV,
// bleach fraction of the first-exciton band, every band times `scale`); Beer–Lambert (absorbance
// linear in concentration) gives the un-normalised bleach 1 − scale·(1 − F); the twofold carry
// rule is this project's own (lib/review/matchSignatures.ts); MIME decoding by mailparser.

const MAIL_VIEW = process.env.MAIL_VIEW_URL ?? "http://127.0.0.1:25350";
type Mail = { to: string[]; subject: string; raw: string; receivedAt: string };
const mailTo = async (address: string) => (await (await fetch(`${MAIL_VIEW}/messages?to=${encodeURIComponent(address)}`)).json()) as Mail[];

const BLEACH = 0.2;
const SCALE = 0.5;
/** The bleach read without normalisation: 1 − 0.5·(1 − 0.2) = 0.6 (Beer–Lambert). */
const RAW_BLEACH = 1 - SCALE * (1 - BLEACH);

let lab: Lab;
let uploader: { token: string; user: { id: string; email: string } };
let sampleSpectrumId: string;
/** Two more bleached samples, left awaiting review, for the counts and the mail. */
const otherSpectrumIds: string[] = [];

type Sig = {
  id: string;
  run_id: string;
  kind: string;
  energy_ev: number | null;
  fraction: number | null;
  review_state: string;
  matched_signature_id: string | null;
  superseded_by_run_id: string | null;
};
const signaturesOf = (spectrumId: string) =>
  selectRows<Sig>(
    `SELECT id, run_id, kind, energy_ev, fraction, review_state, matched_signature_id, superseded_by_run_id FROM signatures WHERE spectrum_id = :spectrumId ORDER BY created_at, id`,
    { spectrumId },
  );
/** The current first-exciton bleach: the bleach flag nearest 2.1 eV of the newest run. */
async function currentBleach(spectrumId: string): Promise<Sig | undefined> {
  const current = (await signaturesOf(spectrumId)).filter(
    (s) => s.superseded_by_run_id === null && s.kind === "bleach" && s.energy_ev !== null,
  );
  return current.sort((a, b) => Math.abs(a.energy_ev! - 2.1) - Math.abs(b.energy_ev! - 2.1))[0];
}

/** Independent of the superseded marks: the awaiting flags of each spectrum's newest finished run. */
async function newestRunAwaiting(): Promise<number> {
  const [row] = await selectRows<{ n: string }>(
    `SELECT count(*) AS n FROM signatures g JOIN spectra s ON s.id = g.spectrum_id WHERE s.project_id = :p AND g.review_state = 'awaiting'
       AND g.run_id = (SELECT r.id FROM analysis_runs r WHERE r.spectrum_id = s.id AND r.status = 'done' ORDER BY r.created_at DESC LIMIT 1)`,
    { p: lab.project.id },
  );
  return Number(row!.n);
}

async function rerun(spectrumId: string, body: unknown): Promise<string> {
  const res = await fetch(appUrl(`/api/v1/spectra/${spectrumId}/analyses`), {
    method: "POST",
    headers: { Authorization: `Bearer ${uploader.token}`, "Content-Type": "application/json" },
    body: JSON.stringify(body),
  });
  const answer = (await res.json()) as { runId: string };
  expect(res.status).toBe(201);
  await waitFor(
    `run ${answer.runId} to finish`,
    async () => ((await AnalysisRun.findByPk(answer.runId))?.status === "done" ? true : undefined),
    60_000,
  );
  return answer.runId;
}

async function decide(signatureId: string, payload: unknown) {
  const res = await fetch(appUrl(`/api/v1/signatures/${signatureId}/decisions`), {
    method: "POST",
    headers: { Authorization: `Bearer ${lab.token}`, "content-type": "application/json" },
    body: JSON.stringify(payload),
  });
  return { status: res.status, body: (await res.json()) as Record<string, unknown> & { error?: { code: string; message: string } } };
}

type History = {
  reviewState: string;
  supersededBy: { runId: string; matchId: string | null } | null;
  history: { decision: string; origin: string; comment: string; carriedFromRunId: string | null; carriedFromSignatureId: string | null }[];
};
const historyOf = async (id: string) => (await getJson<History>(lab.token, `/api/v1/signatures/${id}/decisions`)).body;

beforeAll(async () => {
  lab = await createLab("lead");
  uploader = await addMember(lab, "spectroscopist");
  const sample = await createSample(lab, "CdSe");
  const seed = Date.now() % 100000;
  const send = async (fileName: string, csv: string, fields: Record<string, string>) => {
    const { status, body } = await upload(uploader.token, [{ fileName, bytes: enc(csv) }], {
      projectId: lab.project.id,
      technique: "absorption",
      ...fields,
    });
    expect(status).toBe(201);
    const out = body.files![0]!;
    if (!out.ok) throw new Error(out.error.message);
    expect((await settled(uploader.token, out.spectrumId)).spectrum.status).toBe("analysed");
    return out.spectrumId;
  };
  const parentId = await send(`lot-R${seed} parent.csv`, absorptionCsv({ firstExcitonEv: 2.1, seed }, "lot R parent"), {
    sampleId: sample.id,
  });
  sampleSpectrumId = await send(
    `lot-R${seed} reduced.csv`,
    absorptionCsv({ firstExcitonEv: 2.1, bleach: BLEACH, scale: SCALE, seed: seed + 1 }, "lot R reduced"),
    { sampleId: sample.id, referenceSpectrumId: parentId },
  );
  for (const k of [2, 3]) {
    otherSpectrumIds.push(
      await send(`lot-R${seed} échantillon ${k}.csv`, absorptionCsv({ firstExcitonEv: 2.1, bleach: 0.3, seed: seed + k }, `lot R ${k}`), {
        sampleId: sample.id,
        referenceSpectrumId: parentId,
      }),
    );
  }
});
afterAll(closeDb);

describe("a decision across re-analyses", () => {
  let confirmed: Sig;
  let firstRunId: string;
  let carried: Sig;

  it("confirm → re-run with another smoothing window → the decision is carried, marked in the history", async () => {
    // Compared unscaled, so the bleach read is 1 − scale·(1 − F) whatever the automatic scaling
    // makes of this synthetic continuum (this test is about decisions, not about the scaling).
    await rerun(sampleSpectrumId, { normalization: { mode: "none" } });
    confirmed = (await currentBleach(sampleSpectrumId))!;
    expect(confirmed).toBeDefined();
    expect(Math.abs(confirmed.fraction! - RAW_BLEACH)).toBeLessThan(0.03); // the generator's truth, 0.03 ≈ a few σ (common practice)
    firstRunId = confirmed.run_id;
    expect((await decide(confirmed.id, { decision: "confirmed", comment: "State filling, as expected." })).status).toBe(201);

    const secondRunId = await rerun(sampleSpectrumId, { smoothingWindow: 31 });
    carried = (await currentBleach(sampleSpectrumId))!;
    expect(carried.run_id).toBe(secondRunId);
    expect(carried.matched_signature_id).toBe(confirmed.id);
    expect(carried.review_state).toBe("confirmed");
    const history = await historyOf(carried.id);
    expect(history.history[0]).toMatchObject({
      decision: "confirmed",
      origin: "carried",
      carriedFromRunId: firstRunId,
      carriedFromSignatureId: confirmed.id,
    });
    expect(history.history[0]!.comment).toBe(`Carried from run ${firstRunId.slice(0, 8)}.`);

    // The first run's flag is superseded: readable, naming what replaced it, refused for decisions.
    const old = await historyOf(confirmed.id);
    expect(old.supersededBy).toMatchObject({ runId: secondRunId, matchId: carried.id });
    expect(old.history.map((h) => [h.decision, h.origin])).toEqual([["confirmed", "decision"]]);
    const refused = await decide(confirmed.id, { decision: "dismissed" });
    expect(refused.status).toBe(409);
    expect(refused.body.error!.message).toContain(secondRunId.slice(0, 8));
  });

  it("a decision equal to the current one records nothing", async () => {
    const before = (await historyOf(carried.id)).history.length;
    const again = await decide(carried.id, { decision: "confirmed", comment: "still" });
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ unchanged: true, reviewId: null, reviewState: "confirmed" });
    expect((await historyOf(carried.id)).history.length).toBe(before);
  });

  it("a re-run that makes the bleach three times smaller holds the decision back, with the reason", async () => {
    // Normalised by concentration (sample 0.5 : reference 1) the bleach is the true 0.2, not 0.6.
    await rerun(sampleSpectrumId, { normalization: { mode: "concentration", sampleConcentration: SCALE, referenceConcentration: 1 } });
    const held = (await currentBleach(sampleSpectrumId))!;
    expect(Math.abs(held.fraction! - BLEACH)).toBeLessThan(0.03);
    expect(held.matched_signature_id).toBe(carried.id);
    expect(held.review_state).toBe("awaiting");
    const [entry] = (await historyOf(held.id)).history;
    expect(entry).toMatchObject({ decision: "awaiting", origin: "not-carried", carriedFromSignatureId: carried.id });
    expect(entry!.comment).toMatch(
      /^The confirmed decision on run [0-9a-f]{8} was not carried: its size changed from (5[7-9]|6[0-3])\.\d % to (1[7-9]|2[0-3])\.\d % \(more than a factor of 2\)\. Decide again\.$/,
    );
    carried = held;
  });

  it("a re-run that no longer finds the band supersedes it: off the queue, counted nowhere", async () => {
    const runId = await rerun(sampleSpectrumId, { thresholds: { minBleachFraction: 0.95 } });
    const all = await signaturesOf(sampleSpectrumId);
    expect(all.filter((s) => s.run_id === runId && s.kind === "bleach")).toEqual([]);
    const gone = all.find((s) => s.id === carried.id)!;
    expect(gone.superseded_by_run_id).toBe(runId);
    expect((await historyOf(carried.id)).supersededBy).toMatchObject({ runId, matchId: null });
    const queue = await getJson<{ items: { id: string }[]; total: number }>(lab.token, "/api/v1/review/queue?state=all&pageSize=200");
    expect(queue.body.items.map((i) => i.id)).not.toContain(carried.id);
    expect((await awaitingReviewCounts([lab.group.id])).total).toBe(await newestRunAwaiting());
  });
});

describe("one source of counts", () => {
  it("Overview, the queue API, the rail's badge and the digest say the same number", async () => {
    const queue = await getJson<{ total: number }>(lab.token, "/api/v1/review/queue");
    const overview = await getOverview(lab.actor);
    expect(overview!.awaitingSignatures).toBe(queue.body.total);
    expect(queue.body.total).toBe(await newestRunAwaiting());
    expect(queue.body.total).toBeGreaterThan(0);

    const cookie = await sessionCookie(lab.user.email, "test-password");
    const html = await (await fetch(appUrl("/"), { headers: { cookie } })).text();
    expect(html).toMatch(new RegExp(`data-testid="nav-awaiting-review"[^>]*>${queue.body.total}<`));

    await selectRows(
      `UPDATE signatures g SET digested_at = NULL FROM spectra s WHERE s.id = g.spectrum_id AND s.project_id = :p RETURNING g.id`,
      { p: lab.project.id },
    );
    const startedAt = new Date().toISOString();
    await runReviewDigest();
    const mail = await waitFor(
      "the lead's digest",
      async () => (await mailTo(lab.user.email)).find((m) => m.receivedAt >= startedAt && m.subject.includes("to review")),
      20_000,
    );
    const text = (await simpleParser(mail.raw)).text ?? "";
    expect(text).toContain(`${queue.body.total} signature${queue.body.total === 1 ? "" : "s"} in ${lab.group.name} await review in all`);
    expect(text).toMatch(/ at \d\.\d{3} eV, \d+\.\dσ, in lot-R\d+ /); // σ decoded as σ (UTF-8 through quoted-printable)
    const listed = [...text.matchAll(/\/review\/([0-9a-f-]{36})/g)].map((m) => m[1]);
    const superseded = (await signaturesOf(sampleSpectrumId)).filter((s) => s.superseded_by_run_id !== null).map((s) => s.id);
    expect(listed.length).toBe(queue.body.total);
    for (const id of superseded) expect(listed).not.toContain(id);
  });
});

describe("decision mail", () => {
  it("one message per window, net of no-ops and undos, decoded back to the exact text (σ, µ, ⁻¹, accents)", async () => {
    // Let the windows of earlier tests' decisions close first (NOTICE_WINDOW_MS is 3 s under test),
    // so this test's mail holds only its own decisions.
    await new Promise((r) => setTimeout(r, 7000));
    const name = "Zoë Ångström-Núñez";
    await User.update({ name }, { where: { id: uploader.user.id } });
    const b = (await currentBleach(otherSpectrumIds[0]!))!;
    const c = (await currentBleach(otherSpectrumIds[1]!))!;
    expect(b.review_state).toBe("awaiting");
    expect(c.review_state).toBe("awaiting");
    const startedAt = new Date().toISOString();
    const first = "Bleach of 1Sₑ, path 10 µm cell; no band near 2180 cm⁻¹ — vérifié.";
    const second = "Second look: a baseline step, σ too small. Révisé.";
    expect((await decide(b.id, { decision: "confirmed", comment: first })).status).toBe(201);
    expect((await decide(b.id, { decision: "dismissed", comment: second })).status).toBe(201);
    expect((await decide(b.id, { decision: "dismissed", comment: "again" })).status).toBe(200); // no-op: nothing recorded, nothing mailed
    const decided = await decide(c.id, { decision: "confirmed", comment: "" });
    expect(decided.status).toBe(201);
    const undone = await decide(c.id, { undo: decided.body.reviewId });
    expect(undone.status).toBe(201);
    expect(undone.body).toMatchObject({ reviewState: "awaiting", previousState: "confirmed" });
    const cHistory = await historyOf(c.id);
    expect(cHistory.reviewState).toBe("awaiting");
    expect(cHistory.history.map((h) => [h.decision, h.origin])).toEqual([
      ["awaiting", "undo"],
      ["confirmed", "decision"],
    ]);

    const mail = await waitFor(
      "the uploader's decision mail",
      async () => (await mailTo(uploader.user.email)).find((m) => m.receivedAt >= startedAt),
      20_000,
    );
    // Wait out two more windows (NOTICE_WINDOW_MS is 3 s under test): nothing else may arrive.
    await new Promise((r) => setTimeout(r, 7000));
    expect((await mailTo(uploader.user.email)).filter((m) => m.receivedAt >= startedAt)).toHaveLength(1);

    const parsed = await simpleParser(mail.raw);
    const [row] = await selectRows<{ energy_ev: number; significance: number; file_name: string }>(
      `SELECT g.energy_ev, g.significance, s.file_name FROM signatures g JOIN spectra s ON s.id = g.spectrum_id WHERE g.id = :id`,
      { id: b.id },
    );
    const base = (process.env.APP_URL ?? appUrl("")).replace(/\/$/, "");
    expect(parsed.subject).toBe(`Bandkeep: Exciton bleach in ${row!.file_name} dismissed`);
    expect(parsed.text).toBe(
      [
        `Hello ${name},`,
        "",
        "Band changes flagged in your uploads were reviewed:",
        "",
        `- Exciton bleach at ${row!.energy_ev.toFixed(3)} eV (${row!.significance.toFixed(1)}σ) in ${row!.file_name}: dismissed (was awaiting review)`,
        `  confirmed by ${lab.user.name}: ${first}`,
        `  dismissed by ${lab.user.name}: ${second}`,
        `  ${base}/review/${b.id}`,
        "",
        `You receive this because decision e-mails are on in your settings: ${base}/settings`,
        "",
      ].join("\n"),
    );
    expect(parsed.text).not.toContain(c.id);
  });
});
