// The review digest: a BullMQ job scheduler on its own queue runs lib/review/digest.ts every
// DIGEST_EVERY_MS (default 15 minutes) in the worker process. Imported once by workers/index.ts;
// any number of workers may run it (the scheduler adds one job per period, and the digest
// claims its rows with SKIP LOCKED).
import { Queue, Worker } from "bullmq";
import { config } from "@/lib/config";
import { connectionOptions } from "@/lib/queue";
import { runReviewDigest, type DigestSummary } from "@/lib/review/digest";
import { scheduleAllPendingNotices } from "@/lib/review/notices";

const log = (level: "info" | "warn", msg: string, extra: Record<string, unknown> = {}) =>
  console[level === "info" ? "log" : "warn"](JSON.stringify({ at: new Date().toISOString(), level, msg, pid: process.pid, ...extra }));

const every = Number(process.env.DIGEST_EVERY_MS);
const everyMs = Number.isInteger(every) && every >= 1000 ? every : 15 * 60_000;
const queueName = `${config().BANDKEEP_QUEUE}-digest`;
const connection = { ...connectionOptions(), maxRetriesPerRequest: null };

const queue = new Queue(queueName, { connection });
queue.on("error", (error) => log("warn", "digest queue error", { error: error.message }));
void queue
  .upsertJobScheduler(
    "review-digest",
    { every: everyMs },
    {
      name: "review-digest",
      opts: { removeOnComplete: { count: 100 }, removeOnFail: { count: 100 }, attempts: 3, backoff: { type: "exponential", delay: 5000 } },
    },
  )
  .catch((error: Error) => log("warn", "digest schedule not set", { error: error.message }));

const worker = new Worker<Record<string, never>, DigestSummary>(
  queueName,
  async () => {
    // Decision mail whose job was lost (Redis down when the decision was saved) goes out now.
    await scheduleAllPendingNotices().catch((error: Error) => log("warn", "pending decision mail not scheduled", { error: error.message }));
    return runReviewDigest();
  },
  { connection, concurrency: 1 },
);
worker.on("completed", (_job, summary) => {
  if (summary.signatures > 0) log("info", "review digest sent", summary);
});
worker.on("failed", (job, error) => log("warn", "review digest failed", { jobId: job?.id, error: error.message }));
worker.on("error", (error) => log("warn", "digest worker error", { error: error.message }));

async function close() {
  await Promise.allSettled([worker.close(), queue.close()]);
}
process.once("SIGTERM", () => void close());
process.once("SIGINT", () => void close());
