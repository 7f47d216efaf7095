// A worker killed with SIGKILL in the middle of a 200-file batch: after a restart every
// file ends analysed, each with exactly one run and one set of peaks.
import { randomBytes } from "node:crypto";

const QUEUE = `ingest-crash-${randomBytes(4).toString("hex")}`;
process.env.BANDKEEP_QUEUE = QUEUE;

import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Op } from "sequelize";
import { AnalysisRun, Peak, Spectrum } from "@/models";
import { closeDb } from "@/lib/db";
import { analysisQueue } from "@/lib/queue";
import { ingestFiles } from "@/lib/ingest";
import { createLab, type Lab } from "../helpers/fixtures";
import { startWorker, workerReady, type Owned } from "../helpers/processes";
import { enc, syntheticAbsorptionCsv } from "../helpers/spectra";
import { waitFor } from "../helpers/waitFor";

const FILES = 200;
let lab: Lab;
let worker: Owned | null = null;
const workerEnv = { BANDKEEP_QUEUE: QUEUE, WORKER_CONCURRENCY: "2", WORKER_LOCK_MS: "4000" };

beforeAll(async () => {
  lab = await createLab();
});
afterAll(async () => {
  await worker?.stop("SIGTERM");
  await analysisQueue()
    .obliterate({ force: true })
    .catch(() => {});
  await analysisQueue().close();
  await closeDb();
});

const doneCount = (ids: string[]) => Spectrum.count({ where: { id: { [Op.in]: ids }, status: "analysed" } });

describe("worker crash in the middle of a batch", () => {
  it("analyses every file exactly once after SIGKILL and restart", async () => {
    const files = Array.from({ length: FILES }, (_, i) => ({
      fileName: `crash-${i}.csv`,
      bytes: enc(syntheticAbsorptionCsv({ seed: 1000 + i, points: 600 })),
    }));
    const outcomes = await ingestFiles(lab.actor, { projectId: lab.project.id, technique: "absorption" }, files);
    const ids = outcomes.map((o) => (o.ok ? o.spectrumId : ""));
    expect(ids.filter(Boolean)).toHaveLength(FILES);

    worker = startWorker(workerEnv);
    await workerReady(worker);
    await waitFor("a quarter of the batch", async () => ((await doneCount(ids)) >= FILES / 4 ? true : undefined), 120_000, 100);
    await worker.stop("SIGKILL");
    const atKill = await doneCount(ids);
    expect(atKill).toBeLessThan(FILES);

    worker = startWorker(workerEnv);
    await workerReady(worker);
    await waitFor("the whole batch", async () => ((await doneCount(ids)) === FILES ? true : undefined), 150_000, 250);

    const runs = await AnalysisRun.findAll({ where: { spectrumId: { [Op.in]: ids } } });
    expect(runs).toHaveLength(FILES);
    expect(runs.every((r) => r.status === "done")).toBe(true);
    const peaks = await Peak.findAll({ where: { runId: { [Op.in]: runs.map((r) => r.id) } }, attributes: ["runId"] });
    const perRun = new Map<string, number>();
    for (const p of peaks) perRun.set(p.runId, (perRun.get(p.runId) ?? 0) + 1);
    for (const r of runs) expect(perRun.get(r.id) ?? 0).toBe((r.report as { peaks: unknown[] }).peaks.length);
    expect(worker.child.exitCode).toBeNull();
  });
});
