// The analysis worker: a separate process that takes runs off the BullMQ queue and
// analyses them. Start: node --import tsx workers/index.ts. Several may run at once.
import { Worker } from "bullmq";
import { config } from "@/lib/config";
import { closeDb } from "@/lib/db";
import { analysisQueue, connectionOptions, type AnalysisJob } from "@/lib/queue";
import { memoryGuard } from "./memoryGuard";
import { processAnalysis, type JobSummary } from "./processAnalysis";
import { sweepWaitingRuns } from "./sweepWaitingRuns";
import "./digest";
import "./notices";
import "./retention";

const log = (level: "info" | "warn" | "error", msg: string, extra: Record<string, unknown> = {}) =>
  console[level === "info" ? "log" : level](JSON.stringify({ at: new Date().toISOString(), level, msg, pid: process.pid, ...extra }));

const intEnv = (name: string, fallback: number) => {
  const n = Number(process.env[name]);
  return Number.isInteger(n) && n > 0 ? n : fallback;
};

const queueName = config().BANDKEEP_QUEUE;
const concurrency = intEnv("WORKER_CONCURRENCY", 2);
const lockDuration = intEnv("WORKER_LOCK_MS", 30_000);
const sweepEveryMs = intEnv("WORKER_SWEEP_MS", 60_000);
const sweepAgeMs = intEnv("WORKER_SWEEP_AGE_MS", 120_000);

const worker = new Worker<AnalysisJob, JobSummary>(queueName, processAnalysis, {
  connection: { ...connectionOptions(), maxRetriesPerRequest: null },
  concurrency,
  lockDuration,
  stalledInterval: Math.max(1000, Math.round(lockDuration / 2)),
  maxStalledCount: 3,
});

const afterJob = memoryGuard(intEnv("WORKER_HEAP_MB", 64));
worker.on("completed", afterJob);
worker.on("ready", () => log("info", "worker ready", { queue: queueName, concurrency }));
worker.on("error", (error) => log("error", "worker error", { error: error.message }));
worker.on("failed", (job, error) =>
  log("warn", "job attempt failed", { jobId: job?.id, attemptsMade: job?.attemptsMade, error: error.message }),
);
worker.on("stalled", (jobId) => log("warn", "job stalled, it will be retried", { jobId }));

let sweeping = false;
const sweepTimer = setInterval(async () => {
  if (sweeping) return;
  sweeping = true;
  try {
    const n = await sweepWaitingRuns(sweepAgeMs);
    if (n > 0) log("info", "queued waiting runs", { count: n });
  } catch (error) {
    log("warn", "sweep skipped", { error: error instanceof Error ? error.message : String(error) });
  } finally {
    sweeping = false;
  }
}, sweepEveryMs);
sweepTimer.unref();

let closing = false;
async function shutdown(signal: string) {
  if (closing) return;
  closing = true;
  log("info", "closing worker", { signal });
  clearInterval(sweepTimer);
  const force = setTimeout(
    () => {
      log("error", "worker did not close in time, exiting");
      process.exit(1);
    },
    intEnv("WORKER_CLOSE_TIMEOUT_MS", 30_000),
  );
  force.unref();
  try {
    await worker.close();
    await analysisQueue()
      .close()
      .catch(() => {});
    await closeDb();
  } finally {
    process.exit(0);
  }
}
process.on("SIGTERM", () => void shutdown("SIGTERM"));
process.on("SIGINT", () => void shutdown("SIGINT"));
process.on("unhandledRejection", (reason) => log("error", "unhandled rejection", { reason: String(reason) }));
