import fc from "fast-check";
import { afterAll, describe, expect, it } from "vitest";
import { closeDb, selectRows } from "@/lib/db";
import { deleteSpectrum } from "@/lib/stewardship/deletion";
import { buildBundle } from "@/lib/stewardship/exportBundle";
import { previewPolicy, storageOverview } from "@/lib/stewardship/queries";
import { runSweep } from "@/lib/stewardship/sweep";
import { RetentionFlag, RetentionPolicy, Spectrum, Tombstone } from "@/models";
import { createLab, createSample, createSeries, type Lab } from "../helpers/fixtures";
import { consistency, placedHold, storedRun, storedSpectrum } from "./stewardship-fixtures";
import { Refusal } from "@/lib/errors";

// The retention sweep against the real PostgreSQL and storage fake, on projects made
// here (every sweep is scoped to them, so the demo scenario is never touched). The expected
// values are the fixtures' own (their ages, sizes, holds and policies); no outside source is
// involved in bookkeeping of this kind.

afterAll(closeDb);

const exists = async (id: string) => (await Spectrum.count({ where: { id } })) === 1;

describe("retention sweep on the real database and storage", () => {
  it("the storage overview sums use and what the policy frees now, within 30 days and within a year, net of holds and references", async () => {
    const lab = await createLab("steward");
    const sample = await createSample(lab);
    const now = Date.now();
    const ref = await storedSpectrum(lab, { ageDays: 100 });
    await storedSpectrum(lab, { ageDays: 5, ref: ref.id }); // keeps its reference for now; itself frees within a year
    const old = await storedSpectrum(lab, { ageDays: 100 });
    const held = await storedSpectrum(lab, { ageDays: 100, sampleId: sample.id });
    const soon = await storedSpectrum(lab, { ageDays: 75 }); // 90-day policy: expires in 15 days
    const failed = await storedSpectrum(lab, { ageDays: 100, failed: true }); // drafts: no policy
    await RetentionPolicy.create({ projectId: lab.project.id, dataClass: "raw", keepDays: 90, onExpiry: "delete", createdBy: lab.user.id });
    await placedHold(lab, "sample", sample.id, "audit");
    const raw = await Spectrum.findAll({ where: { projectId: lab.project.id, status: "analysed" } });
    const size = (x: Spectrum) => Number(x.sizeBytes);
    const rows = (await storageOverview(lab.actor)).filter((r) => r.projectId === lab.project.id);
    const rawRow = rows.find((r) => r.dataClass === "raw")!;
    expect(rawRow.items).toBe(raw.length);
    expect(rawRow.bytes).toBe(raw.reduce((t, x) => t + size(x), 0));
    expect(rawRow.policy).toBe("delete after 90 days");
    // now: only the free old one (the reference has a young dependent, the held one a hold)
    expect(rawRow.freeNow).toBe(size(old));
    expect(rawRow.free30).toBe(size(old) + size(soon));
    // within a year the dependent expires too, and its reference may go with it; the held one never
    expect(rawRow.free365).toBe(raw.filter((x) => x.id !== held.id).reduce((t, x) => t + size(x), 0));
    // the next expiry still ahead: the 75-day-old one, 15 days from now (to the minute)
    expect(Math.abs(Date.parse(rawRow.nextExpiry!) - (now + 15 * 86_400_000))).toBeLessThan(60_000);
    const drafts = rows.find((r) => r.dataClass === "drafts")!;
    expect([drafts.items, drafts.bytes, drafts.policy, drafts.freeNow]).toEqual([1, size(failed), null, 0]);
  });

  it("deletes expired free spectra with tombstone and audit; keeps held, referenced and unexpired ones", async () => {
    const lab = await createLab("steward");
    const sample = await createSample(lab);
    const series = await createSeries(lab);
    const ref = await storedSpectrum(lab, { ageDays: 100 });
    const dependent = await storedSpectrum(lab, { ageDays: 5, ref: ref.id });
    const old = await storedSpectrum(lab, { ageDays: 100 });
    const heldBySample = await storedSpectrum(lab, { ageDays: 100, sampleId: sample.id });
    const heldBySeries = await storedSpectrum(lab, { ageDays: 100, seriesId: series.id });
    const young = await storedSpectrum(lab, { ageDays: 10 });
    const run = await storedRun(old, 100);
    await RetentionPolicy.create({ projectId: lab.project.id, dataClass: "raw", keepDays: 30, onExpiry: "delete", createdBy: lab.user.id });
    await placedHold(lab, "sample", sample.id, "journal inquiry");
    await placedHold(lab, "series", series.id, "patent");

    const preview = await previewPolicy({ projectId: lab.project.id, dataClass: "raw", keepDays: 30, onExpiry: "delete" });
    expect(preview.toDelete.map((r) => r.id)).toEqual([old.id]);
    expect(preview.protectedItems.map((r) => r.id).sort()).toEqual([ref.id, heldBySample.id, heldBySeries.id].sort());
    expect(preview.protectedItems.find((r) => r.id === heldBySample.id)?.why).toContain("journal inquiry");

    const summary = await runSweep({ projectIds: [lab.project.id] });
    expect(summary.deleted).toBe(1);
    expect(await exists(old.id)).toBe(false);
    for (const s of [ref, dependent, heldBySample, heldBySeries, young]) expect(await exists(s.id), s.fileName).toBe(true);
    const tomb = await Tombstone.findOne({ where: { targetId: old.id } });
    expect(tomb).toMatchObject({ state: "done", sha256: old.sha256, cause: "policy", label: old.fileName, dataClass: "raw" });
    expect(tomb!.policyId).not.toBeNull();
    const runLeft = await selectRows("SELECT id FROM analysis_runs WHERE id = :id", { id: run.id });
    expect(runLeft).toHaveLength(0); // its analyses went with it
    const events = await selectRows<{ action: string; details: { sha256: string } }>(
      "SELECT action, details FROM audit_events WHERE target_id = :id",
      { id: old.id },
    );
    expect(events.map((e) => e.action)).toEqual(["deleted"]);
    expect(events[0]!.details.sha256).toBe(old.sha256);
    expect(await consistency([lab.project.id])).toEqual({ rowsWithoutObject: [], objectsWithoutRow: [], pending: 0 });

    // A second sweep finds nothing more to do.
    expect((await runSweep({ projectIds: [lab.project.id] })).deleted).toBe(0);
  });

  it("flags under a flag policy once, and the steward's keep sticks", async () => {
    const lab = await createLab("steward");
    const draft = await storedSpectrum(lab, { ageDays: 20, failed: true });
    await RetentionPolicy.create({ projectId: lab.project.id, dataClass: "drafts", keepDays: 7, onExpiry: "flag", createdBy: lab.user.id });
    expect((await runSweep({ projectIds: [lab.project.id] })).flagged).toBe(1);
    expect((await runSweep({ projectIds: [lab.project.id] })).flagged).toBe(0);
    const flag = await RetentionFlag.findOne({ where: { targetId: draft.id } });
    await flag!.update({ decision: "keep", decidedBy: lab.user.id, decidedAt: new Date() });
    await RetentionPolicy.update({ onExpiry: "delete" }, { where: { projectId: lab.project.id } });
    expect((await runSweep({ projectIds: [lab.project.id] })).deleted).toBe(0);
    expect(await exists(draft.id)).toBe(true);
  });

  it("deletes processed analyses on their own policy and keeps the spectrum", async () => {
    const lab = await createLab("steward");
    const s = await storedSpectrum(lab, { ageDays: 400 });
    const oldRun = await storedRun(s, 200);
    const newRun = await storedRun(s, 1);
    await RetentionPolicy.create({
      projectId: lab.project.id,
      dataClass: "processed",
      keepDays: 90,
      onExpiry: "delete",
      createdBy: lab.user.id,
    });
    await runSweep({ projectIds: [lab.project.id] });
    const left = await selectRows<{ id: string }>("SELECT id FROM analysis_runs WHERE spectrum_id = :id", { id: s.id });
    expect(left.map((r) => r.id)).toEqual([newRun.id]);
    expect(await Tombstone.findOne({ where: { targetId: oldRun.id } })).toMatchObject({
      state: "done",
      targetType: "analysis-run",
      dataClass: "processed",
    });
    expect(await exists(s.id)).toBe(true);
  });

  it("a supernatant spectrum belongs to its point's series: a hold on the series keeps it, and the series bundle carries it", async () => {
    const lab = await createLab("steward");
    const series = await createSeries(lab);
    const point = await storedSpectrum(lab, { ageDays: 100, seriesId: series.id, seriesValue: 1 });
    const supernatant = await storedSpectrum(lab, { ageDays: 100 });
    await supernatant.update({ supernatantOfSpectrumId: point.id });
    const free = await storedSpectrum(lab, { ageDays: 100 });
    await RetentionPolicy.create({ projectId: lab.project.id, dataClass: "raw", keepDays: 30, onExpiry: "delete", createdBy: lab.user.id });
    await placedHold(lab, "series", series.id, "titration under review");

    const preview = await previewPolicy({ projectId: lab.project.id, dataClass: "raw", keepDays: 30, onExpiry: "delete" });
    expect(preview.toDelete.map((r) => r.id)).toEqual([free.id]);
    expect(preview.protectedItems.find((r) => r.id === supernatant.id)?.why).toContain("titration under review");
    await expect(deleteSpectrum(supernatant.id, { cause: "owner", actorId: lab.user.id, actorLabel: lab.user.email })).rejects.toThrow(
      /titration under review/,
    );
    await runSweep({ projectIds: [lab.project.id] });
    expect(await exists(supernatant.id)).toBe(true);
    expect(await exists(free.id)).toBe(false);

    const bundle = await buildBundle({ type: "series", id: series.id }, lab.user.id);
    const listed = bundle.manifest.spectra.find((x) => x.id === supernatant.id);
    expect(listed?.supernatantOfSpectrumId).toBe(point.id);
    expect(listed?.sha256).toBe(supernatant.sha256);
  });

  it("refuses a person's delete under hold, with the reason", async () => {
    const lab = await createLab("spectroscopist");
    const s = await storedSpectrum(lab);
    await placedHold(lab, "project", lab.project.id, "audit by the funder", null);
    const attempt = deleteSpectrum(s.id, { cause: "owner", actorId: lab.user.id, actorLabel: lab.user.email });
    await expect(attempt).rejects.toBeInstanceOf(Refusal);
    await expect(deleteSpectrum(s.id, { cause: "owner", actorId: lab.user.id, actorLabel: lab.user.email })).rejects.toThrow(
      /audit by the funder/,
    );
    expect(await exists(s.id)).toBe(true);
  });

  it("property: random policies, holds and dependencies — nothing held or depended on goes, everything expired and free does", async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.record({
          spectra: fc.array(
            fc.record({
              age: fc.integer({ min: 0, max: 90 }),
              failed: fc.boolean(),
              refTo: fc.option(fc.nat(), { nil: null }),
              inSeries: fc.boolean(),
              withSample: fc.boolean(),
            }),
            { minLength: 1, maxLength: 6 },
          ),
          rawDays: fc.option(fc.integer({ min: 1, max: 60 }), { nil: null }),
          draftDays: fc.option(fc.integer({ min: 1, max: 60 }), { nil: null }),
          hold: fc.constantFrom("none", "series", "sample", "first-spectrum"),
        }),
        async (w) => {
          const lab: Lab = await createLab("steward");
          const series = await createSeries(lab);
          const sample = await createSample(lab);
          const made: { s: Spectrum; age: number; failed: boolean }[] = [];
          for (const [i, x] of w.spectra.entries()) {
            const ref = x.refTo !== null && i > 0 ? made[x.refTo % i]!.s.id : null;
            made.push({
              s: await storedSpectrum(lab, {
                ageDays: x.age,
                failed: x.failed,
                ref,
                seriesId: x.inSeries ? series.id : null,
                sampleId: x.withSample ? sample.id : null,
              }),
              age: x.age,
              failed: x.failed,
            });
          }
          if (w.rawDays)
            await RetentionPolicy.create({
              projectId: lab.project.id,
              dataClass: "raw",
              keepDays: w.rawDays,
              onExpiry: "delete",
              createdBy: null,
            });
          if (w.draftDays)
            await RetentionPolicy.create({
              projectId: lab.project.id,
              dataClass: "drafts",
              keepDays: w.draftDays,
              onExpiry: "delete",
              createdBy: null,
            });
          const holdTarget =
            w.hold === "series" ? series.id : w.hold === "sample" ? sample.id : w.hold === "first-spectrum" ? made[0]!.s.id : null;
          if (holdTarget)
            await placedHold(
              lab,
              w.hold === "first-spectrum" ? "spectrum" : (w.hold as "series" | "sample"),
              holdTarget,
              "property test",
              null,
            );
          await runSweep({ projectIds: [lab.project.id] });

          const kept = new Set<string>();
          for (const m of made) if (await exists(m.s.id)) kept.add(m.s.id);
          for (const m of made) {
            const s = m.s;
            const held =
              (w.hold === "series" && s.seriesId) ||
              (w.hold === "sample" && s.sampleId) ||
              (w.hold === "first-spectrum" && s.id === made[0]!.s.id);
            const days = m.failed ? w.draftDays : w.rawDays;
            const expired = days !== null && m.age >= days + 1; // ages are whole days back from now; a day of slack for the clock
            if (held) expect(kept.has(s.id), "held spectrum deleted").toBe(true);
            if (!expired && (days === null || m.age < days)) expect(kept.has(s.id), "unexpired spectrum deleted").toBe(true);
            // Nothing kept depends on something deleted.
            if (kept.has(s.id) && s.referenceSpectrumId)
              expect(kept.has(s.referenceSpectrumId), "reference of a kept spectrum deleted").toBe(true);
            // Expired, not held, and nothing kept depends on it: gone.
            const dependedOn = made.some((d) => d.s.referenceSpectrumId === s.id && kept.has(d.s.id));
            if (expired && !held && !dependedOn) expect(kept.has(s.id), "expired free spectrum kept").toBe(false);
          }
          expect(await consistency([lab.project.id])).toEqual({ rowsWithoutObject: [], objectsWithoutRow: [], pending: 0 });
        },
      ),
      { numRuns: 15 },
    );
  }, 180_000);
});
