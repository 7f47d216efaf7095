import { ImportProfile, Project } from "@/models";
import type { Actor } from "@/lib/auth/actor";
import { canReadProject, canWrite } from "@/lib/auth/access";
import { recordAudit } from "@/lib/audit";
import { Refusal } from "@/lib/errors";
import { profileChoiceSchema, saveProfileSchema, type ProfileChoice } from "./profileChoice";
import { sequelize } from "@/lib/db";

export type ImportProfileView = { id: string; name: string; choice: ProfileChoice; signature: string; updatedAt: string };

const view = (p: ImportProfile): ImportProfileView => ({
  id: p.id,
  name: p.name,
  choice: profileChoiceSchema.parse(p.choice),
  signature: p.signature,
  updatedAt: p.updatedAt.toISOString(),
});

/** The project, when the actor may add spectra to it (profiles belong to people who upload). */
export async function writableProject(actor: Actor, projectId: string): Promise<Project> {
  const project = /^[0-9a-f-]{36}$/i.test(projectId) ? await Project.findByPk(projectId) : null;
  if (!project || !(await canReadProject(actor, project)))
    throw new Refusal(404, "not-found", `project ${projectId} was not found`, "projectId");
  if (!canWrite(actor, project.groupId))
    throw new Refusal(403, "forbidden", `you may not add spectra or import profiles to project "${project.name}"`, "projectId");
  return project;
}

export async function listImportProfiles(actor: Actor, projectId: string): Promise<ImportProfileView[]> {
  const project = await writableProject(actor, projectId);
  const rows = await ImportProfile.findAll({ where: { projectId: project.id }, order: [["name", "ASC"]] });
  return rows.map(view);
}

function firstIssue(error: { issues: { path: PropertyKey[]; message: string }[] }): Refusal {
  const issue = error.issues[0];
  const field = issue?.path.map(String).join(".") || undefined;
  return new Refusal(400, "invalid", `${field ? `${field}: ` : ""}${issue?.message ?? "invalid profile"}`, field);
}

/** Saves a named profile (saving a name again replaces it), audited. */
export async function saveImportProfile(
  actor: Actor,
  projectId: string,
  input: unknown,
): Promise<{ profile: ImportProfileView; created: boolean }> {
  const parsed = saveProfileSchema.safeParse(input);
  if (!parsed.success) throw firstIssue(parsed.error);
  const project = await writableProject(actor, projectId);
  const { name, choice, signature } = parsed.data;
  return sequelize().transaction(async (transaction) => {
    const existing = await ImportProfile.findOne({ where: { projectId: project.id, name }, lock: transaction.LOCK.UPDATE, transaction });
    const profile = existing
      ? await existing.update({ choice, signature, updatedAt: new Date() }, { transaction })
      : await ImportProfile.create({ projectId: project.id, name, choice, signature, createdBy: actor.id }, { transaction });
    await recordAudit(
      {
        actorId: actor.id,
        actorLabel: actor.email,
        groupId: project.groupId,
        action: existing ? "import-profile.replace" : "import-profile.create",
        targetType: "import-profile",
        targetId: profile.id,
        details: { projectId: project.id, name, choice },
      },
      transaction,
    );
    return { profile: view(profile), created: !existing };
  });
}

export async function deleteImportProfile(actor: Actor, projectId: string, profileId: string): Promise<void> {
  const project = await writableProject(actor, projectId);
  const profile = /^[0-9a-f-]{36}$/i.test(profileId)
    ? await ImportProfile.findOne({ where: { id: profileId, projectId: project.id } })
    : null;
  if (!profile) throw new Refusal(404, "not-found", `import profile ${profileId} was not found in this project`);
  await sequelize().transaction(async (transaction) => {
    await profile.destroy({ transaction });
    await recordAudit(
      {
        actorId: actor.id,
        actorLabel: actor.email,
        groupId: project.groupId,
        action: "import-profile.delete",
        targetType: "import-profile",
        targetId: profile.id,
        details: { projectId: project.id, name: profile.name, choice: profile.choice },
      },
      transaction,
    );
  });
}

/** A profile named explicitly; an unknown name is refused on the `profile` field. */
export async function profileByName(projectId: string, name: string): Promise<ImportProfile> {
  const profile = await ImportProfile.findOne({ where: { projectId, name } });
  if (!profile) throw new Refusal(400, "invalid", `profile: no import profile named "${name}" in this project`, "profile");
  return profile;
}

/** The profile matching a file's header signature: the most recently saved of those with the same signature. */
export async function profileForSignature(projectId: string, signature: string): Promise<ImportProfile | null> {
  return ImportProfile.findOne({
    where: { projectId, signature },
    order: [
      ["updatedAt", "DESC"],
      ["name", "ASC"],
    ],
  });
}

export async function projectHasProfiles(projectId: string): Promise<boolean> {
  return (await ImportProfile.count({ where: { projectId } })) > 0;
}
