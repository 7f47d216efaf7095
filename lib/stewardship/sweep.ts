import { recordAudit } from "@/lib/audit";
import { RetentionFlag, Project } from "@/models";
import { deleteAnalysisRun, deleteSpectrum, finishPending } from "./deletion";
import { planSweep } from "./planSweep";
import { loadSnapshot } from "./snapshot";
import type { SweepPlan } from "./types";
import { Refusal } from "@/lib/errors";

export type SweepOptions = {
  /** Only these projects (tests, previews); every project when omitted. */
  projectIds?: string[];
  now?: Date;
  /** Test hooks: pause after each object delete (before commit) and between items. */
  pauseMs?: number;
  onItem?: (kind: string, id: string) => void;
};

export type SweepSummary = {
  recovered: number;
  deleted: number;
  flagged: number;
  protectedCount: number;
  refused: { id: string; message: string }[];
};

const SWEEP_ACTOR = "retention sweep";

/** Plans what the sweep would do now, without doing it (the dry run). */
export async function planFor(projectIds?: string[], now = new Date()): Promise<SweepPlan> {
  const s = await loadSnapshot(projectIds);
  return planSweep(s.items, s.policies, s.holds, now);
}

/** One retention sweep: finish interrupted deletions, then flag and delete what expired. */
export async function runSweep(options: SweepOptions = {}): Promise<SweepSummary> {
  const recovered = await finishPending();
  const plan = await planFor(options.projectIds, options.now ?? new Date());
  const groupOf = new Map((await Project.findAll({ attributes: ["id", "groupId"] })).map((p) => [p.id, p.groupId]));
  let flagged = 0;
  for (const { item, policy } of plan.toFlag) {
    const groupId = groupOf.get(item.projectId);
    if (!groupId) continue;
    const [, created] = await RetentionFlag.findOrCreate({
      where: { targetType: item.kind, targetId: item.id },
      defaults: {
        groupId,
        projectId: item.projectId,
        policyId: policy.id,
        dataClass: item.dataClass,
        targetType: item.kind,
        targetId: item.id,
        label: item.label,
        decision: null,
        decidedBy: null,
        decidedAt: null,
      },
    });
    if (created) {
      flagged++;
      await recordAudit({
        actorId: null,
        actorLabel: SWEEP_ACTOR,
        groupId,
        action: "retention-flagged",
        targetType: item.kind,
        targetId: item.id,
        details: { label: item.label, policyId: policy.id, dataClass: item.dataClass },
      });
    }
  }
  let deleted = 0;
  const refused: SweepSummary["refused"] = [];
  for (const { item, policy } of plan.toDelete) {
    options.onItem?.(item.kind, item.id);
    const request = { cause: "policy" as const, actorId: null, actorLabel: SWEEP_ACTOR, policyId: policy.id, pauseMs: options.pauseMs };
    try {
      if (item.kind === "spectrum") await deleteSpectrum(item.id, request);
      else await deleteAnalysisRun(item.id, request);
      deleted++;
    } catch (error) {
      // The world changed since the plan (a hold placed, a new dependent): keep the item.
      if (error instanceof Refusal) refused.push({ id: item.id, message: error.message });
      else throw error;
    }
  }
  return { recovered, deleted, flagged, protectedCount: plan.protectedItems.length, refused };
}
