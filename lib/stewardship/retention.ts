import type { Actor } from "@/lib/auth/actor";
import { refuse } from "@/lib/errors";
import { Project, RetentionFlag, RetentionPolicy } from "@/models";
import { deleteAnalysisRun, deleteSpectrum, isGone } from "./deletion";
import { auditAs, requireStewardOf } from "./stewardGuards";

// Retention policies and the steward's decisions on items whose retention ended.

export type PolicyInput = { projectId: string; dataClass: "raw" | "processed" | "drafts"; keepDays: number; onExpiry: "delete" | "flag" };

/** Creates or changes the project's policy for one data class; audited with the values before. */
export async function savePolicy(actor: Actor, input: PolicyInput): Promise<void> {
  const project = await Project.findByPk(input.projectId);
  const groupId = requireStewardOf(actor, project?.groupId ?? null, "projectId");
  const existing = await RetentionPolicy.findOne({ where: { projectId: input.projectId, dataClass: input.dataClass } });
  const before = existing ? { keepDays: existing.keepDays, onExpiry: existing.onExpiry } : null;
  const policy = existing
    ? await existing.update({ keepDays: input.keepDays, onExpiry: input.onExpiry })
    : await RetentionPolicy.create({ ...input, createdBy: actor.id });
  await auditAs(actor, groupId, existing ? "retention-policy-changed" : "retention-policy-created", "retention-policy", policy.id, {
    project: project!.name,
    dataClass: input.dataClass,
    keepDays: input.keepDays,
    onExpiry: input.onExpiry,
    before,
  });
}

export async function removePolicy(actor: Actor, id: string): Promise<void> {
  const policy = await RetentionPolicy.findByPk(id);
  const project = policy ? await Project.findByPk(policy.projectId) : null;
  const groupId = requireStewardOf(actor, project?.groupId ?? null);
  await policy!.destroy();
  await auditAs(actor, groupId, "retention-policy-removed", "retention-policy", id, {
    project: project!.name,
    dataClass: policy!.dataClass,
  });
}

/** Keeps or deletes an item a policy flagged; returns its label. An item already gone is recorded as decided all the same. */
export async function decideRetentionFlag(actor: Actor, id: string, decision: "keep" | "delete"): Promise<string> {
  const flag = await RetentionFlag.findByPk(id);
  const groupId = requireStewardOf(actor, flag?.groupId ?? null);
  if (flag!.decision) throw refuse(400, "This item was already decided.");
  if (decision === "delete") {
    const request = { cause: "steward" as const, actorId: actor.id, actorLabel: actor.email, policyId: flag!.policyId };
    try {
      if (flag!.targetType === "spectrum") await deleteSpectrum(flag!.targetId, request);
      else await deleteAnalysisRun(flag!.targetId, request);
    } catch (error) {
      if (!isGone(error)) throw error;
    }
  }
  await flag!.update({ decision, decidedBy: actor.id, decidedAt: new Date() });
  await auditAs(actor, groupId, decision === "keep" ? "retention-flag-kept" : "retention-flag-deleted", flag!.targetType, flag!.targetId, {
    label: flag!.label,
  });
  return flag!.label;
}
