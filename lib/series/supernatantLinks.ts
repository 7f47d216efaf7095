import { DatabaseError, UniqueConstraintError } from "sequelize";
import type { Actor } from "@/lib/auth/actor";
import { canReadSeries, canWrite } from "@/lib/auth/access";
import { recordAudit } from "@/lib/audit";
import { Project, Series, Spectrum } from "@/models";
import type { LinkBody } from "./supernatantSchemas";
import { refuse } from "@/lib/errors";
import { sequelize } from "@/lib/db";

/** A refused link or unlink, with the HTTP status it maps to and the field it concerns. */
export type LinkOutcome = {
  supernatantSpectrumId: string;
  /** The point it is now the supernatant of; null after unlinking. */
  pointSpectrumId: string | null;
  previousPointSpectrumId: string | null;
  changed: boolean;
};

/**
 * Says which absorption spectrum is the supernatant of which point of a series (or, with
 * pointSpectrumId null, that it no longer is), with an audit event; one function for the page's
 * actions, the API and the demo seed. Another group's series is not found; a collaborator, steward
 * or anyone else who may read but not add data is refused. The database checks the same rules
 * (migrations/0004), so a race ends in a refusal, not in a wrong link.
 */
/** The series and its group when the actor may link supernatants in it; else the refusal (404 before 403). */
export async function seriesForLinking(actor: Actor, seriesId: string): Promise<{ series: Series; groupId: string }> {
  const series = await Series.findByPk(seriesId);
  if (!series || !(await canReadSeries(actor, series))) throw refuse(404, `series ${seriesId} was not found`);
  const project = await Project.findByPk(series.projectId, { attributes: ["id", "groupId"] });
  if (!project || !canWrite(actor, project.groupId)) {
    throw refuse(403, "Only spectroscopists and leads of the group that owns this series can link supernatant spectra.");
  }
  return { series, groupId: project.groupId };
}

export async function setSupernatantLink(actor: Actor, seriesId: string, input: LinkBody): Promise<LinkOutcome> {
  const db = sequelize();
  const { series, groupId } = await seriesForLinking(actor, seriesId);
  const supernatant = await Spectrum.findByPk(input.supernatantSpectrumId);
  if (!supernatant || supernatant.projectId !== series.projectId) {
    throw refuse(
      404,
      `supernatantSpectrumId: spectrum ${input.supernatantSpectrumId} was not found in this series' project`,
      "supernatantSpectrumId",
    );
  }
  const previous = supernatant.supernatantOfSpectrumId
    ? await Spectrum.findByPk(supernatant.supernatantOfSpectrumId, { attributes: ["id", "seriesId", "fileName"] })
    : null;
  if (previous && previous.seriesId !== series.id) {
    throw refuse(
      409,
      `supernatantSpectrumId: ${supernatant.fileName} is the supernatant of a point of another series; unlink it there first`,
      "supernatantSpectrumId",
    );
  }

  let point: Spectrum | null = null;
  if (input.pointSpectrumId !== null) {
    if (supernatant.technique !== "absorption") {
      throw refuse(
        400,
        `supernatantSpectrumId: ${supernatant.fileName} is a ${supernatant.technique} spectrum; a supernatant must be an absorption spectrum`,
        "supernatantSpectrumId",
      );
    }
    if (supernatant.seriesId !== null) {
      throw refuse(
        400,
        `supernatantSpectrumId: ${supernatant.fileName} is itself a point of a series; upload the supernatant without a series and link it here`,
        "supernatantSpectrumId",
      );
    }
    point = await Spectrum.findByPk(input.pointSpectrumId, { attributes: ["id", "seriesId", "fileName"] });
    if (!point || point.seriesId !== series.id) {
      throw refuse(404, `pointSpectrumId: spectrum ${input.pointSpectrumId} is not a point of this series`, "pointSpectrumId");
    }
    const taken = await Spectrum.findOne({ where: { supernatantOfSpectrumId: point.id }, attributes: ["id", "fileName"] });
    if (taken && taken.id !== supernatant.id) {
      throw refuse(
        409,
        `pointSpectrumId: ${point.fileName} already has ${taken.fileName} as its supernatant; unlink that one first`,
        "pointSpectrumId",
      );
    }
  }

  const outcome: LinkOutcome = {
    supernatantSpectrumId: supernatant.id,
    pointSpectrumId: point?.id ?? null,
    previousPointSpectrumId: previous?.id ?? null,
    changed: (previous?.id ?? null) !== (point?.id ?? null),
  };
  if (!outcome.changed) return outcome;
  try {
    await db.transaction(async (transaction) => {
      await Spectrum.update({ supernatantOfSpectrumId: outcome.pointSpectrumId }, { where: { id: supernatant.id }, transaction });
      await recordAudit(
        {
          actorId: actor.id,
          actorLabel: actor.email,
          groupId,
          action: point ? "supernatant-linked" : "supernatant-unlinked",
          targetType: "spectrum",
          targetId: supernatant.id,
          details: {
            seriesId: series.id,
            pointSpectrumId: outcome.pointSpectrumId,
            previousPointSpectrumId: outcome.previousPointSpectrumId,
            fileName: supernatant.fileName,
          },
        },
        transaction,
      );
    });
  } catch (error) {
    if (error instanceof UniqueConstraintError || (error instanceof DatabaseError && /supernatant/.test(error.message))) {
      throw refuse(409, "pointSpectrumId: the point or the supernatant changed while linking; reload and try again", "pointSpectrumId");
    }
    throw error;
  }
  return outcome;
}
