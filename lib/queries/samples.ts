import { selectRows } from "@/lib/db";
import { Op } from "sequelize";
import type { Actor } from "@/lib/auth/actor";
import { memberGroupIds } from "@/lib/auth/access";
import { hazardsOf, type HazardFlag } from "@/lib/hazards";
import { Group, Project, Sample, SampleParent, Spectrum, models } from "@/models";

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
    id: s.id, name: s.name, material: s.material, coreShell: s.coreShell, ligand: s.ligand, solvent: s.solvent,
    groupName, projectName, hazards: hazardsOf(s), parentNames, spectrumCount, createdAt: s.createdAt.toISOString(),
  };
}

export async function listSamples(actor: Actor, query = ""): Promise<SampleRow[]> {
  models();
  const groupIds = memberGroupIds(actor);
  if (groupIds.length === 0) return [];
  const where: Record<string | symbol, unknown> = { groupId: { [Op.in]: groupIds } };
  if (query) where[Op.or] = [{ name: { [Op.iLike]: `%${query}%` } }, { material: { [Op.iLike]: `%${query}%` } }];
  const samples = await Sample.findAll({ where, order: [["createdAt", "DESC"]], limit: 500 });
  if (samples.length === 0) return [];
  const ids = samples.map((s) => s.id);
  const [groups, projects, parents, counts] = await Promise.all([
    Group.findAll({ where: { id: { [Op.in]: groupIds } } }),
    Project.findAll({ where: { groupId: { [Op.in]: groupIds } } }),
    selectRows<{ sample_id: string; name: string }>(
      `SELECT sp.sample_id, p.name FROM sample_parents sp JOIN samples p ON p.id = sp.parent_id WHERE sp.sample_id IN (:ids)`, { ids },
    ),
    selectRows<{ sample_id: string; n: string }>(
      `SELECT sample_id, count(*) AS n FROM spectra WHERE sample_id IN (:ids) GROUP BY sample_id`, { ids },
    ),
  ]);
  const groupName = new Map(groups.map((g) => [g.id, g.name]));
  const projectName = new Map(projects.map((p) => [p.id, p.name]));
  const count = new Map(counts.map((c) => [c.sample_id, Number(c.n)]));
  return samples.map((s) =>
    toRow(
      s,
      groupName.get(s.groupId) ?? "",
      s.projectId ? projectName.get(s.projectId) ?? null : null,
      parents.filter((p) => p.sample_id === s.id).map((p) => p.name),
      count.get(s.id) ?? 0,
    ),
  );
}

export type SampleDetail = SampleRow & {
  groupId: string;
  notes: string;
  parents: { id: string; name: string }[];
  children: { id: string; name: string }[];
  spectra: {
    id: string; fileName: string; technique: string; status: string; createdAt: string;
    /** From the latest finished analysis report's `derived` field. */
    derived: { diameterNm: number | null; concentrationMolPerL: number | null; extinctionPerMPerCm: number | null; sizingSource: string | null } | null;
  }[];
};

/** One sample the actor may read as a member, or null (never reveals another group's sample). */
export async function getSample(actor: Actor, id: string): Promise<SampleDetail | null> {
  models();
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
         WHERE r.spectrum_id IN (:ids) AND r.status = 'done' ORDER BY r.spectrum_id, r.created_at DESC`, { ids: spectra.map((s) => s.id) },
      )
    : [];
  const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : null);
  const derivedOf = new Map(derivedRows.map((r) => [r.spectrum_id, r.derived ? {
    diameterNm: num(r.derived.diameterNm), concentrationMolPerL: num(r.derived.concentrationMolPerL),
    extinctionPerMPerCm: num(r.derived.extinctionPerMPerCm), sizingSource: typeof r.derived.sizingSource === "string" ? r.derived.sizingSource : null,
  } : null]));
  const parents = parentLinks.map((l) => ({ id: l.parentId, name: nameOf.get(l.parentId) ?? "" }));
  return {
    ...toRow(sample, group?.name ?? "", project?.name ?? null, parents.map((p) => p.name), spectra.length),
    groupId: sample.groupId,
    notes: sample.notes,
    parents,
    children: childLinks.map((l) => ({ id: l.sampleId, name: nameOf.get(l.sampleId) ?? "" })),
    spectra: spectra.map((s) => ({ id: s.id, fileName: s.fileName, technique: s.technique, status: s.status, createdAt: s.createdAt.toISOString(), derived: derivedOf.get(s.id) ?? null })),
  };
}

/** Samples the actor may pick as parents or attach spectra to, grouped by group. */
export async function listSampleChoices(actor: Actor): Promise<{ id: string; name: string; groupId: string }[]> {
  models();
  const groupIds = memberGroupIds(actor);
  if (groupIds.length === 0) return [];
  const rows = await Sample.findAll({ where: { groupId: { [Op.in]: groupIds } }, attributes: ["id", "name", "groupId"], order: [["name", "ASC"]] });
  return rows.map((r) => ({ id: r.id, name: r.name, groupId: r.groupId }));
}
