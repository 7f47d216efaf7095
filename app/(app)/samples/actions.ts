"use server";

import { Op, UniqueConstraintError } from "sequelize";
import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { protectedAction } from "@/lib/actions/protected";
import { canWrite } from "@/lib/auth/access";
import { recordAudit } from "@/lib/audit";
import { hazardClassOf } from "@/lib/hazards";
import { Project, Sample, SampleParent } from "@/models";
import { refuse } from "@/lib/errors";
import { sequelize } from "@/lib/db";

const text = (max: number) => z.string().trim().max(max, `At most ${max} characters.`);

const sampleSchema = z.object({
  groupId: z.string().uuid("Choose a group."),
  projectId: z.union([z.literal(""), z.string().uuid()]).transform((v) => v || null),
  name: text(200).min(1, "Give the batch a name."),
  material: text(100).min(1, "Name the material, for example CdSe or PbS."),
  coreShell: text(200).default(""),
  ligand: text(200).default(""),
  solvent: text(100).default(""),
  notes: text(4000).default(""),
  parentIds: z
    .union([z.string(), z.array(z.string())])
    .optional()
    .transform((v) => (v === undefined ? [] : Array.isArray(v) ? v : [v]).filter(Boolean))
    .pipe(z.array(z.string().uuid("A parent sample is not valid.")).max(10, "At most 10 parents.")),
});

export const registerSample = protectedAction(sampleSchema, async (input, actor) => {
  if (!canWrite(actor, input.groupId))
    throw refuse(400, "Only spectroscopists and group leads of this group can register samples.", "groupId");
  const db = sequelize();
  if (input.projectId) {
    const project = await Project.findByPk(input.projectId);
    if (!project || project.groupId !== input.groupId) throw refuse(400, "That project is not in the chosen group.", "projectId");
  }
  if (input.parentIds.length) {
    const found = await Sample.count({ where: { id: { [Op.in]: input.parentIds }, groupId: input.groupId } });
    if (found !== new Set(input.parentIds).size) throw refuse(400, "Every parent must be a sample of the same group.", "parentIds");
  }
  let id: string;
  try {
    id = await db.transaction(async (transaction) => {
      const sample = await Sample.create({ ...input, hazardClass: hazardClassOf(input), createdBy: actor.id }, { transaction });
      await SampleParent.bulkCreate(
        [...new Set(input.parentIds)].map((parentId) => ({ sampleId: sample.id, parentId })),
        { transaction },
      );
      await recordAudit(
        {
          actorId: actor.id,
          actorLabel: actor.email,
          groupId: input.groupId,
          action: "sample-registered",
          targetType: "sample",
          targetId: sample.id,
          details: { name: sample.name, material: sample.material },
        },
        transaction,
      );
      return sample.id;
    });
  } catch (error) {
    if (error instanceof UniqueConstraintError) throw refuse(400, `A sample named "${input.name}" already exists in this group.`, "name");
    throw error;
  }
  revalidatePath("/samples");
  redirect(`/samples/${id}`);
});
