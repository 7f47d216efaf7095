import { selectRows } from "@/lib/db";
import { Op } from "sequelize";
import type { Actor } from "@/lib/auth/actor";
import { memberGroupIds, sharedTargets } from "@/lib/auth/access";
import { Project, Series, models } from "@/models";

export type SeriesRow = {
  id: string;
  name: string;
  kind: string;
  variable: string;
  projectName: string;
  spectrumCount: number;
  shared: boolean;
};

/** Series the actor reads: those of member projects, of shared projects, and shared one by one. */
export async function listSeries(actor: Actor): Promise<SeriesRow[]> {
  models();
  const groupIds = memberGroupIds(actor);
  const shared = await sharedTargets(actor);
  const memberProjects = groupIds.length ? await Project.findAll({ where: { groupId: { [Op.in]: groupIds } } }) : [];
  const sharedProjects = shared.projectIds.length ? await Project.findAll({ where: { id: { [Op.in]: shared.projectIds } } }) : [];
  const projects = new Map([...memberProjects, ...sharedProjects].map((p) => [p.id, p]));
  const or = [];
  if (projects.size) or.push({ projectId: { [Op.in]: [...projects.keys()] } });
  if (shared.seriesIds.length) or.push({ id: { [Op.in]: shared.seriesIds } });
  if (or.length === 0) return [];
  const rows = await Series.findAll({ where: { [Op.or]: or }, order: [["createdAt", "DESC"]], limit: 500 });
  const missing = rows.map((r) => r.projectId).filter((id) => !projects.has(id));
  if (missing.length) for (const p of await Project.findAll({ where: { id: { [Op.in]: missing } } })) projects.set(p.id, p);
  const counts = rows.length
    ? await selectRows<{ series_id: string; n: string }>(
        `SELECT series_id, count(*) AS n FROM spectra WHERE series_id IN (:ids) GROUP BY series_id`, { ids: rows.map((r) => r.id) },
      )
    : [];
  const count = new Map(counts.map((c) => [c.series_id, Number(c.n)]));
  const memberProjectIds = new Set(memberProjects.map((p) => p.id));
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    kind: r.kind,
    variable: r.variableName ? `${r.variableName}${r.variableUnit ? ` (${r.variableUnit})` : ""}` : "—",
    projectName: projects.get(r.projectId)?.name ?? "",
    spectrumCount: count.get(r.id) ?? 0,
    shared: !memberProjectIds.has(r.projectId),
  }));
}
