import { Op, type WhereOptions } from "sequelize";
import type { Technique } from "@/lib/registry/techniques";
import type { Actor } from "@/lib/auth/actor";
import { readableScope } from "@/lib/auth/access";
import { Project, Sample, Spectrum } from "@/models";

export type SpectrumRow = {
  id: string;
  fileName: string;
  technique: Technique;
  status: string;
  errorMessage: string | null;
  sampleName: string | null;
  projectName: string;
  createdAt: string;
};

export const PAGE_SIZE = 50;

/**
 * Spectra the actor reads: members see their groups' projects; collaborators what is shared,
 * including the supernatant measured for a point of a shared series (as canReadSpectrum allows).
 */
export async function readableSpectrumScope(actor: Actor): Promise<WhereOptions<Spectrum> | null> {
  const scope = await readableScope(actor);
  const allProjects = [...scope.memberProjectIds, ...scope.sharedProjectIds];
  const or: WhereOptions<Spectrum>[] = [];
  if (allProjects.length) or.push({ projectId: { [Op.in]: allProjects } });
  if (scope.sharedSeriesIds.length) {
    or.push({ seriesId: { [Op.in]: scope.sharedSeriesIds } });
    const points = await Spectrum.findAll({ where: { seriesId: { [Op.in]: scope.sharedSeriesIds } }, attributes: ["id"] });
    if (points.length) or.push({ supernatantOfSpectrumId: { [Op.in]: points.map((p) => p.id) } });
  }
  return or.length ? { [Op.or]: or } : null;
}

export async function listSpectra(actor: Actor, options: { page?: number; q?: string; status?: string } = {}) {
  const scope = await readableSpectrumScope(actor);
  if (!scope) return { rows: [] as SpectrumRow[], total: 0, page: 1, pages: 1 };
  const page = Math.max(1, options.page ?? 1);
  const where: WhereOptions<Spectrum>[] = [scope];
  if (options.q) where.push({ fileName: { [Op.iLike]: `%${options.q}%` } });
  if (options.status) where.push({ status: options.status as Spectrum["status"] });
  const { rows, count } = await Spectrum.findAndCountAll({
    where: { [Op.and]: where },
    include: [{ model: Sample, attributes: ["name"] }, { model: Project, attributes: ["name"] }],
    order: [["createdAt", "DESC"]],
    limit: PAGE_SIZE,
    offset: (page - 1) * PAGE_SIZE,
  });
  return {
    rows: rows.map((s) => {
      const joined = s as Spectrum & { Sample?: Sample | null; Project?: Project | null };
      return {
        id: s.id, fileName: s.fileName, technique: s.technique, status: s.status, errorMessage: s.errorMessage,
        sampleName: joined.Sample?.name ?? null, projectName: joined.Project?.name ?? "", createdAt: s.createdAt.toISOString(),
      };
    }),
    total: count,
    page,
    pages: Math.max(1, Math.ceil(count / PAGE_SIZE)),
  };
}
