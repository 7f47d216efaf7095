import { selectRows } from "@/lib/db";
import { Op } from "sequelize";
import type { Actor } from "@/lib/auth/actor";
import { readableScope } from "@/lib/auth/access";
import { Project, Series } from "@/models";

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
  const scope = await readableScope(actor);
  const projectIds = [...scope.memberProjectIds, ...scope.sharedProjectIds];
  const or = [];
  if (projectIds.length) or.push({ projectId: { [Op.in]: projectIds } });
  if (scope.sharedSeriesIds.length) or.push({ id: { [Op.in]: scope.sharedSeriesIds } });
  if (or.length === 0) return [];
  const rows = await Series.findAll({ where: { [Op.or]: or }, order: [["createdAt", "DESC"]], limit: 500 });
  const shownProjectIds = [...new Set(rows.map((r) => r.projectId))];
  const projects = new Map(
    (shownProjectIds.length ? await Project.findAll({ where: { id: { [Op.in]: shownProjectIds } }, attributes: ["id", "name"] }) : []).map(
      (p) => [p.id, p],
    ),
  );
  const counts = rows.length
    ? await selectRows<{ series_id: string; n: string }>(
        `SELECT series_id, count(*) AS n FROM spectra WHERE series_id IN (:ids) GROUP BY series_id`,
        { ids: rows.map((r) => r.id) },
      )
    : [];
  const count = new Map(counts.map((c) => [c.series_id, Number(c.n)]));
  const memberProjectIds = new Set(scope.memberProjectIds);
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
