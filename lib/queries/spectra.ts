import type { Actor } from "@/lib/auth/actor";
import type { Technique } from "@/lib/registry/techniques";
import { readableScope } from "@/lib/auth/access";
import { selectRows } from "@/lib/db";
import { HC_EV_NM } from "@/lib/search/bandRangeEv";
import { fastCount, type CountSql, type FastCount } from "@/lib/search/fastCount";
import { cursorAtSql, decodeCursor, encodeCursor } from "@/lib/search/keysetCursor";
import { spectrumFilterSql } from "@/lib/search/spectrumFilterSql";
import type { SpectrumSearch } from "@/lib/search/spectrumSearchQuery";

export type SpectrumRow = {
  id: string;
  fileName: string;
  technique: Technique;
  status: string;
  errorMessage: string | null;
  sampleId: string | null;
  sampleName: string | null;
  projectId: string;
  projectName: string;
  uploaderName: string | null;
  /** First exciton of the latest finished analysis, when it found one. */
  firstExcitonNm: number | null;
  /** Diameter from the sizing curve of the latest finished analysis, when it gave one. */
  diameterNm: number | null;
  createdAt: string;
};

export type SpectrumPage = {
  rows: SpectrumRow[];
  /** Cursor of the next (older) page, or null on the last page. */
  next: string | null;
  count: FastCount;
};

type Row = {
  id: string;
  file_name: string;
  technique: Technique;
  status: string;
  error_message: string | null;
  sample_id: string | null;
  sample_name: string | null;
  project_id: string;
  project_name: string;
  uploader_name: string | null;
  first_exciton_nm: number | null;
  diameter_nm: number | null;
  created_at: Date;
  cursor_at: string;
};

/**
 * The SQL of one page of spectra and of its count, for readable projects and shared series.
 * Keyset paging: each readable project (and shared series) contributes at most a page from its
 * (scope, created_at, id) index and the pieces are merged, so a page costs the same on the first
 * page and the ten-thousandth. Pure, so tests can EXPLAIN exactly what the app runs.
 */
export function spectrumListSql(scope: { projectIds: string[]; seriesIds: string[]; pointIds?: string[] }, search: SpectrumSearch) {
  const { projectIds, seriesIds } = scope;
  // supernatants measured for points of a shared series (canReadSpectrum lets their readers open them)
  const pointIds = scope.pointIds ?? [];
  const filter = spectrumFilterSql(search);
  const params: Record<string, unknown> = { ...filter.params, projectIds, seriesIds, pointIds, limit: search.limit + 1 };
  const sampleJoin = filter.needsSample ? "LEFT JOIN samples sm ON sm.id = s.sample_id" : "";
  const conditions = [...filter.conditions];
  const position = search.after ? decodeCursor(search.after) : null;
  const pageConditions = [...conditions];
  if (position) {
    pageConditions.push("(s.created_at, s.id) < (CAST(:afterAt AS timestamptz), CAST(:afterId AS uuid))");
    Object.assign(params, { afterAt: position.at, afterId: position.id });
  }
  const piece = (column: "project_id" | "series_id" | "supernatant_of_spectrum_id", ids: string, where: string[], tail: string) => `
    SELECT h.id, h.created_at FROM unnest(ARRAY[${ids}]::uuid[]) AS scope(id)
    CROSS JOIN LATERAL (
      SELECT s.id, s.created_at FROM spectra s ${sampleJoin}
      WHERE s.${column} = scope.id${where.map((c) => ` AND ${c}`).join("")}
      ${tail}
    ) h`;
  const piecesOf = (where: string[], tail: string) => [
    ...(projectIds.length ? [piece("project_id", ":projectIds", where, tail)] : []),
    ...(seriesIds.length ? [piece("series_id", ":seriesIds", where, tail)] : []),
    ...(pointIds.length ? [piece("supernatant_of_spectrum_id", ":pointIds", where, tail)] : []),
  ];
  const pieces = piecesOf(pageConditions, "ORDER BY s.created_at DESC, s.id DESC LIMIT :limit");
  const scopeOr = [
    ...(projectIds.length ? ["s.project_id IN (:projectIds)"] : []),
    ...(seriesIds.length ? ["s.series_id IN (:seriesIds)"] : []),
    ...(pointIds.length ? ["s.supernatant_of_spectrum_id IN (:pointIds)"] : []),
  ].join(" OR ");
  // counted through the same per-project index ranges (any order), each stopping at the cap
  const count: CountSql = {
    rowsSql: `SELECT DISTINCT id FROM (${piecesOf(conditions, "LIMIT :countLimit").join(" UNION ALL ")}) counted`,
    estimateSql: `SELECT 1 FROM spectra s ${sampleJoin} WHERE (${scopeOr})${conditions.map((c) => ` AND ${c}`).join("")}`,
  };

  const listSql = `WITH page AS (
         SELECT DISTINCT id, created_at FROM (${pieces.join(" UNION ALL ")}) merged
         ORDER BY created_at DESC, id DESC LIMIT :limit
       )
       SELECT s.id, s.file_name, s.technique, s.status, s.error_message, s.sample_id, sm.name AS sample_name,
              s.project_id, p.name AS project_name, u.name AS uploader_name, ${HC_EV_NM} / s.first_exciton_ev AS first_exciton_nm,
              s.diameter_nm, s.created_at, ${cursorAtSql("s.created_at")} AS cursor_at
       FROM page JOIN spectra s ON s.id = page.id
       JOIN projects p ON p.id = s.project_id
       LEFT JOIN samples sm ON sm.id = s.sample_id
       LEFT JOIN users u ON u.id = s.uploaded_by
       ORDER BY s.created_at DESC, s.id DESC`;
  return { listSql, count, params };
}

const EMPTY: SpectrumPage = { rows: [], next: null, count: { value: 0, exact: true } };

/**
 * One page of the spectra the actor reads (its groups' projects, projects and series shared
 * with it), newest first, narrowed by the search, with a count that stays fast (fastCount).
 * Null when the search names a project the actor does not read as a whole (a member's or one
 * shared as a project; answered as not found).
 */
export async function listSpectra(actor: Actor, search: SpectrumSearch): Promise<SpectrumPage | null> {
  const scope = await readableScope(actor);
  const readable = [...new Set([...scope.memberProjectIds, ...scope.sharedProjectIds])];
  const seriesIds = scope.sharedSeriesIds;
  if (search.project && !readable.includes(search.project)) return null;
  // a project filter narrows the index ranges walked to that project's
  const projectIds = search.project ? [search.project] : readable;
  if (projectIds.length === 0 && seriesIds.length === 0) return EMPTY;

  const pointIds = seriesIds.length
    ? (await selectRows<{ id: string }>("SELECT id FROM spectra WHERE series_id IN (:seriesIds)", { seriesIds })).map((r) => r.id)
    : [];
  const { listSql, count, params } = spectrumListSql({ projectIds, seriesIds, pointIds }, search);
  const [rows, total] = await Promise.all([selectRows<Row>(listSql, params), fastCount(count, params)]);
  const shown = rows.slice(0, search.limit);
  const last = shown[shown.length - 1];
  return {
    rows: shown.map(toRow),
    next: rows.length > search.limit && last ? encodeCursor({ at: last.cursor_at, id: last.id }) : null,
    count: total,
  };
}

function toRow(r: Row): SpectrumRow {
  return {
    id: r.id,
    fileName: r.file_name,
    technique: r.technique,
    status: r.status,
    errorMessage: r.error_message,
    sampleId: r.sample_id,
    sampleName: r.sample_name,
    projectId: r.project_id,
    projectName: r.project_name,
    uploaderName: r.uploader_name,
    firstExcitonNm: r.first_exciton_nm,
    diameterNm: r.diameter_nm,
    createdAt: new Date(r.created_at).toISOString(),
  };
}
