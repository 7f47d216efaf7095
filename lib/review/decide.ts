import { Op } from "sequelize";
import type { FlagKind } from "@/lib/registry/flagKinds";
import type { Actor } from "@/lib/auth/actor";
import { canReview, roleIn } from "@/lib/auth/access";
import { recordAudit } from "@/lib/audit";
import { selectRows } from "@/lib/db";
import { Review, Signature, models } from "@/models";
import { ReviewRefused } from "./errors";
import { notifyUploaders, type DecidedSignature } from "./notifyUploaders";
import type { Decision } from "./schemas";

export type DecisionOutcome = {
  signatureId: string;
  reviewId: string;
  decision: Decision;
  previousState: string;
  decidedAt: string;
};

type Target = {
  id: string; kind: FlagKind; review_state: string; group_id: string; spectrum_id: string; file_name: string;
  energy_ev: number | null; uploaded_by: string | null;
};

/**
 * Records a lead's decision on one or more signatures: one Review row each (who, when, decision,
 * comment), the signature's reviewState updated, an audit event, all in one transaction; then
 * the uploaders who want it hear of the decisions by e-mail. A decision on a decided signature
 * is a revision: the earlier rows stay as its history.
 *
 * Refusals: a signature of a group the actor is not a member of is "not found" (ids leak
 * nothing); a member who is not the group's lead is refused (403).
 */
export async function decideSignatures(
  actor: Actor,
  signatureIds: string[],
  decision: Decision,
  comment: string,
): Promise<{ outcomes: DecisionOutcome[]; mailed: number }> {
  const db = models();
  const ids = [...new Set(signatureIds)];
  if (ids.length === 0) throw new ReviewRefused(400, "choose at least one signature", "signatureIds");
  const targets = await selectRows<Target>(
    `SELECT g.id, g.kind, g.review_state, p.group_id, s.id AS spectrum_id, s.file_name, g.energy_ev, s.uploaded_by
     FROM signatures g JOIN spectra s ON s.id = g.spectrum_id JOIN projects p ON p.id = s.project_id
     WHERE g.id IN (:ids)`, { ids },
  );
  const byId = new Map(targets.map((t) => [t.id, t]));
  for (const id of ids) {
    const t = byId.get(id);
    // Members of the owning group (any role) learn that it exists; everyone else sees "not found".
    if (!t || roleIn(actor, t.group_id) === null || roleIn(actor, t.group_id) === "collaborator") {
      throw new ReviewRefused(404, `signature ${id} was not found`, "signatureIds");
    }
    if (!canReview(actor, t.group_id)) throw new ReviewRefused(403, "Only a lead of the group that owns the spectrum can confirm or dismiss its signatures.", "signatureIds");
  }
  const outcomes = await db.transaction(async (transaction) => {
    // Lock the rows so two leads deciding at once both land in the history, in order.
    const locked = await Signature.findAll({ where: { id: { [Op.in]: ids } }, lock: transaction.LOCK.UPDATE, transaction });
    const state = new Map(locked.map((s) => [s.id, s.reviewState]));
    const out: DecisionOutcome[] = [];
    for (const id of ids) {
      const review = await Review.create({ signatureId: id, reviewerId: actor.id, decision, comment }, { transaction });
      await Signature.update({ reviewState: decision }, { where: { id }, transaction });
      const previousState = state.get(id) ?? "awaiting";
      const t = byId.get(id)!;
      await recordAudit({
        actorId: actor.id, actorLabel: actor.email, groupId: t.group_id,
        action: previousState === "awaiting" ? "signature-decided" : "signature-decision-revised",
        targetType: "signature", targetId: id,
        details: { decision, previousState, comment, reviewId: review.id, kind: t.kind, spectrumId: t.spectrum_id },
      }, transaction);
      out.push({ signatureId: id, reviewId: review.id, decision, previousState, decidedAt: review.createdAt.toISOString() });
    }
    return out;
  });
  const decided: DecidedSignature[] = outcomes.map((o) => {
    const t = byId.get(o.signatureId)!;
    return { ...o, kind: t.kind, energyEv: t.energy_ev, spectrumId: t.spectrum_id, fileName: t.file_name, uploadedBy: t.uploaded_by };
  });
  let mailed = 0;
  try {
    mailed = await notifyUploaders(actor, decided, comment);
  } catch (error) {
    // The decision is saved; a mail relay that is down must not undo it.
    console.error(JSON.stringify({ level: "warn", msg: "decision mail not sent", error: error instanceof Error ? error.message : String(error) }));
  }
  return { outcomes, mailed };
}
