// Stored spectra and analyses for the stewardship tests, written straight to the
// database and the storage fake (no analysis is queued, so nothing is "busy").
import { createHash, randomUUID } from "node:crypto";
import { AnalysisRun, LegalHold, Spectrum } from "@/models";
import { newRawObjectKey, putObject } from "@/lib/storage";
import { objectExists } from "@/lib/stewardship/deletion";
import { selectRows, sequelize } from "@/lib/db";
import type { Lab } from "../helpers/fixtures";
import { syntheticAbsorptionCsv } from "../helpers/spectra";

export async function storedSpectrum(
  lab: Lab,
  o: {
    ageDays?: number;
    failed?: boolean;
    ref?: string | null;
    seriesId?: string | null;
    sampleId?: string | null;
    seriesValue?: number;
  } = {},
): Promise<Spectrum> {
  const bytes = new TextEncoder().encode(`${syntheticAbsorptionCsv({ points: 200 })}# ${randomUUID()}\n`);
  const sha256 = createHash("sha256").update(bytes).digest("hex");
  const key = newRawObjectKey();
  await putObject(key, bytes, "text/csv", sha256);
  const s = await Spectrum.create({
    projectId: lab.project.id,
    sampleId: o.sampleId ?? null,
    seriesId: o.seriesId ?? null,
    seriesValue: o.seriesValue ?? null,
    referenceSpectrumId: o.ref ?? null,
    technique: "absorption",
    fileName: `abs-${randomUUID().slice(0, 6)}.csv`,
    objectKey: key,
    sha256,
    sizeBytes: bytes.length,
    contentType: "text/csv",
    columnChoice: null,
    axisUnit: "nm",
    valueUnit: "absorbance",
    pathLengthCm: 1,
    excitationNm: null,
    slitNm: null,
    integrationMs: null,
    material: "CdSe",
    status: o.failed ? "failed" : "analysed",
    errorMessage: o.failed ? "test: unreadable" : null,
    uploadedBy: lab.user.id,
  });
  if (o.ageDays)
    await sequelize().query("UPDATE spectra SET created_at = now() - make_interval(days => :d) WHERE id = :id", {
      replacements: { d: o.ageDays, id: s.id },
    });
  return s;
}

/** A legal hold in force on a project, series, sample or spectrum of the lab's group. */
export function placedHold(
  lab: Lab,
  targetType: "project" | "series" | "sample" | "spectrum",
  targetId: string,
  reason: string,
  placedBy: string | null = lab.user.id,
): Promise<LegalHold> {
  return LegalHold.create({ groupId: lab.group.id, targetType, targetId, reason, placedBy, liftedAt: null, liftedBy: null });
}

export async function storedRun(spectrum: Spectrum, ageDays = 0): Promise<AnalysisRun> {
  const run = await AnalysisRun.create({
    spectrumId: spectrum.id,
    referenceSpectrumId: null,
    engineVersion: "test",
    parameterHash: createHash("sha256").update(randomUUID()).digest("hex"),
    parameters: {},
    status: "done",
    errorMessage: null,
    noise: 0.001,
    report: { peaks: [], note: "test run" },
    requestedBy: null,
    startedAt: new Date(),
    finishedAt: new Date(),
    durationMs: 5,
  });
  if (ageDays)
    await sequelize().query("UPDATE analysis_runs SET created_at = now() - make_interval(days => :d) WHERE id = :id", {
      replacements: { d: ageDays, id: run.id },
    });
  return run;
}

/** Every spectrum row of the projects has its object, and every finished tombstone's object is gone unless a live spectrum still reads it (a file's traces share one object). */
export async function consistency(
  projectIds: string[],
): Promise<{ rowsWithoutObject: string[]; objectsWithoutRow: string[]; pending: number }> {
  const rows = await selectRows<{ id: string; object_key: string }>(
    "SELECT id, object_key FROM spectra WHERE project_id IN (:projectIds)",
    { projectIds },
  );
  const rowsWithoutObject: string[] = [];
  for (const r of rows) if (!(await objectExists(r.object_key))) rowsWithoutObject.push(r.id);
  const tombs = await selectRows<{ target_id: string; object_key: string; state: string }>(
    "SELECT target_id, object_key, state FROM tombstones WHERE project_id IN (:projectIds) AND target_type = 'spectrum'",
    { projectIds },
  );
  const objectsWithoutRow: string[] = [];
  const live = new Set(rows.map((r) => r.id));
  const liveObjects = new Set(rows.map((r) => r.object_key));
  for (const t of tombs)
    if (t.state === "done" && !live.has(t.target_id) && !liveObjects.has(t.object_key) && (await objectExists(t.object_key)))
      objectsWithoutRow.push(t.target_id);
  return { rowsWithoutObject, objectsWithoutRow, pending: tombs.filter((t) => t.state === "pending").length };
}
