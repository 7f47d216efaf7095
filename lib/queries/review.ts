import { selectRows } from "@/lib/db";
import type { Technique } from "@/lib/registry/techniques";
import type { FlagKind } from "@/lib/registry/flagKinds";
import type { Actor } from "@/lib/auth/actor";
import { roleIn } from "@/lib/auth/access";
import { fastCount } from "@/lib/search/fastCount";
import type { QueueQuery } from "@/lib/review/schemas";
import { CURRENT_SIGNATURE } from "@/lib/review/counts";
import { models } from "@/models";

export type ReviewItem = {
  id: string; kind: FlagKind; energyEv: number | null; fraction: number | null; shiftMeV: number | null; significance: number;
  /** The magnitude in its own unit, whatever the kind (migrations/0005). */
  magnitude: number | null; unit: string | null; uncertainty: number | null;
  reviewState: string; spectrumId: string; fileName: string; sampleId: string | null; sampleName: string | null;
  projectId: string; projectName: string; createdAt: string; lastDecisionAt: string | null;
  technique: Technique;
};

export type ReviewQueue = {
  items: ReviewItem[];
  total: number;
  /** False when `total` is the planner's estimate (a large queue; lib/search/fastCount.ts). */
  totalExact: boolean;
  page: number;
  pageSize: number;
  pages: number;
  /** Choices for the filters: projects and samples of the groups the actor leads. */
  projects: { id: string; name: string }[];
  samples: { id: string; name: string }[];
};

type Row = {
  id: string; kind: FlagKind; energy_ev: number | null; fraction: number | null; shift_mev: number | null; significance: number;
  magnitude: number | null; unit: string | null; uncertainty: number | null;
  review_state: string; spectrum_id: string; file_name: string; sample_id: string | null; sample_name: string | null;
  project_id: string; project_name: string; created_at: Date; last_decision_at: Date | null; technique: Technique;
};

const ORDER: Record<QueueQuery["sort"], string> = {
  significance: "g.significance",
  date: "g.created_at",
  kind: "g.kind",
  project: "p.name",
  sample: "sm.name",
};

export const leadGroupIds = (actor: Actor) => actor.memberships.filter((m) => m.role === "lead").map((m) => m.groupId);

function toItem(r: Row): ReviewItem {
  return {
    id: r.id, kind: r.kind, energyEv: r.energy_ev, fraction: r.fraction, shiftMeV: r.shift_mev, significance: r.significance,
    magnitude: r.magnitude, unit: r.unit, uncertainty: r.uncertainty,
    reviewState: r.review_state, spectrumId: r.spectrum_id, fileName: r.file_name, sampleId: r.sample_id, sampleName: r.sample_name,
    projectId: r.project_id, projectName: r.project_name, createdAt: new Date(r.created_at).toISOString(),
    lastDecisionAt: r.last_decision_at ? new Date(r.last_decision_at).toISOString() : null, technique: r.technique,
  };
}

/**
 * The review queue of a group lead: signatures of the latest analysis of each spectrum in the
 * groups the actor leads, filtered, sorted and paged as the query says.
 */
export async function listReviewQueue(actor: Actor, q: QueueQuery): Promise<ReviewQueue> {
  models();
  const groupIds = leadGroupIds(actor);
  const empty = { items: [], total: 0, totalExact: true, page: q.page, pageSize: q.pageSize, pages: 0, projects: [], samples: [] };
  if (groupIds.length === 0) return empty;
  const where = ["p.group_id IN (:groupIds)"];
  const params: Record<string, unknown> = { groupIds };
  if (q.state !== "all") { where.push("g.review_state = :state"); params.state = q.state; }
  if (q.project) { where.push("p.id = :project"); params.project = q.project; }
  if (q.sample) { where.push("s.sample_id = :sample"); params.sample = q.sample; }
  if (q.kind) { where.push("g.kind = :kind"); params.kind = q.kind; }
  if (q.minSignificance !== undefined) { where.push("g.significance >= :minSig"); params.minSig = q.minSignificance; }
  if (q.from) { where.push("g.created_at >= CAST(:from AS date)"); params.from = q.from; }
  if (q.to) { where.push("g.created_at < CAST(:to AS date) + 1"); params.to = q.to; }
  // Only flags of each spectrum's newest finished run: a re-analysis supersedes the earlier ones.
  where.push(CURRENT_SIGNATURE);
  const from = `FROM signatures g JOIN spectra s ON s.id = g.spectrum_id JOIN projects p ON p.id = s.project_id
     LEFT JOIN samples sm ON sm.id = s.sample_id WHERE ${where.join(" AND ")}`;
  const dir = q.dir === "asc" ? "ASC" : "DESC";
  const count = await fastCount({ rowsSql: `SELECT 1 ${from}`, estimateSql: `SELECT 1 ${from}` }, params);
  const total = count.value;
  const rows = await selectRows<Row>(
    `SELECT g.id, g.kind, g.energy_ev, g.fraction, g.shift_mev, g.magnitude, g.unit, g.uncertainty, g.significance, g.review_state, g.spectrum_id, s.file_name, s.technique,
            s.sample_id, sm.name AS sample_name, p.id AS project_id, p.name AS project_name, g.created_at,
            (SELECT max(v.created_at) FROM reviews v WHERE v.signature_id = g.id) AS last_decision_at
     ${from} ORDER BY ${ORDER[q.sort]} ${dir} NULLS LAST, g.created_at DESC, g.id LIMIT :limit OFFSET :offset`,
    { ...params, limit: q.pageSize, offset: (q.page - 1) * q.pageSize },
  );
  const [projects, samples] = await Promise.all([
    selectRows<{ id: string; name: string }>(`SELECT id, name FROM projects WHERE group_id IN (:groupIds) ORDER BY name`, { groupIds }),
    selectRows<{ id: string; name: string }>(
      `SELECT DISTINCT sm.id, sm.name FROM samples sm JOIN spectra s ON s.sample_id = sm.id JOIN signatures g ON g.spectrum_id = s.id
       WHERE sm.group_id IN (:groupIds) ORDER BY sm.name`, { groupIds },
    ),
  ]);
  return { items: rows.map(toItem), total, totalExact: count.exact, page: q.page, pageSize: q.pageSize, pages: Math.ceil(total / q.pageSize), projects, samples };
}

export type ReviewHistoryEntry = {
  id: string; decision: string; comment: string; reviewerName: string | null; createdAt: string;
  /** decision: a lead's; carried / not-carried: from the matched signature of an earlier run; undo: a decision taken back. */
  origin: "decision" | "carried" | "not-carried" | "undo";
  previousState: string | null;
  carriedFromSignatureId: string | null;
  carriedFromRunId: string | null;
  undoesReviewId: string | null;
};

/** Set when a newer run replaced the signature's run: what replaced it and the same band there, if found. */
export type Supersession = { runId: string; at: string; matchId: string | null; matchState: string | null };

export type SignatureReview = ReviewItem & {
  groupId: string;
  mayDecide: boolean;
  referenceSpectrumId: string | null;
  referenceFileName: string | null;
  technique: Technique;
  message: string | null;
  runId: string;
  /** The same band in the run before this one. */
  matchedSignatureId: string | null;
  supersededBy: Supersession | null;
  history: ReviewHistoryEntry[];
};

/** One signature with its decision history, for members of the owning group; null otherwise. */
export async function getSignatureReview(actor: Actor, id: string): Promise<SignatureReview | null> {
  models();
  const [r] = await selectRows<Row & {
    group_id: string; reference_spectrum_id: string | null; reference_file_name: string | null; technique: Technique; details: Record<string, unknown>;
    run_id: string; matched_signature_id: string | null; superseded_by_run_id: string | null; superseded_at: Date | null;
    successor_id: string | null; successor_state: string | null;
  }>(
    `SELECT g.id, g.kind, g.energy_ev, g.fraction, g.shift_mev, g.magnitude, g.unit, g.uncertainty, g.significance, g.review_state, g.spectrum_id, s.file_name,
            s.sample_id, sm.name AS sample_name, p.id AS project_id, p.name AS project_name, g.created_at, p.group_id,
            run.reference_spectrum_id, rs.file_name AS reference_file_name, s.technique, g.details,
            g.run_id, g.matched_signature_id, g.superseded_by_run_id, g.superseded_at,
            nx.id AS successor_id, nx.review_state AS successor_state,
            (SELECT max(v.created_at) FROM reviews v WHERE v.signature_id = g.id) AS last_decision_at
     FROM signatures g JOIN spectra s ON s.id = g.spectrum_id JOIN projects p ON p.id = s.project_id
     JOIN analysis_runs run ON run.id = g.run_id
     LEFT JOIN spectra rs ON rs.id = run.reference_spectrum_id
     LEFT JOIN signatures nx ON nx.matched_signature_id = g.id AND nx.run_id = g.superseded_by_run_id
     LEFT JOIN samples sm ON sm.id = s.sample_id WHERE g.id = :id`, { id },
  );
  if (!r) return null;
  const role = roleIn(actor, r.group_id);
  if (role === null || role === "collaborator") return null;
  const history = await selectRows<{
    id: string; decision: string; comment: string; reviewer_name: string | null; created_at: Date; origin: ReviewHistoryEntry["origin"];
    previous_state: string | null; carried_from_signature_id: string | null; carried_from_run_id: string | null; undoes_review_id: string | null;
  }>(
    `SELECT v.id, v.decision, v.comment, u.name AS reviewer_name, v.created_at, v.origin, v.previous_state,
            v.carried_from_signature_id, v.carried_from_run_id, v.undoes_review_id
       FROM reviews v LEFT JOIN users u ON u.id = v.reviewer_id
      WHERE v.signature_id = :id ORDER BY v.created_at DESC, v.id DESC`, { id },
  );
  const details = r.details ?? {};
  return {
    ...toItem(r),
    groupId: r.group_id,
    mayDecide: role === "lead" && r.superseded_at === null,
    referenceSpectrumId: r.reference_spectrum_id,
    referenceFileName: r.reference_file_name,
    technique: r.technique,
    message: typeof details.message === "string" ? details.message : null,
    runId: r.run_id,
    matchedSignatureId: r.matched_signature_id,
    supersededBy: r.superseded_by_run_id && r.superseded_at
      ? { runId: r.superseded_by_run_id, at: new Date(r.superseded_at).toISOString(), matchId: r.successor_id, matchState: r.successor_state }
      : null,
    history: history.map((h) => ({
      id: h.id, decision: h.decision, comment: h.comment, reviewerName: h.reviewer_name, createdAt: new Date(h.created_at).toISOString(),
      origin: h.origin, previousState: h.previous_state, carriedFromSignatureId: h.carried_from_signature_id,
      carriedFromRunId: h.carried_from_run_id, undoesReviewId: h.undoes_review_id,
    })),
  };
}
