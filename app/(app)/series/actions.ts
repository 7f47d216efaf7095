"use server";

import { UniqueConstraintError } from "sequelize";
import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { protectedAction } from "@/lib/actions/protected";
import type { Actor } from "@/lib/auth/actor";
import { canWrite } from "@/lib/auth/access";
import { recordAudit } from "@/lib/audit";
import { setSupernatantLink } from "@/lib/series/supernatantLinks";
import { Project, Series } from "@/models";
import { SERIES_KINDS } from "@/models/Series";
import { refuse } from "@/lib/errors";

const plain = (label: string, max: number) =>
  z
    .string()
    .trim()
    .max(max, `${label} must be at most ${max} characters`)
    .refine((s) => !/[<>\u0000-\u001f]/.test(s), `${label} must be plain text`);

const seriesSchema = z.object({
  projectId: z.string().uuid("Choose a project."),
  name: plain("Name", 200).pipe(z.string().min(1, "Give the series a name.")),
  kind: z.enum(SERIES_KINDS, { error: "Choose titration, shell thickness, time or other." }),
  variableName: plain("Variable", 100).pipe(z.string().min(1, "Name the variable, for example PbS per CdSe.")),
  variableUnit: plain("Unit", 40).default(""),
});

/** Creates a series (spectroscopists and leads of the project's group). */
export const createSeries = protectedAction(seriesSchema, async (input, actor) => {
  const project = await Project.findByPk(input.projectId);
  if (!project || !canWrite(actor, project.groupId)) throw refuse(400, "Choose a project of a group where you may add data.", "projectId");
  let id: string;
  try {
    const series = await Series.create({ ...input, createdBy: actor.id });
    id = series.id;
    await recordAudit({
      actorId: actor.id,
      actorLabel: actor.email,
      groupId: project.groupId,
      action: "series-created",
      targetType: "series",
      targetId: id,
      details: { name: input.name, kind: input.kind },
    });
  } catch (error) {
    if (error instanceof UniqueConstraintError) throw refuse(400, `A series named "${input.name}" already exists in this project.`, "name");
    throw error;
  }
  revalidatePath("/series");
  redirect(`/series/${id}`);
});

const linkSchema = z.object({
  seriesId: z.string().uuid("The series id is not valid."),
  pointSpectrumId: z.string().uuid("Choose the point whose supernatant this is."),
  supernatantSpectrumId: z.string().uuid("Choose the supernatant spectrum."),
});
const unlinkSchema = linkSchema.omit({ pointSpectrumId: true });

async function changeLink(seriesId: string, supernatantSpectrumId: string, pointSpectrumId: string | null, actor: Actor) {
  const outcome = await setSupernatantLink(actor, seriesId, { supernatantSpectrumId, pointSpectrumId });
  revalidatePath(`/series/${seriesId}`);
  return outcome;
}

/** Links an absorption spectrum as the supernatant of one point of a titration (spectroscopists and leads). */
export const linkSupernatant = protectedAction(linkSchema, async (input, actor) => {
  const outcome = await changeLink(input.seriesId, input.supernatantSpectrumId, input.pointSpectrumId, actor);
  return { ok: true, message: outcome.changed ? "Supernatant linked." : "That supernatant was already linked to this point." };
});

/** Unlinks a supernatant spectrum from its point; the spectrum itself stays. */
export const unlinkSupernatant = protectedAction(unlinkSchema, async (input, actor) => {
  await changeLink(input.seriesId, input.supernatantSpectrumId, null, actor);
  return { ok: true, message: "Supernatant unlinked." };
});
