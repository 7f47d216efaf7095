import { Queue } from "bullmq";
import { config } from "./config";

export type AnalysisJob = { spectrumId: string; runId: string };

const globalForQueue = globalThis as unknown as { bandkeepQueue?: Queue<AnalysisJob> };

export function connectionOptions() {
  const url = new URL(config().REDIS_URL);
  return {
    host: url.hostname,
    port: Number(url.port || 6379),
    password: url.password || undefined,
    db: url.pathname.length > 1 ? Number(url.pathname.slice(1)) : 0,
  };
}

/** The analysis queue as seen from the web app: enqueue only, fail fast when Redis is down. */
export function analysisQueue(): Queue<AnalysisJob> {
  if (!globalForQueue.bandkeepQueue) {
    globalForQueue.bandkeepQueue = new Queue<AnalysisJob>(config().BANDKEEP_QUEUE, {
      connection: { ...connectionOptions(), enableOfflineQueue: false, maxRetriesPerRequest: 1 },
      defaultJobOptions: {
        attempts: 5,
        backoff: { type: "exponential", delay: 1000 },
        removeOnComplete: { count: 5000 },
        removeOnFail: { count: 5000 },
      },
    });
    globalForQueue.bandkeepQueue.on("error", () => {});
  }
  return globalForQueue.bandkeepQueue;
}

/** Job id keyed by the run, so enqueuing the same run twice adds one job. */
/** The analysis job id of a run: one job per run, so enqueuing twice adds one job. */
export const analysisJobId = (runId: string) => `run-${runId}`;

export async function enqueueAnalysis(job: AnalysisJob): Promise<void> {
  await analysisQueue().add("analyse", job, { jobId: analysisJobId(job.runId) });
}

export type NoticeJob = { recipientId: string };

const globalForNotices = globalThis as unknown as { bandkeepNoticeQueue?: Queue<NoticeJob> };

/** Decision mail, one delayed job per person per window (lib/review/notices.ts); enqueue only from the app. */
export function noticeQueue(): Queue<NoticeJob> {
  if (!globalForNotices.bandkeepNoticeQueue) {
    globalForNotices.bandkeepNoticeQueue = new Queue<NoticeJob>(`${config().BANDKEEP_QUEUE}-notices`, {
      connection: { ...connectionOptions(), enableOfflineQueue: false, maxRetriesPerRequest: 1 },
      // Finished jobs are removed so that their ids (the oldest unsent notice) can be scheduled again by the safety net.
      defaultJobOptions: { attempts: 5, backoff: { type: "exponential", delay: 2000 }, removeOnComplete: true, removeOnFail: true },
    });
    globalForNotices.bandkeepNoticeQueue.on("error", () => {});
  }
  return globalForNotices.bandkeepNoticeQueue;
}
