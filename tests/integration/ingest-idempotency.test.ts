// Duplicate deliveries of one job, and two workers at once, write a run's results once.
import { randomBytes } from "node:crypto";
import { Queue } from "bullmq";

const QUEUE = `ingest-idem-${randomBytes(4).toString("hex")}`;
process.env.BANDKEEP_QUEUE = QUEUE; // this file's own queue: the shared worker never sees these jobs

import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { AnalysisRun, Peak, Signature, Spectrum } from "@/models";
import { closeDb } from "@/lib/db";
import { analysisQueue, connectionOptions } from "@/lib/queue";
import { ingestFiles } from "@/lib/ingest";
import { saveAnalysis } from "@/workers/saveAnalysis";
import { createLab, type Lab } from "../helpers/fixtures";
import { startWorker, workerReady, type Owned } from "../helpers/processes";
import { enc, syntheticAbsorptionCsv } from "../helpers/spectra";
import { waitFor } from "../helpers/waitFor";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 304, 400, 401, 403, 404, 409, 413, 415, 422, 503);
// every other number checked here is a count or value this test itself created (known truth of its fixtures).

let lab: Lab;
const workers: Owned[] = [];

beforeAll(async () => {
  lab = await createLab();
});
afterAll(async () => {
  await Promise.all(workers.map((w) => w.stop("SIGTERM")));
  await analysisQueue()
    .obliterate({ force: true })
    .catch(() => {});
  await analysisQueue().close();
  await closeDb();
});

/** Stores one file through the ingest entry point the API and the seed use; fails the test on a refusal. */
async function storeOne(fileName: string, bytes: Uint8Array, metadata: { referenceSpectrumId?: string } = {}) {
  const [outcome] = await ingestFiles(lab.actor, { projectId: lab.project.id, technique: "absorption", ...metadata }, [
    { fileName, bytes },
  ]);
  if (!outcome?.ok) throw new Error(`${fileName} was not stored: ${outcome?.error.message}`);
  return outcome;
}

describe("idempotent analysis writes", () => {
  it("writes once when the same run is delivered four times to two workers", async () => {
    const reference = await storeOne("parent.csv", enc(syntheticAbsorptionCsv({ seed: 201 })));
    const stored = await storeOne("child.csv", enc(syntheticAbsorptionCsv({ seed: 202, excitonHeight: 0.2 })), {
      referenceSpectrumId: reference.spectrumId,
    });
    // Extra deliveries of the same payload under other job ids, as a crashed producer retrying would cause.
    const queue = new Queue(QUEUE, { connection: connectionOptions() });
    for (let i = 0; i < 3; i++)
      await queue.add("analyse", { spectrumId: stored.spectrumId, runId: stored.runId }, { jobId: `dup-${i}-${stored.runId}` });
    await queue.close();

    for (let i = 0; i < 2; i++) {
      const w = startWorker({ BANDKEEP_QUEUE: QUEUE, WORKER_CONCURRENCY: "2" });
      workers.push(w);
      await workerReady(w);
    }
    const run = await waitFor("the run to be done", async () => {
      const r = await AnalysisRun.findByPk(stored.runId!);
      return r?.status === "done" ? r : undefined;
    });
    await waitFor("every delivery to finish", async () => {
      const counts = await analysisQueue().getJobCounts("waiting", "active", "delayed", "completed");
      return counts.completed >= 5 && counts.waiting + counts.active + counts.delayed === 0 ? true : undefined;
    });
    const report = run.report as { peaks: unknown[]; flags: unknown[] };
    expect(report.flags.length).toBeGreaterThan(0);
    expect(await Peak.count({ where: { runId: run.id } })).toBe(report.peaks.length);
    expect(await Signature.count({ where: { runId: run.id } })).toBe(report.flags.length);
    expect(await AnalysisRun.count({ where: { spectrumId: stored.spectrumId } })).toBe(1);
    expect((await Spectrum.findByPk(stored.spectrumId))!.status).toBe("analysed");
  });

  it("saveAnalysis called twice at once for one run writes one set of rows", async () => {
    const stored = await storeOne("twice.csv", enc(syntheticAbsorptionCsv({ seed: 203 })));
    const done = await waitFor("the first analysis", async () => {
      const r = await AnalysisRun.findByPk(stored.runId!);
      return r?.status === "done" ? r : undefined;
    });
    const report = done.report as Parameters<typeof saveAnalysis>[0]["report"];
    // Make the run writable again, then race two saves of the same result.
    await Peak.destroy({ where: { runId: done.id } });
    await done.update({ status: "running" });
    const input = {
      runId: done.id,
      report,
      startedAt: new Date(),
      durationMs: 5,
      engineVersion: done.engineVersion,
      axisUnit: "nm",
      valueUnit: "absorbance",
    };
    const results = await Promise.all([saveAnalysis(input), saveAnalysis(input), saveAnalysis(input)]);
    expect(results.filter(Boolean)).toHaveLength(1);
    expect(await Peak.count({ where: { runId: done.id } })).toBe(report.peaks.length);
  });
});
