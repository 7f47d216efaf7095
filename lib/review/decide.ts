import { Op, type Transaction } from "sequelize";
import type { FlagKind } from "@/lib/registry/flagKinds";
import type { Actor } from "@/lib/auth/actor";
import { canReview, roleIn } from "@/lib/auth/access";
import { recordAudit } from "@/lib/audit";
import { selectRows, sequelize } from "@/lib/db";
import { Review, Signature } from "@/models";
import type { ReviewState } from "@/models/Signature";
import { shortRunId } from "./carryDecisions";
import { addNotices, scheduleNotices, type Notice } from "./notices";
import type { Decision } from "./schemas";
import { refuse } from "@/lib/errors";

export type DecisionOutcome = {
  signatureId: string;
  /** The history row written; null when the decision equalled the current state and nothing was recorded. */
  reviewId: string | null;
  decision: ReviewState;
  previousState: ReviewState;
  /** True when nothing changed (the signature already had this state). */
  unchanged: boolean;
  decidedAt: string | null;
};

type Target = {
  id: string;
  kind: FlagKind;
  review_state: string;
  group_id: string;
  spectrum_id: string;
  file_name: string;
  energy_ev: number | null;
  uploaded_by: string | null;
};

async function loadTargets(actor: Actor, ids: string[]): Promise<Map<string, Target>> {
  const targets = await selectRows<Target>(
    `SELECT g.id, g.kind, g.review_state, p.group_id, s.id AS spectrum_id, s.file_name, g.energy_ev, s.uploaded_by
     FROM signatures g JOIN spectra s ON s.id = g.spectrum_id JOIN projects p ON p.id = s.project_id
     WHERE g.id IN (:ids)`,
    { ids },
  );
  const byId = new Map(targets.map((t) => [t.id, t]));
  for (const id of ids) {
    const t = byId.get(id);
    // Members of the owning group (any role) learn that it exists; everyone else sees "not found".
    if (!t || roleIn(actor, t.group_id) === null || roleIn(actor, t.group_id) === "collaborator") {
      throw refuse(404, `signature ${id} was not found`, "signatureIds");
    }
    if (!canReview(actor, t.group_id))
      throw refuse(403, "Only a lead of the group that owns the spectrum can confirm or dismiss its signatures.", "signatureIds");
  }
  return byId;
}

/** Locks the signatures and refuses any that a newer run replaced: a decision must land on the current flag. */
async function lockCurrent(ids: string[], transaction: Transaction): Promise<Map<string, Signature>> {
  const locked = await Signature.findAll({ where: { id: { [Op.in]: ids } }, lock: transaction.LOCK.UPDATE, transaction });
  for (const s of locked) {
    if (s.supersededAt !== null) {
      throw refuse(
        409,
        `This flag was replaced by a newer analysis (run ${shortRunId(s.supersededByRunId ?? "")}); open the signature to find the same band in that run and decide there.`,
        "signatureIds",
      );
    }
  }
  return new Map(locked.map((s) => [s.id, s]));
}

function noticeFor(actor: Actor, t: Target, signatureId: string, reviewId: string): Notice[] {
  return t.uploaded_by && t.uploaded_by !== actor.id
    ? [{ recipientId: t.uploaded_by, signatureId, reviewId, reviewerName: actor.name }]
    : [];
}

/** After the transaction: the uploaders' mail is scheduled; a Redis outage must not undo the decision (the digest's safety net sends it later). */
async function scheduleAfterCommit(notices: Notice[]): Promise<number> {
  const recipients = [...new Set(notices.map((n) => n.recipientId))];
  try {
    await scheduleNotices(recipients);
  } catch (error) {
    console.error(
      JSON.stringify({
        level: "warn",
        msg: "decision mail not scheduled yet",
        error: error instanceof Error ? error.message : String(error),
      }),
    );
  }
  return recipients.length;
}

/**
 * Records a lead's decision on one or more signatures: one Review row each (who, when, decision,
 * comment, the state it replaced), the signature's reviewState updated, an audit event, all in
 * one transaction; then the uploaders hear of it in one coalesced mail (lib/review/notices.ts).
 * A decision equal to the current state records nothing. A decision on a decided signature is a
 * revision: the earlier rows stay as its history.
 *
 * Refusals: a signature of a group the actor is not a member of is "not found" (ids leak
 * nothing); a member who is not the group's lead is refused (403); a signature that a newer run
 * replaced is refused (409).
 */
export async function decideSignatures(
  actor: Actor,
  signatureIds: string[],
  decision: Decision,
  comment: string,
): Promise<{ outcomes: DecisionOutcome[]; mailed: number }> {
  const db = sequelize();
  const ids = [...new Set(signatureIds)];
  if (ids.length === 0) throw refuse(400, "choose at least one signature", "signatureIds");
  const byId = await loadTargets(actor, ids);
  const notices: Notice[] = [];
  const outcomes = await db.transaction(async (transaction) => {
    // Lock the rows so two leads deciding at once both land in the history, in order.
    const locked = await lockCurrent(ids, transaction);
    const out: DecisionOutcome[] = [];
    for (const id of ids) {
      const previousState = locked.get(id)?.reviewState ?? "awaiting";
      if (previousState === decision) {
        out.push({ signatureId: id, reviewId: null, decision, previousState, unchanged: true, decidedAt: null });
        continue;
      }
      const review = await Review.create(
        { signatureId: id, reviewerId: actor.id, decision, comment, origin: "decision", previousState },
        { transaction },
      );
      await Signature.update({ reviewState: decision }, { where: { id }, transaction });
      const t = byId.get(id)!;
      await recordAudit(
        {
          actorId: actor.id,
          actorLabel: actor.email,
          groupId: t.group_id,
          action: previousState === "awaiting" ? "signature-decided" : "signature-decision-revised",
          targetType: "signature",
          targetId: id,
          details: { decision, previousState, comment, reviewId: review.id, kind: t.kind, spectrumId: t.spectrum_id },
        },
        transaction,
      );
      notices.push(...noticeFor(actor, t, id, review.id));
      out.push({
        signatureId: id,
        reviewId: review.id,
        decision,
        previousState,
        unchanged: false,
        decidedAt: review.createdAt.toISOString(),
      });
    }
    await addNotices(notices, transaction);
    return out;
  });
  return { outcomes, mailed: await scheduleAfterCommit(notices) };
}

/**
 * Takes back decisions: each named review row must be a lead's decision and still the latest row
 * of its signature; the signature returns exactly to the state that row replaced, and an "undo"
 * row naming it joins the history. Same refusals as decideSignatures; a decision that a later one
 * followed, or one recorded before undo was possible, is refused (409).
 */
export async function undoDecisions(actor: Actor, reviewIds: string[]): Promise<{ outcomes: DecisionOutcome[]; mailed: number }> {
  const db = sequelize();
  const wanted = [...new Set(reviewIds)];
  if (wanted.length === 0) throw refuse(400, "name at least one decision to undo", "reviewIds");
  const reviews = await Review.findAll({ where: { id: { [Op.in]: wanted } } });
  if (reviews.length !== wanted.length) throw refuse(404, "a decision to undo was not found", "reviewIds");
  const ids = [...new Set(reviews.map((r) => r.signatureId))];
  const byId = await loadTargets(actor, ids);
  const notices: Notice[] = [];
  const outcomes = await db.transaction(async (transaction) => {
    const locked = await lockCurrent(ids, transaction);
    const out: DecisionOutcome[] = [];
    for (const review of reviews) {
      const id = review.signatureId;
      const latest = await Review.findOne({
        where: { signatureId: id },
        order: [
          ["createdAt", "DESC"],
          ["id", "DESC"],
        ],
        transaction,
      });
      if (review.origin !== "decision" || review.previousState === null) {
        throw refuse(409, "Only a lead's own decision, recorded with the state it replaced, can be undone.", "reviewIds");
      }
      if (latest?.id !== review.id)
        throw refuse(409, "A later decision followed this one; decide again instead of undoing it.", "reviewIds");
      const restored = review.previousState;
      const current = locked.get(id)?.reviewState ?? review.decision;
      const undo = await Review.create(
        {
          signatureId: id,
          reviewerId: actor.id,
          decision: restored,
          comment: `Undid the ${review.decision} decision; back to ${restored === "awaiting" ? "awaiting review" : restored}.`,
          origin: "undo",
          previousState: current,
          undoesReviewId: review.id,
        },
        { transaction },
      );
      await Signature.update({ reviewState: restored }, { where: { id }, transaction });
      const t = byId.get(id)!;
      await recordAudit(
        {
          actorId: actor.id,
          actorLabel: actor.email,
          groupId: t.group_id,
          action: "signature-decision-undone",
          targetType: "signature",
          targetId: id,
          details: {
            undoesReviewId: review.id,
            restoredState: restored,
            previousState: current,
            reviewId: undo.id,
            spectrumId: t.spectrum_id,
          },
        },
        transaction,
      );
      notices.push(...noticeFor(actor, t, id, undo.id));
      out.push({
        signatureId: id,
        reviewId: undo.id,
        decision: restored,
        previousState: current,
        unchanged: false,
        decidedAt: undo.createdAt.toISOString(),
      });
    }
    await addNotices(notices, transaction);
    return out;
  });
  return { outcomes, mailed: await scheduleAfterCommit(notices) };
}
