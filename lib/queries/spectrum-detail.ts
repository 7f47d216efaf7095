import type { Actor } from "@/lib/auth/actor";
import { canReadSpectrum, canWrite, groupOfSpectrum } from "@/lib/auth/access";
import { hazardsOf, type HazardFlag } from "@/lib/hazards";
import { AnalysisRun, Peak, Project, Sample, Signature, Spectrum, models } from "@/models";

export type SpectrumDetail = {
  id: string;
  fileName: string;
  technique: string;
  status: string;
  errorMessage: string | null;
  sha256: string;
  sizeBytes: number;
  projectName: string;
  createdAt: string;
  acquisition: { label: string; value: string }[];
  sample: { id: string; name: string; material: string; hazards: HazardFlag[] } | null;
  reference: { id: string; fileName: string } | null;
  mayWrite: boolean;
  latestRun: {
    id: string; engineVersion: string; parameterHash: string; parameters: Record<string, unknown>; status: string;
    errorMessage: string | null; noise: number | null; finishedAt: string | null; durationMs: number | null;
    warnings: string[]; derived: Record<string, unknown> | null;
  } | null;
  peaks: { id: string; energyEv: number; wavelengthNm: number; height: number; fwhmMeV: number | null; isFirstExciton: boolean }[];
  signatures: { id: string; kind: string; energyEv: number | null; fraction: number | null; shiftMeV: number | null; significance: number; reviewState: string }[];
  earlierRuns: { id: string; engineVersion: string; status: string; createdAt: string }[];
};

const fmt = (v: number | null, unit: string) => (v === null ? null : `${v} ${unit}`);

export async function getSpectrumDetail(actor: Actor, id: string): Promise<SpectrumDetail | null> {
  models();
  const spectrum = await Spectrum.findByPk(id);
  if (!spectrum || !(await canReadSpectrum(actor, spectrum))) return null;
  const [project, sample, reference, runs, groupId] = await Promise.all([
    Project.findByPk(spectrum.projectId),
    spectrum.sampleId ? Sample.findByPk(spectrum.sampleId) : null,
    spectrum.referenceSpectrumId ? Spectrum.findByPk(spectrum.referenceSpectrumId, { attributes: ["id", "fileName"] }) : null,
    AnalysisRun.findAll({ where: { spectrumId: id }, order: [["createdAt", "DESC"]], attributes: { exclude: ["report"] } }),
    groupOfSpectrum(spectrum),
  ]);
  const latest = runs[0] ?? null;
  const [peaks, signatures, report] = latest
    ? await Promise.all([
        Peak.findAll({ where: { runId: latest.id }, order: [["energyEv", "ASC"]] }),
        Signature.findAll({ where: { runId: latest.id }, order: [["significance", "DESC"]] }),
        AnalysisRun.findByPk(latest.id, { attributes: ["report"] }).then((r) => r?.report as Record<string, unknown> | null),
      ])
    : [[], [], null];
  const acquisition = [
    ["Axis unit", spectrum.axisUnit], ["Value unit", spectrum.valueUnit], ["Path length", fmt(spectrum.pathLengthCm, "cm")],
    ["Excitation", fmt(spectrum.excitationNm, "nm")], ["Slit", fmt(spectrum.slitNm, "nm")], ["Integration", fmt(spectrum.integrationMs, "ms")],
    ["Solvent", spectrum.solvent || null], ["Column", spectrum.columnChoice], ["Series value", spectrum.seriesValue === null ? null : String(spectrum.seriesValue)],
  ].filter((r): r is [string, string] => Boolean(r[1])).map(([label, value]) => ({ label, value }));
  return {
    id: spectrum.id, fileName: spectrum.fileName, technique: spectrum.technique, status: spectrum.status, errorMessage: spectrum.errorMessage,
    sha256: spectrum.sha256, sizeBytes: spectrum.sizeBytes, projectName: project?.name ?? "", createdAt: spectrum.createdAt.toISOString(),
    acquisition,
    sample: sample ? { id: sample.id, name: sample.name, material: sample.material, hazards: hazardsOf(sample) } : null,
    reference: reference ? { id: reference.id, fileName: reference.fileName } : null,
    mayWrite: groupId ? canWrite(actor, groupId) : false,
    latestRun: latest && {
      id: latest.id, engineVersion: latest.engineVersion, parameterHash: latest.parameterHash, parameters: latest.parameters,
      status: latest.status, errorMessage: latest.errorMessage, noise: latest.noise,
      finishedAt: latest.finishedAt?.toISOString() ?? null, durationMs: latest.durationMs,
      warnings: Array.isArray(report?.warnings) ? (report.warnings as unknown[]).map(String) : [],
      derived: (report?.derived as Record<string, unknown> | undefined) ?? null,
    },
    peaks: peaks.map((p) => ({ id: p.id, energyEv: p.energyEv, wavelengthNm: p.wavelengthNm, height: p.height, fwhmMeV: p.fwhmMeV, isFirstExciton: p.isFirstExciton })),
    signatures: signatures.map((s) => ({ id: s.id, kind: s.kind, energyEv: s.energyEv, fraction: s.fraction, shiftMeV: s.shiftMeV, significance: s.significance, reviewState: s.reviewState })),
    earlierRuns: runs.slice(1).map((r) => ({ id: r.id, engineVersion: r.engineVersion, status: r.status, createdAt: r.createdAt.toISOString() })),
  };
}
