import { selectRows } from "@/lib/db";
import { Op } from "sequelize";
import type { Actor } from "@/lib/auth/actor";
import { memberGroupIds } from "@/lib/auth/access";
import { hazardsOf, type HazardFlag } from "@/lib/hazards";
import { Group, Project, Sample, SampleParent, Spectrum } from "@/models";
import { fastCount, type CountSql, type FastCount } from "@/lib/search/fastCount";
import { cursorAtSql, decodeCursor, encodeCursor } from "@/lib/search/keysetCursor";
import { containsPattern } from "@/lib/search/spectrumFilterSql";

export type SampleRow = {
  id: string;
  name: string;
  material: string;
  coreShell: string;
  ligand: string;
  solvent: string;
  groupName: string;
  projectName: string | null;
  hazards: HazardFlag[];
  parentNames: string[];
  spectrumCount: number;
  createdAt: string;
};

function toRow(s: Sample, groupName: string, projectName: string | null, parentNames: string[], spectrumCount: number): SampleRow {
  return {
    id: s.id,
    name: s.name,
    material: s.material,
    coreShell: s.coreShell,
    ligand: s.ligand,
    solvent: s.solvent,
    groupName,
    projectName,
    hazards: hazardsOf(s),
    parentNames,
    spectrumCount,
    createdAt: s.createdAt.toISOString(),
  };
}

export const SAMPLE_PAGE_SIZE = 50;

export type SamplePage = {
  rows: SampleRow[];
  /** Cursor of the next (older) page, or null on the last page. */
  next: string | null;
  count: FastCount;
};

/**
 * The SQL of one page of samples of the given groups, newest first, and of its count: one keyset
 * range per group over samples (group_id, created_at DESC, id DESC), merged, so page 1 000 costs
 * what page 1 costs. `q` matches the name or material (any case). Pure, so tests can EXPLAIN it.
 */
export function samplePageSql(groupIds: string[], options: { q?: string; after?: string; limit?: number }) {
  const limit = options.limit ?? SAMPLE_PAGE_SIZE;
  const conditions: string[] = [];
  const params: Record<string, unknown> = { groupIds, limit: limit + 1 };
  if (options.q) {
    conditions.push("(x.name ILIKE :pattern OR x.material ILIKE :pattern)");
    params.pattern = containsPattern(options.q);
  }
  const position = options.after ? decodeCursor(options.after) : null;
  const pageConditions = [...conditions];
  if (position) {
    pageConditions.push("(x.created_at, x.id) < (CAST(:afterAt AS timestamptz), CAST(:afterId AS uuid))");
    Object.assign(params, { afterAt: position.at, afterId: position.id });
  }
  const pieces = (where: string[], tail: string) => `SELECT h.id, h.created_at FROM unnest(ARRAY[:groupIds]::uuid[]) AS scope(id)
    CROSS JOIN LATERAL (SELECT x.id, x.created_at FROM samples x WHERE x.group_id = scope.id${where.map((c) => ` AND ${c}`).join("")} ${tail}) h`;
  const listSql = `SELECT id, ${cursorAtSql("created_at")} AS cursor_at FROM (${pieces(pageConditions, "ORDER BY x.created_at DESC, x.id DESC LIMIT :limit")}) merged
    ORDER BY created_at DESC, id DESC LIMIT :limit`;
  const count: CountSql = {
    rowsSql: pieces(conditions, "LIMIT :countLimit"),
    estimateSql: `SELECT 1 FROM samples x WHERE x.group_id IN (:groupIds)${conditions.map((c) => ` AND ${c}`).join("")}`,
  };
  return { listSql, count, params, limit };
}

/** One page of the samples of the actor's groups, newest first, with a count that stays fast. */
export async function listSamples(actor: Actor, options: { q?: string; after?: string } = {}): Promise<SamplePage> {
  const groupIds = memberGroupIds(actor);
  if (groupIds.length === 0) return { rows: [], next: null, count: { value: 0, exact: true } };
  const { listSql, count: countSql, params, limit } = samplePageSql(groupIds, options);
  const [page, count] = await Promise.all([selectRows<{ id: string; cursor_at: string }>(listSql, params), fastCount(countSql, params)]);
  const shown = page.slice(0, limit);
  const last = shown[shown.length - 1];
  const next = page.length > limit && last ? encodeCursor({ at: last.cursor_at, id: last.id }) : null;
  if (shown.length === 0) return { rows: [], next, count };
  const ids = shown.map((r) => r.id);
  const [samples, groups, projects, parents, counts] = await Promise.all([
    Sample.findAll({ where: { id: { [Op.in]: ids } } }),
    Group.findAll({ where: { id: { [Op.in]: groupIds } } }),
    selectRows<{ id: string; name: string }>(
      `SELECT p.id, p.name FROM projects p WHERE p.id IN (SELECT project_id FROM samples WHERE id IN (:ids))`,
      { ids },
    ),
    selectRows<{ sample_id: string; name: string }>(
      `SELECT sp.sample_id, p.name FROM sample_parents sp JOIN samples p ON p.id = sp.parent_id WHERE sp.sample_id IN (:ids)`,
      { ids },
    ),
    selectRows<{ sample_id: string; n: string }>(
      `SELECT sample_id, count(*) AS n FROM spectra WHERE sample_id IN (:ids) GROUP BY sample_id`,
      { ids },
    ),
  ]);
  const byId = new Map(samples.map((x) => [x.id, x]));
  const groupName = new Map(groups.map((g) => [g.id, g.name]));
  const projectName = new Map(projects.map((p) => [p.id, p.name]));
  const spectrumCount = new Map(counts.map((c) => [c.sample_id, Number(c.n)]));
  const rows = ids.flatMap((id) => {
    const x = byId.get(id);
    if (!x) return [];
    const parentNames = parents.filter((p) => p.sample_id === id).map((p) => p.name);
    return [
      toRow(
        x,
        groupName.get(x.groupId) ?? "",
        x.projectId ? (projectName.get(x.projectId) ?? null) : null,
        parentNames,
        spectrumCount.get(id) ?? 0,
      ),
    ];
  });
  return { rows, next, count };
}

export type SampleDetail = SampleRow & {
  groupId: string;
  notes: string;
  parents: { id: string; name: string }[];
  children: { id: string; name: string }[];
  spectra: {
    id: string;
    fileName: string;
    technique: string;
    status: string;
    createdAt: string;
    /** From the latest finished analysis report's `derived` field. */
    derived: {
      diameterNm: number | null;
      concentrationMolPerL: number | null;
      extinctionPerMPerCm: number | null;
      sizingSource: string | null;
    } | null;
  }[];
};

/** One sample the actor may read as a member, or null (never reveals another group's sample). */
export async function getSample(actor: Actor, id: string): Promise<SampleDetail | null> {
  const sample = await Sample.findByPk(id);
  if (!sample || !memberGroupIds(actor).includes(sample.groupId)) return null;
  const [group, project, parentLinks, childLinks, spectra] = await Promise.all([
    Group.findByPk(sample.groupId),
    sample.projectId ? Project.findByPk(sample.projectId) : null,
    SampleParent.findAll({ where: { sampleId: id } }),
    SampleParent.findAll({ where: { parentId: id } }),
    Spectrum.findAll({ where: { sampleId: id }, order: [["createdAt", "DESC"]], limit: 200 }),
  ]);
  const related = await Sample.findAll({
    where: { id: { [Op.in]: [...parentLinks.map((l) => l.parentId), ...childLinks.map((l) => l.sampleId)] } },
    attributes: ["id", "name"],
  });
  const nameOf = new Map(related.map((r) => [r.id, r.name]));
  const derivedRows = spectra.length
    ? await selectRows<{ spectrum_id: string; derived: Record<string, unknown> | null }>(
        `SELECT DISTINCT ON (r.spectrum_id) r.spectrum_id, r.report->'derived' AS derived FROM analysis_runs r
         WHERE r.spectrum_id IN (:ids) AND r.status = 'done' ORDER BY r.spectrum_id, r.created_at DESC`,
        { ids: spectra.map((s) => s.id) },
      )
    : [];
  const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : null);
  const derivedOf = new Map(
    derivedRows.map((r) => [
      r.spectrum_id,
      r.derived
        ? {
            diameterNm: num(r.derived.diameterNm),
            concentrationMolPerL: num(r.derived.concentrationMolPerL),
            extinctionPerMPerCm: num(r.derived.extinctionPerMPerCm),
            sizingSource: typeof r.derived.sizingSource === "string" ? r.derived.sizingSource : null,
          }
        : null,
    ]),
  );
  const parents = parentLinks.map((l) => ({ id: l.parentId, name: nameOf.get(l.parentId) ?? "" }));
  return {
    ...toRow(
      sample,
      group?.name ?? "",
      project?.name ?? null,
      parents.map((p) => p.name),
      spectra.length,
    ),
    groupId: sample.groupId,
    notes: sample.notes,
    parents,
    children: childLinks.map((l) => ({ id: l.sampleId, name: nameOf.get(l.sampleId) ?? "" })),
    spectra: spectra.map((s) => ({
      id: s.id,
      fileName: s.fileName,
      technique: s.technique,
      status: s.status,
      createdAt: s.createdAt.toISOString(),
      derived: derivedOf.get(s.id) ?? null,
    })),
  };
}

/** Samples the actor may pick as parents or attach spectra to, grouped by group. */
export async function listSampleChoices(actor: Actor): Promise<{ id: string; name: string; groupId: string }[]> {
  const groupIds = memberGroupIds(actor);
  if (groupIds.length === 0) return [];
  const rows = await Sample.findAll({
    where: { groupId: { [Op.in]: groupIds } },
    attributes: ["id", "name", "groupId"],
    order: [["name", "ASC"]],
  });
  return rows.map((r) => ({ id: r.id, name: r.name, groupId: r.groupId }));
}
