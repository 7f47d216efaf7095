import { selectRows } from "@/lib/db";
import { BAND_ROLE_LABELS, TECHNIQUE_SPECS, type BandRole, type Technique } from "@/lib/registry/techniques";
import { xUnitLabel, yUnitLabel } from "@/lib/format/unitLabels";
import type { FlagKind } from "@/lib/registry/flagKinds";
import type { Actor } from "@/lib/auth/actor";
import { canReadSpectrum, canWrite, groupOfSpectrum, memberGroupIds } from "@/lib/auth/access";
import { hazardsOf, type HazardFlag } from "@/lib/hazards";
import { AnalysisRun, Peak, Project, Sample, Signature, Spectrum, User } from "@/models";

export type RunSummary = {
  id: string;
  engineVersion: string;
  parameterHash: string;
  parameters: Record<string, unknown>;
  status: string;
  errorMessage: string | null;
  noise: number | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  durationMs: number | null;
  requestedBy: string | null;
  referenceSpectrumId: string | null;
};

export type SpectrumDetail = {
  id: string;
  fileName: string;
  technique: Technique;
  status: string;
  errorMessage: string | null;
  sha256: string;
  sizeBytes: number;
  projectName: string;
  createdAt: string;
  acquisition: { label: string; value: string }[];
  sample: {
    id: string;
    name: string;
    material: string;
    coreShell: string;
    ligand: string;
    solvent: string;
    hazards: HazardFlag[];
    parents: { id: string; name: string; material: string }[];
  } | null;
  reference: { id: string; fileName: string } | null;
  /** Set when this is the supernatant measured for a point of a titration series. */
  supernatantOf: { spectrumId: string; fileName: string; seriesId: string; seriesName: string } | null;
  mayWrite: boolean;
  /** The most recent run, whatever its state (a re-run may be waiting or running). */
  latestRun: (RunSummary & { warnings: string[]; derived: Record<string, unknown> | null }) | null;
  /** The most recent finished run: the one the chart, peaks and flags show. */
  shownRun: (RunSummary & { warnings: string[]; derived: Record<string, unknown> | null; report: ReportParameters | null }) | null;
  /** Peaks of the shown run; every peak of a spectrum has its technique's band role (lib/engine/analyzeSpectrum.ts). */
  peaks: {
    id: string;
    energyEv: number;
    wavelengthNm: number;
    height: number;
    fwhmMeV: number | null;
    area: number | null;
    isFirstExciton: boolean;
    bandRole: BandRole;
  }[];
  signatures: {
    id: string;
    kind: FlagKind;
    energyEv: number | null;
    wavelengthNm: number | null;
    fraction: number | null;
    shiftMeV: number | null;
    fwhmChangeMeV: number | null;
    magnitude: number | null;
    unit: string | null;
    uncertainty: number | null;
    significance: number;
    message: string | null;
    intraband: boolean;
    /** What the flagged band is (new-band and band-change flags), when the engine said. */
    bandRole: BandRole | null;
    /** FWHM of the band under the flag, meV, when measured. */
    widthMeV: number | null;
    /** Members of the owning group only; null for a collaborator. */
    reviewState: string | null;
  }[];
  /** Every run but the latest, newest first, kept for provenance. */
  earlierRuns: RunSummary[];
};

/** The parameters an analysis actually used (from its report), for the provenance panel and the re-run form. */
export type ReportParameters = {
  windowSize: number | null;
  derivativeWindowSize: number | null;
  polynomial: number | null;
  baseline: string | null;
  normalization: string | null;
  /** The same in a few words, for the re-run form's "keep" choice. */
  normalizationBrief: string | null;
  thresholds: Record<string, number>;
  gridPoints: number | null;
  stepMeV: number | null;
  excitationNm: number | null;
  pathLengthCm: number | null;
  material: string | null;
};

const fmt = (v: number | null, unit: string) => (v === null ? null : `${v} ${unit}`);
const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : null);

function reportParameters(report: Record<string, unknown> | null): ReportParameters | null {
  const p = report?.parameters as Record<string, Record<string, unknown> | number | string | null> | undefined;
  if (!p) return null;
  const sm = (p.smoothing ?? {}) as Record<string, unknown>;
  const grid = (p.grid ?? {}) as Record<string, unknown>;
  const norm = (p.normalization ?? {}) as Record<string, unknown>;
  const thresholds = Object.fromEntries(
    Object.entries((p.thresholds ?? {}) as Record<string, unknown>).filter(([, v]) => typeof v === "number"),
  ) as Record<string, number>;
  let normalization: string | null = null;
  let normalizationBrief: string | null = null;
  const factor = `× ${Number(norm.factor).toPrecision(4)}`;
  if (norm.mode === "wavelength") {
    normalization = `scaled to the reference at ${num(norm.wavelengthNm)} nm (${factor})`;
    normalizationBrief = `at ${num(norm.wavelengthNm)} nm, ${factor}`;
  } else if (norm.mode === "concentration") {
    normalization = `by concentration, sample ${num(norm.sampleConcentration)} : reference ${num(norm.referenceConcentration)} (${factor})`;
    normalizationBrief = `by concentration, ${factor}`;
  } else if (norm.mode) normalization = normalizationBrief = "none";
  return {
    windowSize: num(sm.windowSize),
    derivativeWindowSize: num(sm.derivativeWindowSize),
    polynomial: num(sm.polynomial),
    baseline:
      typeof (p.baseline as Record<string, unknown> | null)?.mode === "string"
        ? `${(p.baseline as Record<string, unknown>).mode}${(p.baseline as Record<string, unknown>).applied ? "" : " (not applied)"}`
        : null,
    normalization,
    normalizationBrief,
    thresholds,
    gridPoints: num(grid.points),
    stepMeV: num(grid.stepMeV),
    excitationNm: num(p.excitationNm),
    pathLengthCm: num(p.pathLengthCm),
    material: typeof p.material === "string" ? p.material : null,
  };
}

export async function getSpectrumDetail(actor: Actor, id: string): Promise<SpectrumDetail | null> {
  const spectrum = await Spectrum.findByPk(id);
  if (!spectrum || !(await canReadSpectrum(actor, spectrum))) return null;
  const [project, sample, reference, runs, groupId, point] = await Promise.all([
    Project.findByPk(spectrum.projectId),
    spectrum.sampleId
      ? Sample.findByPk(spectrum.sampleId, { include: [{ model: Sample, as: "parents", attributes: ["id", "name", "material"] }] })
      : null,
    spectrum.referenceSpectrumId ? Spectrum.findByPk(spectrum.referenceSpectrumId, { attributes: ["id", "fileName"] }) : null,
    AnalysisRun.findAll({ where: { spectrumId: id }, order: [["createdAt", "DESC"]], attributes: { exclude: ["report"] } }),
    groupOfSpectrum(spectrum),
    // the point is in the same project (the database checks it), so whoever reads this reads it
    spectrum.supernatantOfSpectrumId
      ? selectRows<{ id: string; file_name: string; series_id: string; series_name: string }>(
          "SELECT p.id, p.file_name, p.series_id, se.name AS series_name FROM spectra p JOIN series se ON se.id = p.series_id WHERE p.id = :id",
          { id: spectrum.supernatantOfSpectrumId },
        ).then((rows) => rows[0] ?? null)
      : null,
  ]);
  const latest = runs[0] ?? null;
  const shown = runs.find((r) => r.status === "done") ?? null;
  const requesterIds = [...new Set(runs.map((r) => r.requestedBy).filter((v): v is string => Boolean(v)))];
  const [peaks, signatures, reports, requesters] = await Promise.all([
    shown ? Peak.findAll({ where: { runId: shown.id }, order: [["energyEv", "ASC"]] }) : [],
    shown ? Signature.findAll({ where: { runId: shown.id }, order: [["significance", "DESC"]] }) : [],
    AnalysisRun.findAll({ where: { id: [latest?.id, shown?.id].filter((v): v is string => Boolean(v)) }, attributes: ["id", "report"] }),
    requesterIds.length ? User.findAll({ where: { id: requesterIds }, attributes: ["id", "name"] }) : [],
  ]);
  const reportOf = (runId: string | undefined) => (reports.find((r) => r.id === runId)?.report as Record<string, unknown> | null) ?? null;
  const nameOf = (userId: string | null) => (userId ? (requesters.find((u) => u.id === userId)?.name ?? "someone") : null);
  const summary = (r: AnalysisRun): RunSummary => ({
    id: r.id,
    engineVersion: r.engineVersion,
    parameterHash: r.parameterHash,
    parameters: r.parameters,
    status: r.status,
    errorMessage: r.errorMessage,
    noise: r.noise,
    createdAt: r.createdAt.toISOString(),
    startedAt: r.startedAt?.toISOString() ?? null,
    finishedAt: r.finishedAt?.toISOString() ?? null,
    durationMs: r.durationMs,
    requestedBy: nameOf(r.requestedBy),
    referenceSpectrumId: r.referenceSpectrumId,
  });
  const withReport = (r: AnalysisRun) => {
    const report = reportOf(r.id);
    return {
      ...summary(r),
      warnings: Array.isArray(report?.warnings) ? (report.warnings as unknown[]).map(String) : [],
      derived: (report?.derived as Record<string, unknown> | undefined) ?? null,
    };
  };
  const acquisition = [
    ["Axis unit", spectrum.axisUnit ? xUnitLabel(spectrum.axisUnit) : null],
    ["Value unit", spectrum.valueUnit ? yUnitLabel(spectrum.valueUnit) : null],
    ["Path length", fmt(spectrum.pathLengthCm, "cm")],
    ["Excitation", fmt(spectrum.excitationNm, "nm")],
    ["Slit", fmt(spectrum.slitNm, "nm")],
    ["Integration", fmt(spectrum.integrationMs, "ms")],
    ["Solvent", spectrum.solvent || null],
    ["Column", spectrum.columnChoice],
    ["Series value", spectrum.seriesValue === null ? null : String(spectrum.seriesValue)],
  ]
    .filter((r): r is [string, string] => Boolean(r[1]))
    .map(([label, value]) => ({ label, value }));
  const parents = ((sample as unknown as { parents?: Sample[] } | null)?.parents ?? []).map((p) => ({
    id: p.id,
    name: p.name,
    material: p.material,
  }));
  return {
    id: spectrum.id,
    fileName: spectrum.fileName,
    technique: spectrum.technique,
    status: spectrum.status,
    errorMessage: spectrum.errorMessage,
    sha256: spectrum.sha256,
    sizeBytes: spectrum.sizeBytes,
    projectName: project?.name ?? "",
    createdAt: spectrum.createdAt.toISOString(),
    acquisition,
    sample: sample
      ? {
          id: sample.id,
          name: sample.name,
          material: sample.material,
          coreShell: sample.coreShell ?? "",
          ligand: sample.ligand ?? "",
          solvent: sample.solvent ?? "",
          hazards: hazardsOf(sample),
          parents,
        }
      : null,
    reference: reference ? { id: reference.id, fileName: reference.fileName } : null,
    supernatantOf: point
      ? { spectrumId: point.id, fileName: point.file_name, seriesId: point.series_id, seriesName: point.series_name }
      : null,
    mayWrite: groupId ? canWrite(actor, groupId) : false,
    latestRun: latest && withReport(latest),
    shownRun: shown && { ...withReport(shown), report: reportParameters(reportOf(shown.id)) },
    peaks: peaks.map((p) => ({
      id: p.id,
      energyEv: p.energyEv,
      wavelengthNm: p.wavelengthNm,
      height: p.height,
      fwhmMeV: p.fwhmMeV,
      area: p.area,
      isFirstExciton: p.isFirstExciton,
      bandRole: TECHNIQUE_SPECS[spectrum.technique].bandRole,
    })),
    signatures: signatures.map((s) => {
      const d = (s.details ?? {}) as Record<string, unknown>;
      return {
        id: s.id,
        kind: s.kind,
        energyEv: s.energyEv,
        wavelengthNm: num(d.wavelengthNm),
        fraction: s.fraction,
        shiftMeV: s.shiftMeV,
        fwhmChangeMeV: num(d.fwhmChangeMeV),
        magnitude: s.magnitude,
        unit: s.unit,
        uncertainty: s.uncertainty,
        significance: s.significance,
        message: typeof d.message === "string" ? d.message : null,
        intraband: d.intraband === true,
        bandRole:
          typeof d.bandRole === "string" && Object.hasOwn(BAND_ROLE_LABELS, d.bandRole)
            ? (d.bandRole as BandRole)
            : d.intraband === true
              ? "intraband-candidate"
              : null,
        widthMeV: num(d.widthMeV),
        reviewState: groupId && memberGroupIds(actor).includes(groupId) ? s.reviewState : null,
      };
    }),
    earlierRuns: runs.slice(1).map(summary),
  };
}
