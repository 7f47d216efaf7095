import { Op, type Transaction } from "sequelize";
import { AnalysisRun, Peak, Signature, Spectrum, models } from "@/models";
import type { AnalysisReport } from "@/lib/engine";

const finiteOrNull = (n: unknown): number | null => (typeof n === "number" && Number.isFinite(n) ? n : null);
/** Significance is NOT NULL: an unbounded one (zero noise) is stored as a large finite number. */
const significanceOf = (n: unknown): number => (typeof n === "number" && !Number.isNaN(n) ? Math.max(-1e12, Math.min(1e12, n)) : 0);

/** True when a later run of the same spectrum is still waiting or in progress: it will set the spectrum's status. */
async function laterRunPending(run: AnalysisRun, transaction: Transaction): Promise<boolean> {
  const n = await AnalysisRun.count({
    where: { spectrumId: run.spectrumId, id: { [Op.ne]: run.id }, createdAt: { [Op.gt]: run.createdAt }, status: ["queued", "running"] },
    transaction,
  });
  return n > 0;
}

export type SaveInput = {
  runId: string;
  report: AnalysisReport;
  startedAt: Date;
  durationMs: number;
  engineVersion: string;
  axisUnit: string;
  valueUnit: string;
};

/**
 * Writes a finished analysis in one transaction: the run row is locked first and nothing
 * is written when it is already done, so a retried or duplicated job writes once. Peaks and
 * signatures of the run are deleted and written again inside the same transaction.
 * Returns false when the run was already done (or is gone).
 */
export async function saveAnalysis(input: SaveInput): Promise<boolean> {
  const db = models();
  return db.transaction(async (transaction) => {
    const run = await AnalysisRun.findByPk(input.runId, { lock: transaction.LOCK.UPDATE, transaction });
    if (!run || run.status === "done") return false;
    const { report } = input;
    await Signature.destroy({ where: { runId: run.id }, transaction });
    await Peak.destroy({ where: { runId: run.id }, transaction });
    const first = report.firstExciton;
    const peaks = report.peaks
      .filter((p) => Number.isFinite(p.energyEv) && Number.isFinite(p.wavelengthNm) && Number.isFinite(p.height))
      .map((p) => ({
        runId: run.id,
        energyEv: p.energyEv,
        wavelengthNm: p.wavelengthNm,
        height: p.height,
        fwhmMeV: finiteOrNull(p.fwhmMeV),
        area: finiteOrNull(p.area),
        isFirstExciton: first !== null && Math.abs(first.energyEv - p.energyEv) < 1e-9,
      }));
    if (peaks.length > 0) await Peak.bulkCreate(peaks, { transaction });
    const signatures = report.flags.map((f) => ({
      runId: run.id,
      spectrumId: run.spectrumId,
      kind: f.kind,
      energyEv: finiteOrNull(f.energyEv),
      fraction: finiteOrNull(f.fraction),
      shiftMeV: finiteOrNull(f.shiftMeV),
      significance: significanceOf(f.significance),
      details: {
        message: f.message,
        magnitude: finiteOrNull(f.magnitude),
        unit: f.unit,
        uncertainty: finiteOrNull(f.uncertainty),
        wavelengthNm: finiteOrNull(f.wavelengthNm),
        fwhmChangeMeV: finiteOrNull(f.fwhmChangeMeV),
        ...(f.intraband !== undefined ? { intraband: f.intraband } : {}),
      },
    }));
    if (signatures.length > 0) await Signature.bulkCreate(signatures, { transaction });
    await run.update(
      {
        status: "done",
        report: JSON.parse(JSON.stringify(report)),
        noise: finiteOrNull(report.noise?.sigma),
        errorMessage: null,
        engineVersion: input.engineVersion,
        startedAt: run.startedAt ?? input.startedAt,
        finishedAt: new Date(),
        durationMs: Math.max(0, Math.round(input.durationMs)),
      },
      { transaction },
    );
    if (!(await laterRunPending(run, transaction))) {
      await Spectrum.update(
        { status: "analysed", errorMessage: null, axisUnit: input.axisUnit, valueUnit: input.valueUnit },
        { where: { id: run.spectrumId }, transaction },
      );
    }
    return true;
  });
}

/**
 * Marks a run failed with a message meant for people (the engine's one-line message for
 * unreadable files). Skips a run that is already done. The spectrum is marked failed only
 * when none of its runs ever finished: a re-run refused by the engine (a normalisation
 * wavelength outside the data, say) leaves a readable file whose earlier analysis still
 * stands, and a failed spectrum would be taken for a failed upload (retention's drafts
 * class, "could not be read" on its page).
 */
export async function saveFailure(runId: string, message: string, durationMs?: number): Promise<boolean> {
  const db = models();
  const text = message.replace(/[\r\n]+/g, " ").slice(0, 1000);
  return db.transaction(async (transaction) => {
    const run = await AnalysisRun.findByPk(runId, { lock: transaction.LOCK.UPDATE, transaction });
    if (!run || run.status === "done") return false;
    await run.update(
      { status: "failed", errorMessage: text, finishedAt: new Date(), durationMs: durationMs === undefined ? null : Math.max(0, Math.round(durationMs)) },
      { transaction },
    );
    if (!(await laterRunPending(run, transaction))) {
      const analysedBefore = (await AnalysisRun.count({ where: { spectrumId: run.spectrumId, status: "done" }, transaction })) > 0;
      await Spectrum.update(
        analysedBefore ? { status: "analysed", errorMessage: null } : { status: "failed", errorMessage: text },
        { where: { id: run.spectrumId }, transaction },
      );
    }
    return true;
  });
}
