import { Op } from "sequelize";
import { AnalysisRun } from "@/models";
import { enqueueRun } from "@/lib/ingest/enqueueRun";
import { analysisJobId, analysisQueue } from "@/lib/queue";

const LIVE_STATES = new Set(["waiting", "active", "delayed", "prioritized", "waiting-children"]);

/**
 * Queues runs that wait in the database without a live job: their enqueue failed (Redis
 * down during the upload) or the queue lost them. Re-adding is harmless: the job id is
 * keyed by the run and the processor skips finished runs. Returns how many were queued.
 */
export async function sweepWaitingRuns(olderThanMs: number, limit = 500): Promise<number> {
  const runs = await AnalysisRun.findAll({
    where: { status: ["queued", "running"], updatedAt: { [Op.lt]: new Date(Date.now() - olderThanMs) } },
    attributes: ["id", "spectrumId"],
    order: [["updatedAt", "ASC"]],
    limit,
  });
  let queued = 0;
  for (const run of runs) {
    const job = await analysisQueue().getJob(analysisJobId(run.id));
    if (job && LIVE_STATES.has(await job.getState())) continue;
    await enqueueRun(run.spectrumId, run.id, { replaceFinished: true });
    await AnalysisRun.update({ updatedAt: new Date() }, { where: { id: run.id } }).catch(() => {});
    queued += 1;
  }
  return queued;
}
