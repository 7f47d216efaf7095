import { DatabaseError } from "sequelize";
import { Spectrum } from "@/models";
import { recordAudit } from "@/lib/audit";
import type { DetailDifference, DetailField } from "./detailDifferences";
import { Refusal } from "@/lib/errors";
import type { IngestContext } from "./prepareIngest";
import { requestReanalysis } from "./requestReanalysis";
import type { ReanalysisInput } from "./parameters";
import { sequelize } from "@/lib/db";

/** Details that enter the analysis: changing one asks for a new run (earlier runs are kept). */
const ANALYSIS_INPUTS = new Set<DetailField>([
  "technique",
  "referenceSpectrumId",
  "pathLengthCm",
  "excitationNm",
  "material",
  "xUnit",
  "yKind",
]);

export type DetailsUpdate = { fields: DetailField[]; reanalysis: { runId: string; created: boolean } | null };

/**
 * A re-upload of stored bytes that asked to update the stored record (`onDuplicate=update`):
 * the details it states differently replace the stored ones in one transaction with an audit
 * event naming each old and new value; when one of them enters the analysis, a new run is
 * requested (earlier runs and their reviews are kept).
 */
export async function updateStoredDetails(
  context: IngestContext,
  spectrum: Spectrum,
  differences: DetailDifference[],
  fileName: string,
): Promise<DetailsUpdate> {
  const m = context.metadata;
  const fields = differences.map((d) => d.field);
  const has = (f: DetailField) => fields.includes(f);
  const change: Partial<Spectrum> = {};
  if (has("technique")) change.technique = m.technique;
  if (has("sampleId")) change.sampleId = context.sample?.id ?? null;
  if (has("seriesId")) change.seriesId = context.series?.id ?? null;
  if (has("seriesValue")) change.seriesValue = m.seriesValue ?? null;
  if (has("referenceSpectrumId")) change.referenceSpectrumId = context.reference?.id ?? null;
  if (has("pathLengthCm")) change.pathLengthCm = m.pathLengthCm ?? null;
  if (has("excitationNm")) change.excitationNm = m.excitationNm ?? null;
  if (has("solvent")) change.solvent = context.solvent;
  if (has("material")) change.material = m.material ?? null;
  if (change.referenceSpectrumId === spectrum.id)
    throw new Refusal(400, "invalid", `${fileName}: a spectrum cannot be its own reference`, "referenceSpectrumId");
  try {
    await sequelize().transaction(async (transaction) => {
      await spectrum.update(change, { transaction });
      await recordAudit(
        {
          actorId: context.actor.id,
          actorLabel: context.actor.email,
          groupId: context.project.groupId,
          action: "spectrum.details-update",
          targetType: "spectrum",
          targetId: spectrum.id,
          details: { fileName, sha256: spectrum.sha256, differences },
        },
        transaction,
      );
    });
  } catch (error) {
    if (error instanceof DatabaseError) {
      // e.g. a supernatant given a series (migrations/0004): the database's rules refuse it; nothing was changed.
      throw new Refusal(
        409,
        "conflict",
        `${fileName}: the stored record cannot take these details (${fields.join(", ")}); nothing was changed`,
      );
    }
    throw error;
  }
  if (!fields.some((f) => ANALYSIS_INPUTS.has(f))) return { fields, reanalysis: null };
  const changes: ReanalysisInput = {};
  if (has("referenceSpectrumId")) changes.referenceSpectrumId = context.reference?.id ?? null;
  if (has("pathLengthCm")) changes.pathLengthCm = m.pathLengthCm ?? null;
  if (has("excitationNm")) changes.excitationNm = m.excitationNm ?? null;
  if (has("material")) changes.material = m.material ?? null;
  if (has("xUnit")) changes.xUnit = m.xUnit ?? null;
  if (has("yKind")) changes.yKind = m.yKind ?? null;
  const run = await requestReanalysis(spectrum.id, changes, context.actor, has("technique") ? { technique: m.technique } : null);
  return { fields, reanalysis: { runId: run.runId, created: run.created } };
}
