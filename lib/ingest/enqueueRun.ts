import { analysisJobId, analysisQueue, enqueueAnalysis } from "@/lib/queue";

/**
 * Puts a run on the analysis queue. The job id is `run-<runId>`, so a run already waiting
 * or in progress is not queued twice; a finished job of the same id (kept for a while
 * after completion or failure) is removed first when `replaceFinished` is set, so a run
 * reset for another attempt really runs again.
 */
export async function enqueueRun(spectrumId: string, runId: string, options: { replaceFinished?: boolean } = {}): Promise<void> {
  if (options.replaceFinished) {
    const job = await analysisQueue().getJob(analysisJobId(runId));
    if (job) {
      const state = await job.getState();
      if (state === "completed" || state === "failed") await job.remove();
    }
  }
  await enqueueAnalysis({ spectrumId, runId });
}
