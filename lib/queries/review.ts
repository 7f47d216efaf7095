import { selectRows } from "@/lib/db";
import type { Technique } from "@/lib/registry/techniques";
import type { FlagKind } from "@/lib/registry/flagKinds";
import type { Actor } from "@/lib/auth/actor";
import { leadGroupIds, roleIn } from "@/lib/auth/access";
import { fastCount, type CountSql } from "@/lib/search/fastCount";
import { cursorAtSql, decodeSortedCursor, encodeSortedCursor } from "@/lib/search/keysetCursor";
import type { QueueQuery } from "@/lib/review/schemas";
import { CURRENT_SIGNATURE } from "@/lib/review/counts";

export type ReviewItem = {
  id: string;
  kind: FlagKind;
  energyEv: number | null;
  fraction: number | null;
  shiftMeV: number | null;
  significance: number;
  /** The magnitude in its own unit, whatever the kind (migrations/0005). */
  magnitude: number | null;
  unit: string | null;
  uncertainty: number | null;
  reviewState: string;
  spectrumId: string;
  fileName: string;
  sampleId: string | null;
  sampleName: string | null;
  projectId: string;
  projectName: string;
  createdAt: string;
  lastDecisionAt: string | null;
  technique: Technique;
};

export type ReviewQueue = {
  items: ReviewItem[];
  total: number;
  /** False when `total` is the planner's estimate (a large queue; lib/search/fastCount.ts). */
  totalExact: boolean;
  pageSize: number;
  /** Cursor of the next page in the same order, or null on the last page. */
  next: string | null;
  /** Choices for the filters: projects of the groups the actor leads, and their most recent samples (plus the one filtered on). */
  projects: { id: string; name: string }[];
  samples: { id: string; name: string }[];
};

type Row = {
  sort_value?: string;
  cursor_at?: string;
  id: string;
  kind: FlagKind;
  energy_ev: number | null;
  fraction: number | null;
  shift_mev: number | null;
  significance: number;
  magnitude: number | null;
  unit: string | null;
  uncertainty: number | null;
  review_state: string;
  spectrum_id: string;
  file_name: string;
  sample_id: string | null;
  sample_name: string | null;
  project_id: string;
  project_name: string;
  created_at: Date;
  last_decision_at: Date | null;
  technique: Technique;
};

/**
 * Each sort's value, and how a cursor's text value is read back. Rows are ordered by the value,
 * then the flag's time, then its id, all in the same direction, so one row comparison finds the
 * next page and the significance, date and kind orders walk an index of the current signatures
 * (migrations/0012); the project and sample orders sort the matching rows.
 */
const SORT_KEY: Record<QueueQuery["sort"], { sql: string; cast: string }> = {
  significance: { sql: "g.significance", cast: "float8" },
  date: { sql: "g.created_at", cast: "timestamptz" },
  kind: { sql: "g.kind", cast: "text" },
  project: { sql: "p.name", cast: "text" },
  sample: { sql: "coalesce(sm.name, '')", cast: "text" },
};

/** Samples offered in the queue's filter: the groups' most recent (a group may have thousands). */
const SAMPLE_CHOICES = 200;

function toItem(r: Row): ReviewItem {
  return {
    id: r.id,
    kind: r.kind,
    energyEv: r.energy_ev,
    fraction: r.fraction,
    shiftMeV: r.shift_mev,
    significance: r.significance,
    magnitude: r.magnitude,
    unit: r.unit,
    uncertainty: r.uncertainty,
    reviewState: r.review_state,
    spectrumId: r.spectrum_id,
    fileName: r.file_name,
    sampleId: r.sample_id,
    sampleName: r.sample_name,
    projectId: r.project_id,
    projectName: r.project_name,
    createdAt: new Date(r.created_at).toISOString(),
    lastDecisionAt: r.last_decision_at ? new Date(r.last_decision_at).toISOString() : null,
    technique: r.technique,
  };
}

/**
 * The review queue of a group lead: signatures of the latest analysis of each spectrum in the
 * groups the actor leads, filtered, sorted and paged as the query says.
 */
export async function listReviewQueue(actor: Actor, q: QueueQuery): Promise<ReviewQueue> {
  const groupIds = leadGroupIds(actor);
  const empty = { items: [], total: 0, totalExact: true, pageSize: q.pageSize, next: null, projects: [], samples: [] };
  if (groupIds.length === 0) return empty;
  const { listSql, count: countSql, params } = reviewQueueSql(groupIds, q);
  const [count, rows, projects, samples] = await Promise.all([
    fastCount(countSql, params),
    selectRows<Row>(listSql, params),
    selectRows<{ id: string; name: string }>(`SELECT id, name FROM projects WHERE group_id IN (:groupIds) ORDER BY name`, { groupIds }),
    selectRows<{ id: string; name: string }>(
      `SELECT id, name FROM (
         (SELECT id, name FROM samples WHERE group_id IN (:groupIds) ORDER BY created_at DESC, id DESC LIMIT ${SAMPLE_CHOICES})
         UNION SELECT id, name FROM samples WHERE id = CAST(:chosen AS uuid) AND group_id IN (:groupIds)
       ) offered ORDER BY name`,
      { groupIds, chosen: q.sample ?? null },
    ),
  ]);
  const shown = rows.slice(0, q.pageSize);
  const last = shown[shown.length - 1];
  return {
    items: shown.map(toItem),
    total: count.value,
    totalExact: count.exact,
    pageSize: q.pageSize,
    next: rows.length > q.pageSize && last ? encodeSortedCursor({ value: last.sort_value!, at: last.cursor_at!, id: last.id }) : null,
    projects,
    samples,
  };
}

/**
 * The SQL of one page of the queue (keyset: strictly after the cursor in the chosen order, one row
 * more than a page to know whether another follows) and of its count. Pure, so tests can EXPLAIN
 * exactly what the app runs.
 */
export function reviewQueueSql(groupIds: string[], q: QueueQuery) {
  const { where, params } = queueFilterSql(groupIds, q);
  const from = `FROM signatures g JOIN spectra s ON s.id = g.spectrum_id JOIN projects p ON p.id = s.project_id
     LEFT JOIN samples sm ON sm.id = s.sample_id WHERE ${where.join(" AND ")}`;
  const key = SORT_KEY[q.sort];
  const dir = q.dir === "asc" ? "ASC" : "DESC";
  const position = q.after ? decodeSortedCursor(q.after) : null;
  const pageWhere = position
    ? ` AND (${key.sql}, g.created_at, g.id) ${dir === "ASC" ? ">" : "<"} (CAST(:afterValue AS ${key.cast}), CAST(:afterAt AS timestamptz), CAST(:afterId AS uuid))`
    : "";
  const listSql = `SELECT g.id, g.kind, g.energy_ev, g.fraction, g.shift_mev, g.magnitude, g.unit, g.uncertainty, g.significance, g.review_state, g.spectrum_id,
            s.file_name, s.technique, s.sample_id, sm.name AS sample_name, p.id AS project_id, p.name AS project_name, g.created_at,
            (SELECT max(v.created_at) FROM reviews v WHERE v.signature_id = g.id) AS last_decision_at,
            ${key.cast === "timestamptz" ? cursorAtSql(key.sql) : `(${key.sql})::text`} AS sort_value, ${cursorAtSql("g.created_at")} AS cursor_at
     ${from}${pageWhere} ORDER BY ${key.sql} ${dir}, g.created_at ${dir}, g.id ${dir} LIMIT :limit`;
  // counted per project of the groups (each stopping at the cap): each project's spectra by index,
  // and per spectrum its current signatures (OFFSET 0 keeps that a per-spectrum probe instead of a
  // join of whole tables, which the planner otherwise picks)
  const count: CountSql = {
    rowsSql: `SELECT 1 FROM projects p CROSS JOIN LATERAL (
        SELECT 1 FROM spectra s CROSS JOIN LATERAL (
          SELECT g.id, g.review_state, g.kind, g.significance, g.created_at, g.superseded_at FROM signatures g
           WHERE g.spectrum_id = s.id AND g.superseded_at IS NULL OFFSET 0) g
         WHERE s.project_id = p.id AND ${where.join(" AND ")} LIMIT :countLimit) counted
      WHERE p.group_id IN (:groupIds)`,
    estimateSql: `SELECT 1 ${from}`,
  };
  return {
    listSql,
    count,
    params: {
      ...params,
      limit: q.pageSize + 1,
      ...(position ? { afterValue: position.value, afterAt: position.at, afterId: position.id } : {}),
    },
  };
}

/** The queue's filters as SQL over `signatures g`, `spectra s`, `projects p` (values as replacements). */
function queueFilterSql(groupIds: string[], q: QueueQuery): { where: string[]; params: Record<string, unknown> } {
  const where = ["p.group_id IN (:groupIds)"];
  const params: Record<string, unknown> = { groupIds };
  if (q.state !== "all") {
    where.push("g.review_state = :state");
    params.state = q.state;
  }
  if (q.project) {
    where.push("p.id = :project");
    params.project = q.project;
  }
  if (q.sample) {
    where.push("s.sample_id = :sample");
    params.sample = q.sample;
  }
  if (q.kind) {
    where.push("g.kind = :kind");
    params.kind = q.kind;
  }
  if (q.minSignificance !== undefined) {
    where.push("g.significance >= :minSig");
    params.minSig = q.minSignificance;
  }
  if (q.from) {
    where.push("g.created_at >= CAST(:from AS date)");
    params.from = q.from;
  }
  if (q.to) {
    where.push("g.created_at < CAST(:to AS date) + 1");
    params.to = q.to;
  }
  // Only flags of each spectrum's newest finished run: a re-analysis supersedes the earlier ones.
  where.push(CURRENT_SIGNATURE);
  return { where, params };
}

export type ReviewHistoryEntry = {
  id: string;
  decision: string;
  comment: string;
  reviewerName: string | null;
  createdAt: string;
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
  const [r] = await selectRows<
    Row & {
      group_id: string;
      reference_spectrum_id: string | null;
      reference_file_name: string | null;
      technique: Technique;
      details: Record<string, unknown>;
      run_id: string;
      matched_signature_id: string | null;
      superseded_by_run_id: string | null;
      superseded_at: Date | null;
      successor_id: string | null;
      successor_state: string | null;
    }
  >(
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
     LEFT JOIN samples sm ON sm.id = s.sample_id WHERE g.id = :id`,
    { id },
  );
  if (!r) return null;
  const role = roleIn(actor, r.group_id);
  if (role === null || role === "collaborator") return null;
  const history = await selectRows<{
    id: string;
    decision: string;
    comment: string;
    reviewer_name: string | null;
    created_at: Date;
    origin: ReviewHistoryEntry["origin"];
    previous_state: string | null;
    carried_from_signature_id: string | null;
    carried_from_run_id: string | null;
    undoes_review_id: string | null;
  }>(
    `SELECT v.id, v.decision, v.comment, u.name AS reviewer_name, v.created_at, v.origin, v.previous_state,
            v.carried_from_signature_id, v.carried_from_run_id, v.undoes_review_id
       FROM reviews v LEFT JOIN users u ON u.id = v.reviewer_id
      WHERE v.signature_id = :id ORDER BY v.created_at DESC, v.id DESC`,
    { id },
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
    supersededBy:
      r.superseded_by_run_id && r.superseded_at
        ? {
            runId: r.superseded_by_run_id,
            at: new Date(r.superseded_at).toISOString(),
            matchId: r.successor_id,
            matchState: r.successor_state,
          }
        : null,
    history: history.map((h) => ({
      id: h.id,
      decision: h.decision,
      comment: h.comment,
      reviewerName: h.reviewer_name,
      createdAt: new Date(h.created_at).toISOString(),
      origin: h.origin,
      previousState: h.previous_state,
      carriedFromSignatureId: h.carried_from_signature_id,
      carriedFromRunId: h.carried_from_run_id,
      undoesReviewId: h.undoes_review_id,
    })),
  };
}
