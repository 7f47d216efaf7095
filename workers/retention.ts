// The retention sweep as a BullMQ repeatable job, run by the worker process
// (registered by one import in workers/index.ts). One sweep at a time: the queue has
// a single repeatable schedule and this worker runs with concurrency 1. A sweep that is
// killed half way is finished by the next one (see lib/stewardship/deletion.ts).
import { Queue, Worker } from "bullmq";
import { connectionOptions } from "@/lib/queue";
import { runSweep, type SweepSummary } from "@/lib/stewardship/sweep";

const QUEUE = process.env.RETENTION_QUEUE ?? "bandkeep-retention";
const everyMs = (() => {
  const n = Number(process.env.RETENTION_SWEEP_EVERY_MS);
  return Number.isInteger(n) && n >= 60_000 ? n : 3_600_000;
})();

const log = (level: "info" | "warn" | "error", msg: string, extra: Record<string, unknown> = {}) =>
  console[level === "info" ? "log" : level](JSON.stringify({ at: new Date().toISOString(), level, msg, pid: process.pid, ...extra }));

const disabled = process.env.RETENTION_SWEEP === "off";

if (!disabled) {
  const connection = { ...connectionOptions(), maxRetriesPerRequest: null };
  const queue = new Queue(QUEUE, {
    connection,
    defaultJobOptions: {
      removeOnComplete: { count: 100 },
      removeOnFail: { count: 100 },
      attempts: 3,
      backoff: { type: "exponential", delay: 60_000 },
    },
  });
  queue.on("error", (error) => log("warn", "retention queue error", { error: error.message }));
  void queue
    .upsertJobScheduler("retention-sweep", { every: everyMs }, { name: "sweep", data: {} })
    .catch((error: Error) => log("warn", "could not schedule the retention sweep", { error: error.message }));

  const worker = new Worker<Record<string, never>, SweepSummary>(
    QUEUE,
    async () => {
      const summary = await runSweep();
      log("info", "retention sweep finished", { ...summary, refused: summary.refused.length });
      return summary;
    },
    { connection, concurrency: 1, lockDuration: 120_000 },
  );
  worker.on("error", (error) => log("error", "retention worker error", { error: error.message }));
  worker.on("failed", (job, error) => log("warn", "retention sweep failed", { jobId: job?.id, error: error.message }));

  const close = () => void Promise.allSettled([worker.close(), queue.close()]);
  process.once("SIGTERM", close);
  process.once("SIGINT", close);
}
