import { listParentCandidates, parentSampleIds } from "@/lib/queries/parentChoices";
import { listProjectChoices, type ProjectChoice } from "@/lib/queries/projects";
import type { ParentCandidate } from "@/lib/parents/orderParentChoices";
import { Op } from "sequelize";
import { AnalysisRun, Peak, Sample, Series, Signature, Spectrum } from "@/models";
import type { Actor } from "@/lib/auth/actor";
import { canReadSeries, canReadSpectrum, groupOfSpectrum, memberGroupIds } from "@/lib/auth/access";
import type { AnalysisReport } from "@/lib/engine";
import { isUuid } from "@/lib/ids";

// Reads behind the scripts' API and the upload page, reshaped into the JSON they serve.

export type PeakView = {
  energyEv: number;
  wavelengthNm: number;
  height: number;
  fwhmMeV: number | null;
  area: number | null;
  firstExciton: boolean;
};
export type FlagView = {
  id: string;
  kind: string;
  energyEv: number | null;
  fraction: number | null;
  shiftMeV: number | null;
  magnitude: number | null;
  unit: string | null;
  uncertainty: number | null;
  significance: number;
  /** Members of the owning group only; null for a collaborator (review state is the group's own business). */
  reviewState: string | null;
  message: string | null;
};
export type AnalysisView = {
  runId: string;
  status: AnalysisRun["status"];
  engineVersion: string;
  parameterHash: string;
  parameters: Record<string, unknown>;
  referenceSpectrumId: string | null;
  error: string | null;
  noise: number | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  durationMs: number | null;
  peaks: PeakView[];
  firstExciton: { energyEv: number; wavelengthNm: number; fwhmMeV: number | null } | null;
  flags: FlagView[];
  derived: AnalysisReport["derived"] | null;
  warnings: string[];
};
export type SpectrumView = {
  id: string;
  projectId: string;
  sampleId: string | null;
  seriesId: string | null;
  seriesValue: number | null;
  referenceSpectrumId: string | null;
  technique: string;
  fileName: string;
  sha256: string;
  sizeBytes: number;
  contentType: string;
  solvent: string;
  pathLengthCm: number | null;
  excitationNm: number | null;
  axisUnit: string | null;
  valueUnit: string | null;
  status: Spectrum["status"];
  error: string | null;
  createdAt: string;
  updatedAt: string;
  rawUrl: string;
};

const iso = (d: Date | null) => (d ? d.toISOString() : null);

export function spectrumView(s: Spectrum): SpectrumView {
  return {
    id: s.id,
    projectId: s.projectId,
    sampleId: s.sampleId,
    seriesId: s.seriesId,
    seriesValue: s.seriesValue,
    referenceSpectrumId: s.referenceSpectrumId,
    technique: s.technique,
    fileName: s.fileName,
    sha256: s.sha256,
    sizeBytes: s.sizeBytes,
    contentType: s.contentType,
    solvent: s.solvent,
    pathLengthCm: s.pathLengthCm,
    excitationNm: s.excitationNm,
    axisUnit: s.axisUnit,
    valueUnit: s.valueUnit,
    status: s.status,
    error: s.errorMessage,
    createdAt: s.createdAt.toISOString(),
    updatedAt: s.updatedAt.toISOString(),
    rawUrl: `/api/v1/spectra/${s.id}/raw`,
  };
}

async function analysisView(run: AnalysisRun, showReview: boolean): Promise<AnalysisView> {
  const [peaks, signatures] = await Promise.all([
    Peak.findAll({ where: { runId: run.id }, order: [["energyEv", "ASC"]] }),
    Signature.findAll({ where: { runId: run.id }, order: [["significance", "DESC"]] }),
  ]);
  const report = run.report as AnalysisReport | null;
  const fe = report?.firstExciton ?? null;
  return {
    runId: run.id,
    status: run.status,
    engineVersion: run.engineVersion,
    parameterHash: run.parameterHash,
    parameters: run.parameters,
    referenceSpectrumId: run.referenceSpectrumId,
    error: run.errorMessage,
    noise: run.noise,
    createdAt: run.createdAt.toISOString(),
    startedAt: iso(run.startedAt),
    finishedAt: iso(run.finishedAt),
    durationMs: run.durationMs,
    peaks: peaks.map((p) => ({
      energyEv: p.energyEv,
      wavelengthNm: p.wavelengthNm,
      height: p.height,
      fwhmMeV: p.fwhmMeV,
      area: p.area,
      firstExciton: p.isFirstExciton,
    })),
    firstExciton: fe ? { energyEv: fe.energyEv, wavelengthNm: fe.wavelengthNm, fwhmMeV: fe.fwhmMeV } : null,
    flags: signatures.map((f) => ({
      id: f.id,
      kind: f.kind,
      energyEv: f.energyEv,
      fraction: f.fraction,
      shiftMeV: f.shiftMeV,
      magnitude: f.magnitude,
      unit: f.unit,
      uncertainty: f.uncertainty,
      significance: f.significance,
      reviewState: showReview ? f.reviewState : null,
      message: typeof f.details?.message === "string" ? f.details.message : null,
    })),
    derived: report?.derived ?? null,
    warnings: report?.warnings ?? [],
  };
}

/** A spectrum the actor may read, with its latest analysis and the list of its runs; null when not found or not readable. */
export async function getSpectrumStatus(actor: Actor, id: string) {
  if (!isUuid(id)) return null;
  const spectrum = await Spectrum.findByPk(id);
  if (!spectrum || !(await canReadSpectrum(actor, spectrum))) return null;
  const runs = await AnalysisRun.findAll({ where: { spectrumId: id }, order: [["createdAt", "DESC"]] });
  return {
    spectrum: spectrumView(spectrum),
    analysis: runs[0] ? await analysisView(runs[0], memberGroupIds(actor).includes((await groupOfSpectrum(spectrum)) ?? "")) : null,
    runs: runs.map((r) => ({
      id: r.id,
      status: r.status,
      engineVersion: r.engineVersion,
      parameterHash: r.parameterHash,
      createdAt: r.createdAt.toISOString(),
    })),
  };
}

/** The spectrum row for a raw download, when the actor may read it. */
export async function getReadableSpectrum(actor: Actor, id: string): Promise<Spectrum | null> {
  if (!isUuid(id)) return null;
  const spectrum = await Spectrum.findByPk(id);
  return spectrum && (await canReadSpectrum(actor, spectrum)) ? spectrum : null;
}

function strongest(report: AnalysisReport | null, kind: string) {
  const flags = (report?.flags ?? []).filter((f) => f.kind === kind);
  flags.sort((a, b) => b.significance - a.significance);
  return flags[0] ?? null;
}

/** A series the actor may read, with each spectrum's status and key numbers from its latest analysis. */
export async function getSeriesStatus(actor: Actor, id: string) {
  if (!isUuid(id)) return null;
  const series = await Series.findByPk(id);
  if (!series || !(await canReadSeries(actor, series))) return null;
  const spectra = await Spectrum.findAll({
    where: { seriesId: id },
    order: [
      ["seriesValue", "ASC"],
      ["createdAt", "ASC"],
    ],
  });
  const runs = spectra.length
    ? await AnalysisRun.findAll({ where: { spectrumId: { [Op.in]: spectra.map((s) => s.id) } }, order: [["createdAt", "DESC"]] })
    : [];
  const latest = new Map<string, AnalysisRun>();
  for (const r of runs) if (!latest.has(r.spectrumId)) latest.set(r.spectrumId, r);
  return {
    series: {
      id: series.id,
      projectId: series.projectId,
      name: series.name,
      kind: series.kind,
      variableName: series.variableName,
      variableUnit: series.variableUnit,
    },
    spectra: spectra.map((s) => {
      const run = latest.get(s.id);
      const report = run?.status === "done" ? (run.report as AnalysisReport | null) : null;
      const fe = report?.firstExciton ?? null;
      return {
        id: s.id,
        fileName: s.fileName,
        technique: s.technique,
        seriesValue: s.seriesValue,
        status: s.status,
        error: s.errorMessage,
        runId: run?.id ?? null,
        firstExciton: fe ? { energyEv: fe.energyEv, wavelengthNm: fe.wavelengthNm, fwhmMeV: fe.fwhmMeV } : null,
        bleachFraction: strongest(report, "bleach")?.fraction ?? null,
        quenchFraction: strongest(report, "pl-quench")?.fraction ?? null,
        shiftMeV: strongest(report, "shift")?.shiftMeV ?? null,
        flagCount: report?.flags.length ?? 0,
        diameterNm: report?.derived?.diameterNm ?? null,
      };
    }),
  };
}

export type UploadChoices = {
  projects: (ProjectChoice & {
    samples: { id: string; name: string; material: string; coreShell: string; solvent: string; parentIds: string[] }[];
    series: { id: string; name: string; variableName: string; variableUnit: string }[];
    /** Candidate parent references (analysed spectra only), ordered per sample by components/parents/ParentPicker. */
    references: ParentCandidate[];
  })[];
};

/** Everything the upload form offers: writable projects with their samples, series and candidate reference spectra. */
export async function getUploadChoices(actor: Actor): Promise<UploadChoices> {
  const projects = await listProjectChoices(actor, "write");
  if (projects.length === 0) return { projects: [] };
  const groupIds = [...new Set(projects.map((p) => p.groupId))];
  const projectIds = projects.map((p) => p.id);
  const [samples, series, references] = await Promise.all([
    Sample.findAll({ where: { groupId: { [Op.in]: groupIds } }, order: [["name", "ASC"]], limit: 2000 }),
    Series.findAll({ where: { projectId: { [Op.in]: projectIds } }, order: [["name", "ASC"]] }),
    listParentCandidates(projectIds),
  ]);
  const parents = await parentSampleIds(samples.map((s) => s.id));
  return {
    projects: projects.map((p) => ({
      ...p,
      samples: samples
        .filter((s) => s.groupId === p.groupId && (s.projectId === null || s.projectId === p.id))
        .map((s) => ({
          id: s.id,
          name: s.name,
          material: s.material,
          coreShell: s.coreShell,
          solvent: s.solvent,
          parentIds: parents.get(s.id) ?? [],
        })),
      series: series
        .filter((s) => s.projectId === p.id)
        .map((s) => ({ id: s.id, name: s.name, variableName: s.variableName, variableUnit: s.variableUnit })),
      references: references.get(p.id) ?? [],
    })),
  };
}
