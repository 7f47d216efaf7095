import { Project, Sample, Series, Spectrum } from "@/models";
import type { Actor } from "@/lib/auth/actor";
import { canReadProject, canWrite } from "@/lib/auth/access";
import { ingestMetadataSchema, type IngestMetadata, type IngestMetadataInput } from "./metadata";
import { columnChoice, materialFromText, type AnalysisParameters } from "./parameters";
import { Refusal } from "@/lib/errors";

/** What one batch of files shares: the checked metadata, the project and the analysis parameters. */
export type IngestContext = {
  actor: Actor;
  project: Project;
  metadata: IngestMetadata;
  sample: Sample | null;
  series: Series | null;
  reference: Spectrum | null;
  parameters: AnalysisParameters;
  solvent: string;
};

function firstIssue(error: { issues: { path: PropertyKey[]; message: string }[] }): Refusal {
  const issue = error.issues[0];
  const field = issue?.path.map(String).join(".") || undefined;
  const message = issue
    ? issue.message.startsWith(field ?? "\u0000")
      ? issue.message
      : `${field ? `${field}: ` : ""}${issue.message}`
    : "invalid metadata";
  return new Refusal(400, "invalid", message, field);
}

/**
 * Validates the metadata of a batch, checks that the actor may write to the project's
 * group, and loads the sample, series and reference it names (each must belong to the
 * same group, the series to the same project).
 */
export async function prepareIngest(actor: Actor, input: IngestMetadataInput | Record<string, unknown>): Promise<IngestContext> {
  const parsed = ingestMetadataSchema.safeParse(input);
  if (!parsed.success) throw firstIssue(parsed.error);
  const metadata = parsed.data;
  const project = await Project.findByPk(metadata.projectId);
  if (!project || !(await canReadProject(actor, project))) {
    throw new Refusal(404, "not-found", `project ${metadata.projectId} was not found`, "projectId");
  }
  if (!canWrite(actor, project.groupId)) {
    throw new Refusal(403, "forbidden", `you may not add spectra to project "${project.name}"`, "projectId");
  }
  let sample: Sample | null = null;
  if (metadata.sampleId) {
    sample = await Sample.findByPk(metadata.sampleId);
    if (!sample || sample.groupId !== project.groupId) {
      throw new Refusal(400, "invalid", `sampleId: sample ${metadata.sampleId} was not found in this project's group`, "sampleId");
    }
  }
  let series: Series | null = null;
  if (metadata.seriesId) {
    series = await Series.findByPk(metadata.seriesId);
    if (!series || series.projectId !== project.id) {
      throw new Refusal(400, "invalid", `seriesId: series ${metadata.seriesId} was not found in this project`, "seriesId");
    }
  }
  let reference: Spectrum | null = null;
  if (metadata.referenceSpectrumId) {
    reference = await Spectrum.findByPk(metadata.referenceSpectrumId);
    const refProject = reference ? await Project.findByPk(reference.projectId, { attributes: ["groupId"] }) : null;
    if (!reference || refProject?.groupId !== project.groupId) {
      throw new Refusal(
        400,
        "invalid",
        `referenceSpectrumId: spectrum ${metadata.referenceSpectrumId} was not found in this project's group`,
        "referenceSpectrumId",
      );
    }
  }
  const parameters: AnalysisParameters = { technique: metadata.technique };
  const column = columnChoice(metadata.column);
  if (column !== undefined) parameters.column = column;
  for (const key of ["block", "pair", "sheet", "xUnit", "yKind"] as const) {
    if (metadata[key] !== undefined) (parameters as Record<string, unknown>)[key] = metadata[key];
  }
  const material = metadata.material ?? materialFromText(sample?.material);
  if (material) parameters.material = material;
  if (metadata.pathLengthCm !== undefined) parameters.pathLengthCm = metadata.pathLengthCm;
  if (metadata.excitationNm !== undefined) parameters.excitationNm = metadata.excitationNm;
  return { actor, project, metadata, sample, series, reference, parameters, solvent: metadata.solvent ?? sample?.solvent ?? "" };
}
