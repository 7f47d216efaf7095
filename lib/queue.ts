import { Queue } from "bullmq";
import { config } from "./config";
import { processSingleton } from "@/lib/processSingleton";

export type AnalysisJob = { spectrumId: string; runId: string };

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
  return processSingleton("bandkeepQueue", () => {
    const queue = new Queue<AnalysisJob>(config().BANDKEEP_QUEUE, {
      connection: { ...connectionOptions(), enableOfflineQueue: false, maxRetriesPerRequest: 1 },
      defaultJobOptions: {
        attempts: 5,
        backoff: { type: "exponential", delay: 1000 },
        removeOnComplete: { count: 5000 },
        removeOnFail: { count: 5000 },
      },
    });
    queue.on("error", () => {});
    return queue;
  });
}

/** The analysis job id of a run: one job per run, so enqueuing twice adds one job. */
export const analysisJobId = (runId: string) => `run-${runId}`;

export async function enqueueAnalysis(job: AnalysisJob): Promise<void> {
  await analysisQueue().add("analyse", job, { jobId: analysisJobId(job.runId) });
}

export type NoticeJob = { recipientId: string };

/** Decision mail, one delayed job per person per window (lib/review/notices.ts); enqueue only from the app. */
export function noticeQueue(): Queue<NoticeJob> {
  return processSingleton("bandkeepNoticeQueue", () => {
    const queue = new Queue<NoticeJob>(`${config().BANDKEEP_QUEUE}-notices`, {
      connection: { ...connectionOptions(), enableOfflineQueue: false, maxRetriesPerRequest: 1 },
      // Finished jobs are removed so that their ids (the oldest unsent notice) can be scheduled again by the safety net.
      defaultJobOptions: { attempts: 5, backoff: { type: "exponential", delay: 2000 }, removeOnComplete: true, removeOnFail: true },
    });
    queue.on("error", () => {});
    return queue;
  });
}
