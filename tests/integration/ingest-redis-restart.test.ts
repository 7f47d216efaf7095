// Redis restarted in the middle of a batch (this test's own redis-server): no job is lost.
// Files uploaded while Redis is down are stored and queued later by the worker's sweep.
import { randomBytes } from "node:crypto";

const PORT = 63_900 + Math.floor(Math.random() * 90);
const QUEUE = `ingest-redis-${randomBytes(4).toString("hex")}`;
process.env.REDIS_URL = `redis://127.0.0.1:${PORT}`;
process.env.BANDKEEP_QUEUE = QUEUE;

import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Op } from "sequelize";
import { AnalysisRun, Spectrum } from "@/models";
import { closeDb } from "@/lib/db";
import { analysisQueue } from "@/lib/queue";
import { ingestFiles } from "@/lib/ingest";
import { createLab, type Lab } from "../helpers/fixtures";
import { ownRedis, startWorker, workerReady, type Owned } from "../helpers/processes";
import { enc, syntheticAbsorptionCsv } from "../helpers/spectra";
import { waitFor } from "../helpers/waitFor";

const redisServer = ownRedis(PORT);
let lab: Lab;
let worker: Owned | null = null;

beforeAll(async () => {
  await redisServer.start();
  lab = await createLab();
});
afterAll(async () => {
  await worker?.stop("SIGTERM");
  await analysisQueue()
    .close()
    .catch(() => {});
  await redisServer.destroy();
  await closeDb();
});

const files = (from: number, n: number) =>
  Array.from({ length: n }, (_, i) => ({
    fileName: `redis-${from + i}.csv`,
    bytes: enc(syntheticAbsorptionCsv({ seed: 5000 + from + i, points: 600 })),
  }));

describe("Redis restart in the middle of a batch", () => {
  it("loses no job", async () => {
    const meta = { projectId: lab.project.id, technique: "absorption" };
    const first = await ingestFiles(lab.actor, meta, files(0, 60));
    expect(first.every((o) => o.ok && o.queued)).toBe(true);

    worker = startWorker({
      BANDKEEP_QUEUE: QUEUE,
      REDIS_URL: process.env.REDIS_URL!,
      WORKER_CONCURRENCY: "2",
      WORKER_SWEEP_MS: "1000",
      WORKER_SWEEP_AGE_MS: "2000",
    });
    await workerReady(worker);
    const ids = first.map((o) => (o.ok ? o.spectrumId : ""));
    await waitFor(
      "some analyses",
      async () => ((await Spectrum.count({ where: { id: { [Op.in]: ids }, status: "analysed" } })) >= 10 ? true : undefined),
      60_000,
      100,
    );

    await redisServer.stop();
    // Uploads while Redis is down: stored, not queued.
    const during = await ingestFiles(lab.actor, meta, files(100, 10));
    expect(during.every((o) => o.ok)).toBe(true);
    expect(during.some((o) => o.ok && !o.queued)).toBe(true);
    await redisServer.start();
    const after = await ingestFiles(lab.actor, meta, files(200, 10));
    expect(after.every((o) => o.ok)).toBe(true);

    const all = [...first, ...during, ...after].map((o) => (o.ok ? o.spectrumId : ""));
    await waitFor(
      "every file analysed",
      async () => ((await Spectrum.count({ where: { id: { [Op.in]: all }, status: "analysed" } })) === all.length ? true : undefined),
      120_000,
      250,
    );
    const runs = await AnalysisRun.findAll({ where: { spectrumId: { [Op.in]: all } } });
    expect(runs).toHaveLength(all.length);
    expect(runs.every((r) => r.status === "done")).toBe(true);
    expect(worker.child.exitCode).toBeNull();
  });
});
