// Test people, groups, projects and API tokens, created directly with the models.
import { randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import { ApiToken, Group, Membership, Project, Sample, Series, User } from "@/models";
import type { Role } from "@/models/Membership";
import { hashToken, loadActor, type Actor } from "@/lib/auth/actor";

export const uniq = () => randomBytes(4).toString("hex");

export type Lab = {
  group: Group;
  project: Project;
  user: User;
  token: string;
  actor: Actor;
};

/** A user with an API token. */
export async function createUser(label = "tester"): Promise<{ user: User; token: string }> {
  const u = uniq();
  const user = await User.create({
    email: `${label}-${u}@example.test`,
    name: `${label} ${u}`,
    passwordHash: await bcrypt.hash("test-password", 4),
  });
  const token = `bkt_${randomBytes(24).toString("hex")}`;
  await ApiToken.create({
    userId: user.id,
    name: "tests",
    tokenHash: hashToken(token),
    prefix: token.slice(0, 8),
    lastUsedAt: null,
    revokedAt: null,
  });
  return { user, token };
}

/** A fresh group with one project and one member of the given role, holding an API token. */
export async function createLab(role: Role = "spectroscopist"): Promise<Lab> {
  const u = uniq();
  const group = await Group.create({ name: `Test lab ${u}`, slug: `test-lab-${u}` });
  const project = await Project.create({ groupId: group.id, name: `Doping study ${u}` });
  const { user, token } = await createUser(role);
  await Membership.create({ groupId: group.id, userId: user.id, role });
  const actor = (await loadActor(user.id, "token"))!;
  return { group, project, user, token, actor };
}

/** Adds a member of another role to an existing lab's group. */
export async function addMember(lab: Lab, role: Role): Promise<{ user: User; token: string; actor: Actor }> {
  const { user, token } = await createUser(role);
  await Membership.create({ groupId: lab.group.id, userId: user.id, role });
  return { user, token, actor: (await loadActor(user.id, "token"))! };
}

export async function createSample(lab: Lab, material = "CdSe/ZnS"): Promise<Sample> {
  return Sample.create({ groupId: lab.group.id, projectId: lab.project.id, name: `Batch ${uniq()}`, material, createdBy: lab.user.id });
}

export async function createSeries(lab: Lab): Promise<Series> {
  return Series.create({
    projectId: lab.project.id,
    name: `Titration ${uniq()}`,
    kind: "titration",
    variableName: "added acceptor",
    variableUnit: "equiv",
    createdBy: lab.user.id,
  });
}

export function appUrl(path: string): string {
  const port = process.env.PORT ?? "3010";
  return `http://127.0.0.1:${port}${path}`;
}
