import { expiryOf, policyFor } from "./expiryOf";
import { holdOn } from "./holdOn";
import type { ActiveHold, PlannedAction, PolicyRule, ProtectedItem, RetainedItem, SweepPlan } from "./types";

/**
 * Decides what a retention sweep does at `now`, from plain data only.
 *
 * An item is expired when a policy of its project and data class exists and
 * createdAt + keepDays ≤ now. An expired item is then
 * - protected when a legal hold covers it, an analysis is in flight on it, the steward
 *   already chose to keep it, or (spectra) a spectrum that stays is compared with it;
 * - otherwise flagged (policy "flag", not yet flagged) or deleted (policy "delete").
 *
 * "Stays" is computed as a fixed point: a reference spectrum may go only when every
 * spectrum that depends on it goes in the same sweep. Deleting a spectrum removes its
 * analyses with it. The input is never mutated.
 */
export function planSweep(
  items: readonly RetainedItem[],
  policies: readonly PolicyRule[],
  holds: readonly ActiveHold[],
  now: Date,
): SweepPlan {
  if (!(now instanceof Date) || Number.isNaN(now.getTime())) throw new TypeError("now must be a valid Date");
  const protectedItems: ProtectedItem[] = [];
  const toFlag: PlannedAction[] = [];
  const candidates = new Map<string, PlannedAction>(); // key kind:id

  for (const item of items) {
    const policy = policyFor(item, policies);
    if (!policy) continue;
    const expiredAt = expiryOf(item, policy);
    if (expiredAt.getTime() > now.getTime()) continue;
    const base = { item, policy, expiredAt };
    const hold = holdOn(item, holds);
    if (hold) {
      protectedItems.push({ ...base, protection: { kind: "hold", holdId: hold.id, targetType: hold.targetType, reason: hold.reason } });
    } else if (item.busy) {
      protectedItems.push({ ...base, protection: { kind: "busy" } });
    } else if (item.keptByDecision) {
      protectedItems.push({ ...base, protection: { kind: "kept" } });
    } else if (policy.onExpiry === "flag") {
      if (!item.flagged) toFlag.push(base);
    } else {
      candidates.set(`${item.kind}:${item.id}`, base);
    }
  }

  // Spectra that depend on each reference spectrum.
  const spectra = items.filter((i) => i.kind === "spectrum");
  const dependents = new Map<string, RetainedItem[]>();
  for (const s of spectra) {
    if (s.referenceSpectrumId) {
      const list = dependents.get(s.referenceSpectrumId) ?? [];
      list.push(s);
      dependents.set(s.referenceSpectrumId, list);
    }
  }
  // Fixed point: drop candidates that a staying spectrum depends on.
  let changed = true;
  while (changed) {
    changed = false;
    for (const [key, action] of candidates) {
      if (action.item.kind !== "spectrum") continue;
      const staying = (dependents.get(action.item.id) ?? []).find((d) => !candidates.has(`spectrum:${d.id}`));
      if (staying) {
        candidates.delete(key);
        protectedItems.push({ ...action, protection: { kind: "reference", dependentId: staying.id, dependentLabel: staying.label } });
        changed = true;
      }
    }
  }
  // Analyses of spectra that go anyway are removed with them: no separate step.
  const goingSpectra = new Set([...candidates.values()].filter((a) => a.item.kind === "spectrum").map((a) => a.item.id));
  const runs = [...candidates.values()].filter((a) => a.item.kind === "analysis-run" && !goingSpectra.has(a.item.spectrumId));

  // Order spectra so that dependents come before their references (depth from the leaves).
  const depth = new Map<string, number>();
  const depthOf = (id: string, seen = new Set<string>()): number => {
    const known = depth.get(id);
    if (known !== undefined) return known;
    if (seen.has(id)) return 0; // a cycle cannot exist in the database (a spectrum's reference is older); be safe anyway
    seen.add(id);
    const ds = (dependents.get(id) ?? []).filter((d) => goingSpectra.has(d.id));
    const value = ds.length === 0 ? 0 : 1 + Math.max(...ds.map((d) => depthOf(d.id, seen)));
    depth.set(id, value);
    return value;
  };
  const spectraActions = [...candidates.values()]
    .filter((a) => a.item.kind === "spectrum")
    .sort(
      (a, b) =>
        depthOf(a.item.id) - depthOf(b.item.id) ||
        a.item.createdAt.getTime() - b.item.createdAt.getTime() ||
        a.item.id.localeCompare(b.item.id),
    );

  return { toDelete: [...runs, ...spectraActions], toFlag, protectedItems };
}

/** One line for people: why an expired item was not deleted. */
export function describeProtection(p: ProtectedItem["protection"]): string {
  switch (p.kind) {
    case "hold":
      return `Under legal hold (${p.targetType}): ${p.reason}`;
    case "reference":
      return `Reference spectrum of "${p.dependentLabel}", which is kept`;
    case "busy":
      return "An analysis is queued or running on it";
    case "kept":
      return "The steward chose to keep it";
  }
}
