import { z } from "zod";
import { csvLine } from "@/lib/formats/csv";
import type { Actor } from "@/lib/auth/actor";
import { memberGroupIds, readableScope, stewardGroupIds } from "@/lib/auth/access";
import { selectRows } from "@/lib/db";
import {
  AUDIT_CATEGORIES,
  AUDIT_CATEGORY_LABELS,
  actionsOf,
  categoryOf,
  describeEvent,
  flagKindWord,
  type AuditCategory,
} from "@/lib/auditTrail/eventKinds";
import { foldSignIns, foldedSentence } from "@/lib/auditTrail/foldSignIns";
import {
  plainText,
  recordingLookup,
  type AuditEventInput,
  type AuditRefType,
  type KnownRecord,
  type SentencePart,
} from "@/lib/auditTrail/sentenceParts";
import { countParams, fastCount, type CountSql, type FastCount } from "@/lib/search/fastCount";
import { cursorAtSql, decodeCursor, encodeCursor } from "@/lib/search/keysetCursor";

// The audit trail of the groups a person stewards, a page at a time by keyset (the last row's
// time and id), with a count that stays fast (fastCount). Each event reads as a sentence
// (lib/auditTrail) whose named records link to their pages when the reader may open them.

const day = z
  .string()
  .trim()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date as YYYY-MM-DD.")
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), "Not a real date.");
const blank = (v: unknown) => (v === "" || v === null ? undefined : v);

export const AUDIT_PAGE_SIZE = 50;
export const AUDIT_API_MAX_PAGE = 1000;

/** The filter of the audit page, its JSON pages and its CSV export; every field optional, each error names its field. */
export const auditFilterSchema = z
  .object({
    category: z.preprocess(blank, z.enum(AUDIT_CATEGORIES, { error: `category: one of ${AUDIT_CATEGORIES.join(", ")}.` }).optional()),
    person: z.preprocess(blank, z.string().trim().uuid("person: not a valid person id.").optional()),
    action: z.preprocess(blank, z.string().trim().max(60, "action: at most 60 characters.").optional()),
    from: z.preprocess(blank, day.optional()),
    to: z.preprocess(blank, day.optional()),
    after: z.preprocess(
      blank,
      z
        .string()
        .max(200)
        .refine((c) => decodeCursor(c) !== null, "after: not a cursor from an earlier page.")
        .optional(),
    ),
  })
  .refine((f) => !f.from || !f.to || f.from <= f.to, { message: "to: the end date comes before the start date.", path: ["to"] });

export type AuditFilter = z.infer<typeof auditFilterSchema>;

/** Whose events the reader sees: their stewarded groups', and personal events (no group: sign-ins, tokens) of themselves, or everyone's for a site admin. */
export type AuditScope = { groupIds: string[]; personalOf: string | "everyone" };

export function auditScopeOf(actor: Actor): AuditScope | null {
  const groupIds = stewardGroupIds(actor);
  return groupIds.length ? { groupIds, personalOf: actor.isSiteAdmin ? "everyone" : actor.id } : null;
}

type EventRow = {
  id: string;
  at: Date;
  cursor_at: string;
  actor_id: string | null;
  actor_label: string;
  actor_name: string | null;
  group_id: string | null;
  action: string;
  target_type: string | null;
  target_id: string | null;
  details: Record<string, unknown>;
};

/**
 * The SQL of one page of the trail and of its count. Each group (and the reader's personal
 * events) contributes at most a page from its (group_id, at, id) range, or one range per event
 * code of the chosen category from (group_id, action, at, id); a person filter walks that
 * person's (actor_id, at, id) range. The pieces are merged, so the ten-thousandth page costs
 * what the first does. Pure, so tests EXPLAIN exactly what the app runs.
 */
export function auditPageSql(scope: AuditScope, filter: AuditFilter, limit: number) {
  const params: Record<string, unknown> = { limit: limit + 1, groupIds: scope.groupIds };
  const actions = filter.action ? [filter.action] : filter.category ? actionsOf(filter.category) : null;
  const where: string[] = [];
  if (filter.from) {
    where.push("e.at >= CAST(:from AS timestamptz)");
    params.from = `${filter.from}T00:00:00Z`;
  }
  if (filter.to) {
    where.push("e.at < CAST(:to AS timestamptz) + interval '1 day'");
    params.to = `${filter.to}T00:00:00Z`;
  }
  const position = filter.after ? decodeCursor(filter.after) : null;
  const pageWhere = [...where];
  if (position && /^\d+$/.test(position.id)) {
    pageWhere.push("(e.at, e.id) < (CAST(:afterAt AS timestamptz), CAST(:afterId AS bigint))");
    Object.assign(params, { afterAt: position.at, afterId: position.id });
  }
  if (actions) params.actions = actions;
  const and = (cs: string[]) => cs.map((c) => ` AND ${c}`).join("");
  const personal = scope.personalOf === "everyone" ? "e.group_id IS NULL" : "e.group_id IS NULL AND e.actor_id = CAST(:me AS uuid)";
  if (scope.personalOf !== "everyone") params.me = scope.personalOf;

  let piecesOf: (cs: string[], tail: string) => string[];
  let estimateWhere: string;
  if (filter.person) {
    params.person = filter.person;
    const seesPersonal = scope.personalOf === "everyone" || scope.personalOf === filter.person;
    const inScope = `(e.group_id IN (:groupIds)${seesPersonal ? " OR e.group_id IS NULL" : ""})`;
    const actionIn = actions ? " AND e.action IN (:actions)" : "";
    piecesOf = (cs, tail) => [
      `SELECT e.id, e.at FROM audit_events e WHERE e.actor_id = CAST(:person AS uuid) AND ${inScope}${actionIn}${and(cs)} ${tail}`,
    ];
    estimateWhere = `e.actor_id = CAST(:person AS uuid) AND ${inScope}${actionIn}`;
  } else {
    const rangeOf = (groupSql: string, cs: string[], tail: string) =>
      actions
        ? `SELECT h.id, h.at FROM unnest(ARRAY[:actions]::text[]) AS code(action) CROSS JOIN LATERAL (
           SELECT e.id, e.at FROM audit_events e WHERE ${groupSql} AND e.action = code.action${and(cs)} ${tail}) h`
        : `SELECT e.id, e.at FROM audit_events e WHERE ${groupSql}${and(cs)} ${tail}`;
    piecesOf = (cs, tail) => [
      `SELECT g.id, g.at FROM unnest(ARRAY[:groupIds]::uuid[]) AS scope(id) CROSS JOIN LATERAL (${rangeOf("e.group_id = scope.id", cs, tail)}) g`,
      rangeOf(personal, cs, tail),
    ];
    estimateWhere = `(e.group_id IN (:groupIds) OR (${personal}))${actions ? " AND e.action IN (:actions)" : ""}`;
  }
  const pieces = piecesOf(pageWhere, "ORDER BY e.at DESC, e.id DESC LIMIT :limit");
  const count: CountSql = {
    rowsSql: `SELECT id FROM (${piecesOf(where, "LIMIT :countLimit")
      .map((p) => `(${p})`)
      .join(" UNION ALL ")}) counted`,
    estimateSql: `SELECT 1 FROM audit_events e WHERE ${estimateWhere}${and(where)}`,
  };
  const listSql = `WITH page AS (
      SELECT id, at FROM (${pieces.map((p) => `(${p})`).join(" UNION ALL ")}) merged ORDER BY at DESC, id DESC LIMIT :limit
    )
    SELECT e.id::text AS id, e.at, ${cursorAtSql("e.at")} AS cursor_at, e.actor_id, e.actor_label, u.name AS actor_name, e.group_id,
           e.action, e.target_type, e.target_id, e.details
    FROM page JOIN audit_events e ON e.id = page.id LEFT JOIN users u ON u.id = e.actor_id
    ORDER BY e.at DESC, e.id DESC`;
  return { listSql, count, params };
}

async function auditRows(scope: AuditScope, filter: AuditFilter, limit: number): Promise<{ rows: EventRow[]; next: string | null }> {
  const { listSql, params } = auditPageSql(scope, filter, limit);
  const rows = await selectRows<EventRow>(listSql, params);
  const shown = rows.slice(0, limit);
  const last = shown[shown.length - 1];
  return { rows: shown, next: rows.length > limit && last ? encodeCursor({ at: last.cursor_at, id: last.id }) : null };
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
type Readable = { member: Set<string>; projects: Set<string>; series: Set<string> };
type OwnedRow = { id: string; name: string; group_id: string | null; project_id?: string | null; series_id?: string | null };

/** Current names of the records the sentences name, with a link only where the reader may open the record. */
async function lookUpRecords(actor: Actor, refs: Map<AuditRefType, Set<string>>): Promise<Map<string, KnownRecord>> {
  const known = new Map<string, KnownRecord>();
  const idsOf = (type: AuditRefType) => [...(refs.get(type) ?? [])].filter((id) => UUID.test(id));
  const scope = await readableScope(actor);
  const can: Readable = {
    member: new Set(memberGroupIds(actor)),
    projects: new Set(scope.sharedProjectIds),
    series: new Set(scope.sharedSeriesIds),
  };
  const opens = (r: OwnedRow) =>
    (r.group_id !== null && can.member.has(r.group_id)) ||
    (!!r.project_id && can.projects.has(r.project_id)) ||
    (!!r.series_id && can.series.has(r.series_id));
  const load = async (type: AuditRefType, sql: string, href: (r: OwnedRow) => string | null) => {
    const ids = idsOf(type);
    if (!ids.length) return;
    for (const r of await selectRows<OwnedRow>(sql, { ids })) known.set(`${type}:${r.id}`, { name: r.name, href: href(r) });
  };
  await Promise.all([
    load(
      "spectrum",
      "SELECT s.id, s.file_name AS name, p.group_id, s.project_id, s.series_id FROM spectra s JOIN projects p ON p.id = s.project_id WHERE s.id IN (:ids)",
      (r) => (opens(r) ? `/spectra/${r.id}` : null),
    ),
    load("sample", "SELECT id, name, group_id FROM samples WHERE id IN (:ids)", (r) => (opens(r) ? `/samples/${r.id}` : null)),
    load(
      "series",
      "SELECT s.id, s.name, p.group_id, s.project_id, s.id AS series_id FROM series s JOIN projects p ON p.id = s.project_id WHERE s.id IN (:ids)",
      (r) => (opens(r) ? `/series/${r.id}` : null),
    ),
    load("project", "SELECT id, name, group_id, id AS project_id FROM projects WHERE id IN (:ids)", (r) =>
      opens(r) ? `/spectra?project=${r.id}` : null,
    ),
    // the review page is for members only (collaborators never see review state)
    load(
      "signature",
      "SELECT g.id, g.kind AS name, p.group_id FROM signatures g JOIN spectra s ON s.id = g.spectrum_id JOIN projects p ON p.id = s.project_id WHERE g.id IN (:ids)",
      (r) => (r.group_id && can.member.has(r.group_id) ? `/review/${r.id}` : null),
    ),
    load("user", "SELECT id, name, NULL AS group_id FROM users WHERE id IN (:ids)", () => null),
  ]);
  for (const [key, value] of known) {
    if (key.startsWith("signature:")) known.set(key, { ...value, name: flagKindWord(value.name) });
  }
  return known;
}

const toInput = (r: EventRow): AuditEventInput => ({
  action: r.action,
  actorId: r.actor_id,
  actorLabel: r.actor_label,
  targetType: r.target_type,
  targetId: r.target_id,
  details: r.details ?? {},
});

/** The events of a page as sentences, with their records looked up once for all of them. */
async function describeRows(actor: Actor, rows: EventRow[]): Promise<SentencePart[][]> {
  const recorder = recordingLookup();
  for (const r of rows) describeEvent(toInput(r), recorder.lookup);
  const known = await lookUpRecords(actor, recorder.refs);
  return rows.map((r) => describeEvent(toInput(r), (ref) => known.get(`${ref.type}:${ref.id}`)));
}

export type AuditLine =
  | { kind: "event"; id: string; at: string; action: string; category: AuditCategory | null; parts: SentencePart[] }
  | { kind: "sign-ins"; id: string; at: string; count: number; text: string };

export type AuditPage = { lines: AuditLine[]; next: string | null; count: FastCount };

/** One page of the trail as lines a person reads, consecutive sign-ins folded per person. Null when the reader stewards no group. */
export async function listAuditPage(actor: Actor, filter: AuditFilter, limit = AUDIT_PAGE_SIZE): Promise<AuditPage | null> {
  const scope = auditScopeOf(actor);
  if (!scope) return null;
  const { count, params } = auditPageSql(scope, filter, limit);
  const [{ rows, next }, total] = await Promise.all([auditRows(scope, filter, limit), fastCount(count, { ...countParams, ...params })]);
  const sentences = await describeRows(actor, rows);
  const byId = new Map(rows.map((r, i) => [r.id, { row: r, parts: sentences[i]! }]));
  const folded = foldSignIns(
    rows.map((r) => ({ id: r.id, at: r.at.toISOString(), action: r.action, actorKey: r.actor_id ?? r.actor_label })),
  );
  const lines = folded.map((line): AuditLine => {
    if (line.kind === "event") {
      const { row, parts } = byId.get(line.event.id)!;
      return { kind: "event", id: row.id, at: line.event.at, action: row.action, category: categoryOf(row.action), parts };
    }
    const first = byId.get(line.events[0]!.id)!;
    const name = first.row.actor_name || first.row.actor_label || "someone";
    return {
      kind: "sign-ins",
      id: `${line.events[0]!.id}-${line.count}`,
      at: line.last,
      count: line.count,
      text: foldedSentence(name, line.count, line.first, line.last),
    };
  });
  return { lines, next, count: total };
}

/** The people a steward can filter by: members of the groups they steward, by name. */
export async function auditPeople(actor: Actor): Promise<{ id: string; name: string }[]> {
  const groupIds = stewardGroupIds(actor);
  if (!groupIds.length) return [];
  return selectRows<{ id: string; name: string }>(
    `SELECT DISTINCT u.id, u.name FROM users u JOIN memberships m ON m.user_id = u.id WHERE m.group_id IN (:groupIds) ORDER BY u.name, u.id`,
    { groupIds },
  );
}

export const auditCategoryOptions = AUDIT_CATEGORIES.map((c) => ({ value: c, label: AUDIT_CATEGORY_LABELS[c] }));

export type AuditJsonEvent = {
  id: string;
  at: string;
  actor: string;
  actorId: string | null;
  action: string;
  category: AuditCategory | null;
  targetType: string | null;
  targetId: string | null;
  details: Record<string, unknown>;
  sentence: string;
};

/** One page for the API: raw codes and full details, with the sentence beside them. */
export async function listAuditJson(
  actor: Actor,
  filter: AuditFilter,
  limit: number,
): Promise<{ events: AuditJsonEvent[]; next: string | null } | null> {
  const scope = auditScopeOf(actor);
  if (!scope) return null;
  const { rows, next } = await auditRows(scope, filter, limit);
  const sentences = await describeRows(actor, rows);
  return {
    next,
    events: rows.map((r, i) => ({
      id: r.id,
      at: r.at.toISOString(),
      actor: r.actor_label || r.actor_id || "system",
      actorId: r.actor_id,
      action: r.action,
      category: categoryOf(r.action),
      targetType: r.target_type,
      targetId: r.target_id,
      details: r.details ?? {},
      sentence: plainText(sentences[i]!),
    })),
  };
}

const CSV_HEADER = "id,at,actor,action,target,details,category,sentence";
const CSV_BATCH = 1000;

/**
 * The whole selection as RFC 4180 CSV, streamed a keyset page at a time (bounded memory however
 * long the trail): the raw code and the full details JSON of each event, then its category and
 * sentence. Cells a spreadsheet would run as a formula are prefixed with '.
 */
export function auditCsvStream(actor: Actor, filter: AuditFilter): ReadableStream<Uint8Array> | null {
  const scope = auditScopeOf(actor);
  if (!scope) return null;
  const encoder = new TextEncoder();
  let after: string | undefined = filter.after;
  let started = false;
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      if (!started) {
        started = true;
        controller.enqueue(encoder.encode(`${CSV_HEADER}\r\n`));
      }
      const { rows, next } = await auditRows(scope, { ...filter, after }, CSV_BATCH);
      const sentences = await describeRows(actor, rows);
      const text = rows
        .map(
          (r, i) =>
            csvLine([
              r.id,
              r.at.toISOString(),
              r.actor_label || r.actor_id || "system",
              r.action,
              r.target_type ? `${r.target_type} ${r.target_id ?? ""}`.trim() : "",
              JSON.stringify(r.details ?? {}),
              categoryOf(r.action) ?? "",
              plainText(sentences[i]!),
            ]) + "\r\n",
        )
        .join("");
      if (text) controller.enqueue(encoder.encode(text));
      if (!next) controller.close();
      else after = next;
    },
  });
}
