import { randomUUID } from "node:crypto";
import { QueryTypes, type Transaction } from "sequelize";
import { recordAudit } from "@/lib/audit";
import { sequelize } from "@/lib/db";
import type { AnalysisReport, FlagKind } from "@/lib/engine";
import type { ReviewState } from "@/models/Signature";
import { bandWidthAt, matchSignatures, type PreviousSignature, type WidthSource } from "./matchSignatures";

/** What a finished run writes besides its own rows so that decisions follow the bands. */
export type CarryPlan = {
  /** Ids, review states, matches and digest marks of the new run's signatures, in report order. */
  ids: string[];
  states: ReviewState[];
  matched: (string | null)[];
  digestedAt: (string | null)[];
  /** A newer run of the spectrum already finished: this run's signatures are born superseded by it. */
  supersededByRunId: string | null;
  /** Signatures of the run before, now replaced. */
  previousIds: string[];
  reviews: {
    signature_id: string;
    decision: ReviewState;
    origin: "carried" | "not-carried";
    previous_state: ReviewState;
    carried_from_signature_id: string;
    carried_from_run_id: string;
    comment: string;
  }[];
};

type PreviousRow = {
  id: string;
  run_id: string;
  kind: FlagKind;
  energy_ev: number | null;
  review_state: ReviewState;
  digested_at: Date | null;
  details: Record<string, unknown> | null;
  step_mev: number | null;
  width_source: WidthSource | null;
};

const num = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);
export const shortRunId = (id: string) => id.slice(0, 8);

/**
 * Reads (and locks) the signatures the new run replaces and matches them with the run's flags
 * (lib/review/matchSignatures.ts): a matched signature's decision carries when the rule allows,
 * is held back with its reason otherwise, and a new band awaits review. Must run in the save's
 * transaction, after the run row is locked.
 */
export async function planCarry(
  transaction: Transaction,
  run: { id: string; spectrumId: string; createdAt: Date },
  report: Pick<AnalysisReport, "flags" | "peaks" | "referenceFirstExciton" | "parameters">,
): Promise<CarryPlan> {
  const db = sequelize();
  const ids = report.flags.map(() => randomUUID());
  const fresh: CarryPlan = {
    ids,
    states: report.flags.map(() => "awaiting"),
    matched: report.flags.map(() => null),
    digestedAt: report.flags.map(() => null),
    supersededByRunId: null,
    previousIds: [],
    reviews: [],
  };
  const [newer] = await db.query<{ id: string }>(
    `SELECT id FROM analysis_runs WHERE spectrum_id = :spectrumId AND id <> :runId AND status = 'done' AND created_at > :createdAt
     ORDER BY created_at DESC LIMIT 1`,
    { replacements: { spectrumId: run.spectrumId, runId: run.id, createdAt: run.createdAt }, type: QueryTypes.SELECT, transaction },
  );
  // A run that finishes after a newer one of the same spectrum never becomes the current one.
  if (newer) return { ...fresh, supersededByRunId: newer.id };
  const previousRows = await db.query<PreviousRow>(
    `SELECT g.id, g.run_id, g.kind, g.energy_ev, g.review_state, g.digested_at, g.details,
            (r.report #>> '{parameters,grid,stepMeV}')::float8 AS step_mev,
            jsonb_build_object('peaks', r.report->'peaks', 'referenceFirstExciton', r.report->'referenceFirstExciton') AS width_source
       FROM signatures g JOIN analysis_runs r ON r.id = g.run_id
      WHERE g.spectrum_id = :spectrumId AND g.superseded_at IS NULL AND g.run_id <> :runId
      ORDER BY g.id FOR UPDATE OF g`,
    { replacements: { spectrumId: run.spectrumId, runId: run.id }, type: QueryTypes.SELECT, transaction },
  );
  if (previousRows.length === 0) return fresh;
  const previous: (PreviousSignature & { runId: string; digestedAt: Date | null })[] = previousRows.map((r) => ({
    id: r.id,
    runId: r.run_id,
    kind: r.kind,
    energyEv: r.energy_ev,
    reviewState: r.review_state,
    digestedAt: r.digested_at,
    magnitude: num(r.details?.magnitude),
    uncertainty: num(r.details?.uncertainty),
    widthMeV: num(r.details?.widthMeV) ?? bandWidthAt(r.width_source, r.energy_ev),
  }));
  const next = report.flags.map((f) => ({
    kind: f.kind,
    energyEv: num(f.energyEv),
    magnitude: num(f.magnitude),
    uncertainty: num(f.uncertainty),
    widthMeV: bandWidthAt(report, num(f.energyEv)),
  }));
  const previousStep = Math.max(0, ...previousRows.map((r) => num(r.step_mev) ?? 0));
  const outcomes = matchSignatures(previous, next, {
    previous: { stepMeV: previousStep || null },
    next: { stepMeV: num(report.parameters?.grid?.stepMeV) },
  });
  const plan: CarryPlan = { ...fresh, previousIds: previous.map((p) => p.id) };
  outcomes.forEach((o, i) => {
    if (o.match === null) return;
    const match = previous.find((p) => p.id === o.match!.id)!;
    plan.matched[i] = match.id;
    const run8 = shortRunId(match.runId);
    if (o.carries) {
      plan.digestedAt[i] = match.digestedAt ? match.digestedAt.toISOString() : null;
      if (match.reviewState === "awaiting") return;
      plan.states[i] = match.reviewState;
      plan.reviews.push({
        signature_id: ids[i]!,
        decision: match.reviewState,
        origin: "carried",
        previous_state: "awaiting",
        carried_from_signature_id: match.id,
        carried_from_run_id: match.runId,
        comment: `Carried from run ${run8}.`,
      });
    } else if (match.reviewState !== "awaiting") {
      plan.reviews.push({
        signature_id: ids[i]!,
        decision: "awaiting",
        origin: "not-carried",
        previous_state: match.reviewState,
        carried_from_signature_id: match.id,
        carried_from_run_id: match.runId,
        comment: `The ${match.reviewState} decision on run ${run8} was not carried: ${o.reason}. Decide again.`,
      });
    }
  });
  return plan;
}

/** Writes the plan's other half after the run's rows: replaced signatures marked, carried history rows added, one audit event. */
export async function applyCarry(transaction: Transaction, run: { id: string; spectrumId: string }, plan: CarryPlan): Promise<void> {
  const db = sequelize();
  if (plan.previousIds.length > 0) {
    await db.query(`UPDATE signatures SET superseded_by_run_id = :runId, superseded_at = now(), updated_at = now() WHERE id IN (:ids)`, {
      replacements: { runId: run.id, ids: plan.previousIds },
      transaction,
    });
  }
  if (plan.reviews.length > 0) {
    await db.query(
      `INSERT INTO reviews (signature_id, reviewer_id, decision, comment, origin, previous_state, carried_from_signature_id, carried_from_run_id)
       SELECT r.signature_id, NULL, r.decision::review_state, r.comment, r.origin::review_origin, r.previous_state::review_state,
              r.carried_from_signature_id, r.carried_from_run_id
         FROM jsonb_to_recordset(CAST(:rows AS jsonb)) AS r(signature_id uuid, decision text, comment text, origin text, previous_state text,
                                                     carried_from_signature_id uuid, carried_from_run_id uuid)`,
      { replacements: { rows: JSON.stringify(plan.reviews) }, transaction },
    );
  }
  if (plan.previousIds.length > 0 || plan.reviews.length > 0) {
    const [owner] = await db.query<{ group_id: string }>(
      `SELECT p.group_id FROM spectra s JOIN projects p ON p.id = s.project_id WHERE s.id = :id`,
      { replacements: { id: run.spectrumId }, type: QueryTypes.SELECT, transaction },
    );
    await recordAudit(
      {
        actorId: null,
        actorLabel: "analysis",
        groupId: owner?.group_id ?? null,
        action: "signatures-superseded",
        targetType: "spectrum",
        targetId: run.spectrumId,
        details: {
          runId: run.id,
          superseded: plan.previousIds.length,
          matched: plan.matched.filter(Boolean).length,
          carried: plan.reviews.filter((r) => r.origin === "carried").length,
          notCarried: plan.reviews.filter((r) => r.origin === "not-carried").length,
        },
      },
      transaction,
    );
  }
}
