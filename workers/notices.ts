// Decision mail to uploaders: one delayed BullMQ job per person and window (lib/review/notices.ts)
// sends every decision of that window as one message. Imported once by workers/index.ts.
import { UnrecoverableError, Worker } from "bullmq";
import { z } from "zod";
import { config } from "@/lib/config";
import { connectionOptions, type NoticeJob } from "@/lib/queue";
import { sendPendingNotices } from "@/lib/review/notices";

const log = (level: "info" | "warn", msg: string, extra: Record<string, unknown> = {}) =>
  console[level === "info" ? "log" : "warn"](JSON.stringify({ at: new Date().toISOString(), level, msg, pid: process.pid, ...extra }));

const payloadSchema = z.object({ recipientId: z.string().uuid() }).strict();

const worker = new Worker<NoticeJob, number>(
  `${config().BANDKEEP_QUEUE}-notices`,
  async (job) => {
    const payload = payloadSchema.safeParse(job.data);
    if (!payload.success) throw new UnrecoverableError(`job ${job.id}: payload is not {recipientId}`);
    return sendPendingNotices(payload.data.recipientId);
  },
  { connection: { ...connectionOptions(), maxRetriesPerRequest: null }, concurrency: 2 },
);
worker.on("completed", (job, sent) => {
  if (sent > 0) log("info", "decision mail sent", { jobId: job.id });
});
worker.on("failed", (job, error) => log("warn", "decision mail failed", { jobId: job?.id, error: error.message }));
worker.on("error", (error) => log("warn", "notice worker error", { error: error.message }));

process.once("SIGTERM", () => void worker.close());
process.once("SIGINT", () => void worker.close());
