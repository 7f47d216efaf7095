import { Op } from "sequelize";
import { AnalysisRun, Project, Spectrum } from "@/models";
import type { Actor } from "@/lib/auth/actor";
import { canReadSpectrum, canWrite } from "@/lib/auth/access";
import { recordAudit } from "@/lib/audit";
import { ENGINE_VERSION } from "@/lib/engine/version";
import { enqueueRun } from "./enqueueRun";
import { storedReadOptions } from "./insertUpload";
import { mergeParameters, parameterHash, reanalysisSchema, type AnalysisParameters, type ReanalysisInput } from "./parameters";
import { Refusal } from "@/lib/errors";
import { sequelize } from "@/lib/db";

export type ReanalysisResult = { runId: string; status: AnalysisRun["status"]; created: boolean; queued: boolean };

/**
 * Asks for another analysis of a stored spectrum with changed parameters (or a changed
 * reference, or the current engine). Earlier runs stay as they are, for provenance. When
 * a run with the same engine version, parameters and reference exists, it is reused: a
 * finished one is returned as is, a failed one is queued again.
 */
export async function requestReanalysis(
  spectrumId: string,
  changes: ReanalysisInput | unknown,
  actor: Actor,
  /** Set by the server only (a re-upload that changed the stored technique), never by a request body. */
  overrides: Pick<AnalysisParameters, "technique"> | null = null,
): Promise<ReanalysisResult> {
  const parsed = reanalysisSchema.safeParse(changes ?? {});
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const field = issue?.path.map(String).join(".") || undefined;
    throw new Refusal(400, "invalid", `${field ? `${field}: ` : ""}${issue?.message ?? "invalid parameters"}`, field);
  }
  const db = sequelize();
  const spectrum = await Spectrum.findByPk(spectrumId);
  if (!spectrum || !(await canReadSpectrum(actor, spectrum))) throw new Refusal(404, "not-found", `spectrum ${spectrumId} was not found`);
  const project = await Project.findByPk(spectrum.projectId, { attributes: ["id", "groupId"] });
  if (!project || !canWrite(actor, project.groupId)) throw new Refusal(403, "forbidden", "you may not re-run analyses in this project");

  // Changes apply to the latest run that did not fail (a refused normalisation wavelength is not
  // carried on), or to the latest of all when every run failed (an unreadable upload's settings).
  const newestFirst: [string, string][] = [["createdAt", "DESC"]];
  const latest =
    (await AnalysisRun.findOne({ where: { spectrumId, status: { [Op.ne]: "failed" } }, order: newestFirst })) ??
    (await AnalysisRun.findOne({ where: { spectrumId }, order: newestFirst }));
  const base: AnalysisParameters = (latest?.parameters as AnalysisParameters | undefined) ?? { technique: spectrum.technique };
  const parameters = mergeParameters(overrides ? { ...base, ...overrides } : base, parsed.data);
  let referenceSpectrumId = latest ? latest.referenceSpectrumId : spectrum.referenceSpectrumId;
  if (parsed.data.referenceSpectrumId !== undefined) referenceSpectrumId = parsed.data.referenceSpectrumId;
  if (referenceSpectrumId) {
    if (referenceSpectrumId === spectrum.id) {
      throw new Refusal(400, "invalid", "referenceSpectrumId: a spectrum cannot be its own reference", "referenceSpectrumId");
    }
    const ref = await Spectrum.findByPk(referenceSpectrumId, { attributes: ["id", "projectId"] });
    const refProject = ref ? await Project.findByPk(ref.projectId, { attributes: ["groupId"] }) : null;
    if (!ref || refProject?.groupId !== project.groupId) {
      throw new Refusal(
        400,
        "invalid",
        `referenceSpectrumId: spectrum ${referenceSpectrumId} was not found in this group`,
        "referenceSpectrumId",
      );
    }
  }
  if (parameters.normalization && !referenceSpectrumId) {
    throw new Refusal(400, "invalid", "normalization: needs a parent reference spectrum, and the run would have none", "normalization");
  }
  const hash = parameterHash(parameters, referenceSpectrumId);
  // The spectrum is read the way its newest run reads it, so references, viewer and exports agree.
  const readUpdate = {
    columnChoice: parameters.column === undefined ? null : String(parameters.column),
    readOptions: storedReadOptions(parameters),
  };

  const { run, created, requeue } = await db.transaction(async (transaction) => {
    const existing = await AnalysisRun.findOne({
      where: { spectrumId, engineVersion: ENGINE_VERSION, parameterHash: hash },
      lock: transaction.LOCK.UPDATE,
      transaction,
    });
    if (existing) {
      if (existing.status === "failed") {
        await existing.update(
          { status: "queued", errorMessage: null, startedAt: null, finishedAt: null, durationMs: null },
          { transaction },
        );
        await spectrum.update({ status: "queued", errorMessage: null, ...readUpdate }, { transaction });
        return { run: existing, created: false, requeue: true };
      }
      return { run: existing, created: false, requeue: existing.status !== "done" };
    }
    const r = await AnalysisRun.create(
      {
        spectrumId,
        referenceSpectrumId,
        engineVersion: ENGINE_VERSION,
        parameterHash: hash,
        parameters,
        status: "queued",
        errorMessage: null,
        noise: null,
        report: null,
        requestedBy: actor.id,
        startedAt: null,
        finishedAt: null,
        durationMs: null,
      },
      { transaction },
    );
    await spectrum.update({ status: "queued", errorMessage: null, ...readUpdate }, { transaction });
    await recordAudit(
      {
        actorId: actor.id,
        actorLabel: actor.email,
        groupId: project.groupId,
        action: "analysis.request",
        targetType: "spectrum",
        targetId: spectrumId,
        details: { runId: r.id, parameters, referenceSpectrumId },
      },
      transaction,
    );
    return { run: r, created: true, requeue: true };
  });

  let queued = false;
  if (requeue) {
    try {
      await enqueueRun(spectrumId, run.id, { replaceFinished: true });
      queued = true;
    } catch {
      queued = false; // the worker's sweep queues it once the queue is back
    }
  }
  return { runId: run.id, status: run.status, created, queued };
}
