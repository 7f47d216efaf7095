import { DAY_MS, type PolicyRule, type RetainedItem } from "./types";

/** When an item expires under a policy: its creation time plus keepDays whole days. */
export function expiryOf(item: Pick<RetainedItem, "createdAt">, policy: Pick<PolicyRule, "keepDays">): Date {
  if (!Number.isInteger(policy.keepDays) || policy.keepDays <= 0) throw new RangeError("keepDays must be a positive whole number");
  return new Date(item.createdAt.getTime() + policy.keepDays * DAY_MS);
}

/** The policy that governs an item: the one of its project and data class, if any. */
export function policyFor(item: Pick<RetainedItem, "projectId" | "dataClass">, policies: readonly PolicyRule[]): PolicyRule | undefined {
  return policies.find((p) => p.projectId === item.projectId && p.dataClass === item.dataClass);
}
