import { Op, QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "@/lib/db";
import { AnalysisRun, Spectrum } from "@/models";
import type { AnalysisReport } from "@/lib/engine";
import { applyCarry, planCarry, type CarryPlan } from "@/lib/review/carryDecisions";
import { bandWidthAt } from "@/lib/review/matchSignatures";

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

function peakRows(report: AnalysisReport) {
  const first = report.firstExciton;
  return report.peaks
    .filter((p) => Number.isFinite(p.energyEv) && Number.isFinite(p.wavelengthNm) && Number.isFinite(p.height))
    .map((p) => ({
      energy_ev: p.energyEv,
      wavelength_nm: p.wavelengthNm,
      height: p.height,
      fwhm_mev: finiteOrNull(p.fwhmMeV),
      area: finiteOrNull(p.area),
      is_first_exciton: first !== null && Math.abs(first.energyEv - p.energyEv) < 1e-9,
    }));
}

function signatureRows(report: AnalysisReport, plan: CarryPlan) {
  return report.flags.map((f, i) => ({
    id: plan.ids[i]!,
    kind: f.kind,
    energy_ev: finiteOrNull(f.energyEv),
    fraction: finiteOrNull(f.fraction),
    shift_mev: finiteOrNull(f.shiftMeV),
    magnitude: finiteOrNull(f.magnitude),
    unit: f.unit,
    uncertainty: finiteOrNull(f.uncertainty),
    significance: significanceOf(f.significance),
    review_state: plan.states[i]!,
    matched_signature_id: plan.matched[i]!,
    digested_at: plan.digestedAt[i]!,
    details: {
      message: f.message,
      magnitude: finiteOrNull(f.magnitude),
      unit: f.unit,
      uncertainty: finiteOrNull(f.uncertainty),
      wavelengthNm: finiteOrNull(f.wavelengthNm),
      fwhmChangeMeV: finiteOrNull(f.fwhmChangeMeV),
      widthMeV: bandWidthAt(report, finiteOrNull(f.energyEv)),
      ...(f.intraband !== undefined ? { intraband: f.intraband } : {}),
      ...(f.bandRole !== undefined ? { bandRole: f.bandRole } : {}),
    },
  }));
}

/*
 * The run's own rows in one statement, inside saveAnalysis's transaction. The run row is locked
 * first (FOR UPDATE) and nothing is written when it is already done: after waiting for a duplicate
 * job's lock, PostgreSQL re-checks `status <> 'done'` on the newest row version, so a retried or
 * duplicated job writes once. Peaks and signatures of the run are replaced (there are none unless
 * an earlier write of the same run was undone with its transaction; the deletes keep it exact).
 * The spectrum's status is left to a later run of the same spectrum that is still pending.
 */
const SAVE_ANALYSIS_SQL = `
WITH target AS (
  SELECT id, spectrum_id, created_at FROM analysis_runs WHERE id = $1 AND status <> 'done' FOR UPDATE
),
old_signatures AS (DELETE FROM signatures s USING target t WHERE s.run_id = t.id),
old_peaks AS (DELETE FROM peaks p USING target t WHERE p.run_id = t.id),
new_peaks AS (
  INSERT INTO peaks (run_id, energy_ev, wavelength_nm, height, fwhm_mev, area, is_first_exciton)
  SELECT t.id, p.energy_ev, p.wavelength_nm, p.height, p.fwhm_mev, p.area, p.is_first_exciton
    FROM target t,
         jsonb_to_recordset($2::jsonb) AS p(energy_ev float8, wavelength_nm float8, height float8, fwhm_mev float8, area float8, is_first_exciton boolean)
),
new_signatures AS (
  INSERT INTO signatures (id, run_id, spectrum_id, kind, energy_ev, fraction, shift_mev, magnitude, unit, uncertainty, significance, details,
                          review_state, matched_signature_id, digested_at, superseded_by_run_id, superseded_at)
  SELECT s.id, t.id, t.spectrum_id, s.kind, s.energy_ev, s.fraction, s.shift_mev, s.magnitude, s.unit, s.uncertainty, s.significance, s.details,
         s.review_state::review_state, s.matched_signature_id, s.digested_at, $11::uuid, CASE WHEN $11::uuid IS NULL THEN NULL ELSE now() END
    FROM target t,
         jsonb_to_recordset($3::jsonb) AS s(id uuid, kind text, energy_ev float8, fraction float8, shift_mev float8, magnitude float8, unit text,
                                             uncertainty float8, significance float8, details jsonb,
                                             review_state text, matched_signature_id uuid, digested_at timestamptz)
),
finished AS (
  UPDATE analysis_runs r
     SET status = 'done', report = $4::jsonb, noise = $5, error_message = NULL, engine_version = $6,
         started_at = COALESCE(r.started_at, $7), finished_at = now(), duration_ms = $8, updated_at = now()
    FROM target t
   WHERE r.id = t.id
  RETURNING r.id
),
spectrum AS (
  UPDATE spectra sp
     SET status = 'analysed', error_message = NULL, axis_unit = $9, value_unit = $10, updated_at = now()
    FROM target t
   WHERE sp.id = t.spectrum_id
     AND NOT EXISTS (
       SELECT 1 FROM analysis_runs later
        WHERE later.spectrum_id = t.spectrum_id AND later.id <> t.id AND later.created_at > t.created_at
          AND later.status IN ('queued', 'running'))
)
SELECT count(*)::int AS wrote FROM finished`;

/**
 * Writes a finished analysis atomically and idempotently, in one transaction: the run is locked,
 * the signatures it replaces are matched with its flags (lib/review/carryDecisions.ts), then the
 * run's rows (SAVE_ANALYSIS_SQL), the replaced signatures' marks and the carried history rows are
 * written. Returns false when the run was already done (or is gone).
 */
export async function saveAnalysis(input: SaveInput): Promise<boolean> {
  const { report } = input;
  return sequelize().transaction(async (transaction) => {
    const [run] = await sequelize().query<{ id: string; spectrum_id: string; created_at: Date }>(
      `SELECT id, spectrum_id, created_at FROM analysis_runs WHERE id = :id AND status <> 'done' FOR UPDATE`,
      { replacements: { id: input.runId }, type: QueryTypes.SELECT, transaction },
    );
    if (!run) return false;
    const target = { id: run.id, spectrumId: run.spectrum_id, createdAt: new Date(run.created_at) };
    const plan = await planCarry(transaction, target, report);
    const rows = await sequelize().query<{ wrote: number }>(SAVE_ANALYSIS_SQL, {
      bind: [
        input.runId,
        JSON.stringify(peakRows(report)),
        JSON.stringify(signatureRows(report, plan)),
        JSON.stringify(report),
        finiteOrNull(report.noise?.sigma),
        input.engineVersion,
        input.startedAt,
        Math.max(0, Math.round(input.durationMs)),
        input.axisUnit,
        input.valueUnit,
        plan.supersededByRunId,
      ],
      type: QueryTypes.SELECT,
      transaction,
    });
    if ((rows[0]?.wrote ?? 0) === 0) return false;
    await applyCarry(transaction, target, plan);
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
  const db = sequelize();
  const text = message.replace(/[\r\n]+/g, " ").slice(0, 1000);
  return db.transaction(async (transaction) => {
    const run = await AnalysisRun.findByPk(runId, { lock: transaction.LOCK.UPDATE, transaction });
    if (!run || run.status === "done") return false;
    await run.update(
      {
        status: "failed",
        errorMessage: text,
        finishedAt: new Date(),
        durationMs: durationMs === undefined ? null : Math.max(0, Math.round(durationMs)),
      },
      { transaction },
    );
    if (!(await laterRunPending(run, transaction))) {
      const analysedBefore = (await AnalysisRun.count({ where: { spectrumId: run.spectrumId, status: "done" }, transaction })) > 0;
      await Spectrum.update(analysedBefore ? { status: "analysed", errorMessage: null } : { status: "failed", errorMessage: text }, {
        where: { id: run.spectrumId },
        transaction,
      });
    }
    return true;
  });
}
