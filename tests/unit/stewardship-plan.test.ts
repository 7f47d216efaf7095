import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { expiryOf } from "@/lib/stewardship/expiryOf";
import { holdOn } from "@/lib/stewardship/holdOn";
import { describeProtection, planSweep } from "@/lib/stewardship/planSweep";
import { DAY_MS, type ActiveHold, type PolicyRule, type RetainedItem } from "@/lib/stewardship/types";

// The pure retention decisions, checked on hand-made cases and as properties over
// random worlds of spectra, analyses, policies, holds and reference dependencies.

const NOW = new Date("2027-03-01T12:00:00Z");
const daysAgo = (d: number) => new Date(NOW.getTime() - d * DAY_MS);

function spectrum(id: string, over: Partial<RetainedItem> = {}): RetainedItem {
  return {
    kind: "spectrum",
    id,
    dataClass: "raw",
    projectId: "P",
    spectrumId: id,
    seriesId: null,
    sampleId: null,
    referenceSpectrumId: null,
    createdAt: daysAgo(100),
    sizeBytes: 10,
    label: id,
    busy: false,
    keptByDecision: false,
    flagged: false,
    ...over,
  };
}
const policy = (over: Partial<PolicyRule> = {}): PolicyRule => ({
  id: "pol",
  projectId: "P",
  dataClass: "raw",
  keepDays: 30,
  onExpiry: "delete",
  ...over,
});

describe("expiryOf", () => {
  it("adds whole days to the creation time", () => {
    expect(expiryOf({ createdAt: new Date("2027-01-01T00:00:00Z") }, { keepDays: 2 }).toISOString()).toBe("2027-01-03T00:00:00.000Z");
  });
  it("refuses a keepDays that is not a positive whole number", () => {
    expect(() => expiryOf({ createdAt: NOW }, { keepDays: 0 })).toThrow(new RangeError("keepDays must be a positive whole number"));
    expect(() => expiryOf({ createdAt: NOW }, { keepDays: 1.5 })).toThrow(RangeError);
  });
});

describe("holdOn", () => {
  const item = spectrum("s1", { seriesId: "ser", sampleId: "smp" });
  it.each([
    ["project", "P"],
    ["series", "ser"],
    ["sample", "smp"],
    ["spectrum", "s1"],
  ] as const)("a hold on the %s covers the spectrum", (t, id) => {
    expect(holdOn(item, [{ id: "h", targetType: t, targetId: id, reason: "r" }])?.id).toBe("h");
  });
  it("a hold elsewhere does not", () => {
    expect(holdOn(item, [{ id: "h", targetType: "series", targetId: "other", reason: "r" }])).toBeUndefined();
    expect(holdOn(spectrum("s2"), [{ id: "h", targetType: "series", targetId: "ser", reason: "r" }])).toBeUndefined();
  });
});

describe("planSweep on hand-made cases", () => {
  it("deletes what expired and keeps what did not", () => {
    const plan = planSweep([spectrum("old", { createdAt: daysAgo(31) }), spectrum("new", { createdAt: daysAgo(29) })], [policy()], [], NOW);
    expect(plan.toDelete.map((a) => a.item.id)).toEqual(["old"]);
  });
  it("expires exactly at createdAt + keepDays", () => {
    expect(planSweep([spectrum("edge", { createdAt: daysAgo(30) })], [policy()], [], NOW).toDelete).toHaveLength(1);
    expect(planSweep([spectrum("edge", { createdAt: new Date(daysAgo(30).getTime() + 1) })], [policy()], [], NOW).toDelete).toHaveLength(0);
  });
  it("keeps held items and says why", () => {
    const plan = planSweep(
      [spectrum("s", { sampleId: "smp" })],
      [policy()],
      [{ id: "h", targetType: "sample", targetId: "smp", reason: "patent filing" }],
      NOW,
    );
    expect(plan.toDelete).toEqual([]);
    expect(describeProtection(plan.protectedItems[0]!.protection)).toBe("Under legal hold (sample): patent filing");
  });
  it("keeps a reference spectrum while a kept spectrum depends on it, including transitively", () => {
    const items = [
      spectrum("ref"),
      spectrum("mid", { referenceSpectrumId: "ref" }),
      spectrum("leaf", { referenceSpectrumId: "mid", createdAt: daysAgo(1) }),
    ];
    const plan = planSweep(items, [policy()], [], NOW);
    expect(plan.toDelete).toEqual([]);
    expect(plan.protectedItems.map((p) => [p.item.id, p.protection.kind])).toEqual(
      expect.arrayContaining([
        ["mid", "reference"],
        ["ref", "reference"],
      ]),
    );
  });
  it("deletes a reference together with all its dependents, dependents first", () => {
    const items = [
      spectrum("ref", { createdAt: daysAgo(200) }),
      spectrum("a", { referenceSpectrumId: "ref" }),
      spectrum("b", { referenceSpectrumId: "a", createdAt: daysAgo(40) }),
    ];
    expect(planSweep(items, [policy()], [], NOW).toDelete.map((a) => a.item.id)).toEqual(["b", "a", "ref"]);
  });
  it("flags instead of deleting under a flag policy, once", () => {
    const plan = planSweep([spectrum("s"), spectrum("t", { flagged: true })], [policy({ onExpiry: "flag" })], [], NOW);
    expect(plan.toDelete).toEqual([]);
    expect(plan.toFlag.map((a) => a.item.id)).toEqual(["s"]);
  });
  it("never deletes what an analysis is running on, or what the steward kept", () => {
    const plan = planSweep([spectrum("busy", { busy: true }), spectrum("kept", { keptByDecision: true })], [policy()], [], NOW);
    expect(plan.toDelete).toEqual([]);
    expect(plan.protectedItems.map((p) => p.protection.kind).sort()).toEqual(["busy", "kept"]);
  });
  it("applies a policy only to its own project and class", () => {
    const plan = planSweep([spectrum("other", { projectId: "Q" }), spectrum("draft", { dataClass: "drafts" })], [policy()], [], NOW);
    expect(plan.toDelete).toEqual([]);
  });
  it("does not list an analysis separately when its spectrum goes", () => {
    const run: RetainedItem = { ...spectrum("run"), kind: "analysis-run", dataClass: "processed", spectrumId: "s" };
    const plan = planSweep([spectrum("s"), run], [policy(), policy({ id: "p2", dataClass: "processed" })], [], NOW);
    expect(plan.toDelete.map((a) => a.item.id)).toEqual(["s"]);
  });
  it("refuses an invalid now", () => {
    expect(() => planSweep([], [], [], new Date("nope"))).toThrow(new TypeError("now must be a valid Date"));
  });
});

// --- properties over random worlds ---

const ids = ["a", "b", "c", "d", "e", "f", "g", "h"];
const world = fc.record({
  spectra: fc.uniqueArray(
    fc.record({
      id: fc.constantFrom(...ids),
      project: fc.constantFrom("P", "Q"),
      series: fc.option(fc.constantFrom("s1", "s2"), { nil: null }),
      sample: fc.option(fc.constantFrom("m1", "m2"), { nil: null }),
      ref: fc.option(fc.constantFrom(...ids), { nil: null }),
      age: fc.integer({ min: 0, max: 400 }),
      failed: fc.boolean(),
      busy: fc.boolean(),
      kept: fc.boolean(),
      flagged: fc.boolean(),
    }),
    { selector: (s) => s.id, maxLength: 8 },
  ),
  runs: fc.array(fc.record({ of: fc.constantFrom(...ids), age: fc.integer({ min: 0, max: 400 }), busy: fc.boolean() }), { maxLength: 6 }),
  policies: fc.uniqueArray(
    fc.record({
      project: fc.constantFrom("P", "Q"),
      dataClass: fc.constantFrom("raw", "processed", "drafts" as const),
      keepDays: fc.integer({ min: 1, max: 365 }),
      onExpiry: fc.constantFrom("delete", "flag" as const),
    }),
    { selector: (p) => `${p.project}${p.dataClass}`, maxLength: 6 },
  ),
  holds: fc.array(
    fc.record({
      type: fc.constantFrom("project", "series", "sample", "spectrum" as const),
      id: fc.constantFrom("P", "Q", "s1", "s2", "m1", "m2", ...ids),
    }),
    { maxLength: 3 },
  ),
});

type World = typeof world extends fc.Arbitrary<infer T> ? T : never;

function build(w: World) {
  const present = new Set(w.spectra.map((s) => s.id));
  // References only to older spectra that exist, as in the database (no cycles).
  const order = new Map(w.spectra.map((s, i) => [s.id, i]));
  const items: RetainedItem[] = w.spectra.map((s, i) => ({
    kind: "spectrum",
    id: s.id,
    dataClass: s.failed ? "drafts" : "raw",
    projectId: s.project,
    spectrumId: s.id,
    seriesId: s.series,
    sampleId: s.sample,
    referenceSpectrumId: s.ref && present.has(s.ref) && order.get(s.ref)! < i ? s.ref : null,
    createdAt: daysAgo(s.age),
    sizeBytes: 1,
    label: s.id,
    busy: s.busy,
    keptByDecision: s.kept,
    flagged: s.flagged,
  }));
  const byId = new Map(items.map((i) => [i.id, i]));
  w.runs.forEach((r, k) => {
    const s = byId.get(r.of);
    if (s)
      items.push({
        ...s,
        kind: "analysis-run",
        id: `run${k}`,
        dataClass: "processed",
        referenceSpectrumId: null,
        createdAt: daysAgo(r.age),
        busy: r.busy,
        keptByDecision: false,
        flagged: false,
      });
  });
  const policies: PolicyRule[] = w.policies.map((p, k) => ({
    id: `pol${k}`,
    projectId: p.project,
    dataClass: p.dataClass,
    keepDays: p.keepDays,
    onExpiry: p.onExpiry,
  }));
  const holds: ActiveHold[] = w.holds.map((h, k) => ({ id: `h${k}`, targetType: h.type, targetId: h.id, reason: "r" }));
  return { items, policies, holds };
}

describe("planSweep properties", () => {
  it("never deletes anything held, busy, kept, flag-governed or unexpired; every reference of a kept spectrum stays", () => {
    fc.assert(
      fc.property(world, (w) => {
        const { items, policies, holds } = build(w);
        const plan = planSweep(items, policies, holds, NOW);
        const deleted = new Set(plan.toDelete.map((a) => `${a.item.kind}:${a.item.id}`));
        const goneSpectra = new Set(plan.toDelete.filter((a) => a.item.kind === "spectrum").map((a) => a.item.id));
        for (const a of plan.toDelete) {
          expect(holdOn(a.item, holds)).toBeUndefined();
          expect(a.item.busy || a.item.keptByDecision).toBe(false);
          expect(a.policy.onExpiry).toBe("delete");
          expect(a.expiredAt.getTime()).toBeLessThanOrEqual(NOW.getTime());
        }
        for (const s of items.filter((i) => i.kind === "spectrum" && !goneSpectra.has(i.id))) {
          if (s.referenceSpectrumId)
            expect(goneSpectra.has(s.referenceSpectrumId), `${s.referenceSpectrumId} is the reference of kept ${s.id}`).toBe(false);
        }
        // Dependents come before their references.
        const position = new Map(plan.toDelete.map((a, i) => [a.item.id, i]));
        for (const a of plan.toDelete)
          if (a.item.referenceSpectrumId && position.has(a.item.referenceSpectrumId))
            expect(position.get(a.item.id)!).toBeLessThan(position.get(a.item.referenceSpectrumId)!);
        expect(deleted.size).toBe(plan.toDelete.length);
      }),
      { numRuns: 2000 },
    );
  });

  it("deletes everything expired, free and under a delete policy (nothing is kept without a reason)", () => {
    fc.assert(
      fc.property(world, (w) => {
        const { items, policies, holds } = build(w);
        const plan = planSweep(items, policies, holds, NOW);
        const accounted = new Set([...plan.toDelete, ...plan.toFlag, ...plan.protectedItems].map((a) => `${a.item.kind}:${a.item.id}`));
        const goneSpectra = new Set(plan.toDelete.filter((a) => a.item.kind === "spectrum").map((a) => a.item.id));
        for (const item of items) {
          const p = policies.find((x) => x.projectId === item.projectId && x.dataClass === item.dataClass);
          if (!p || expiryOf(item, p).getTime() > NOW.getTime()) continue;
          if (p.onExpiry === "flag" && item.flagged && !holdOn(item, holds) && !item.busy && !item.keptByDecision) continue;
          if (item.kind === "analysis-run" && goneSpectra.has(item.spectrumId)) continue; // removed with its spectrum
          expect(accounted.has(`${item.kind}:${item.id}`), `${item.kind} ${item.id} expired but unaccounted`).toBe(true);
        }
        // A reference is protected only while some spectrum that stays depends on it.
        for (const pr of plan.protectedItems) {
          if (pr.protection.kind !== "reference") continue;
          const dep = pr.protection.dependentId;
          expect(goneSpectra.has(dep)).toBe(false);
          expect(items.find((i) => i.kind === "spectrum" && i.id === dep)?.referenceSpectrumId).toBe(pr.item.id);
        }
      }),
      { numRuns: 2000 },
    );
  });

  it("does not mutate its input", () => {
    fc.assert(
      fc.property(world, (w) => {
        const { items, policies, holds } = build(w);
        const before = JSON.stringify({ items, policies, holds });
        planSweep(items, policies, holds, NOW);
        expect(JSON.stringify({ items, policies, holds })).toBe(before);
      }),
      { numRuns: 300 },
    );
  });
});
