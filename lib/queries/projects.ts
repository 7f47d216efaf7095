import { Op } from "sequelize";
import type { Actor } from "@/lib/auth/actor";
import { stewardGroupIds, writerGroupIds } from "@/lib/auth/access";
import { Project } from "@/models";

/** A project offered in a form or listed by the API, with its group's name. */
export type ProjectChoice = { id: string; name: string; groupId: string; groupName: string };

/** What the actor wants to do with the project: add data to it, or set its retention. */
export type ProjectPurpose = "write" | "steward";

const GROUPS_FOR: Record<ProjectPurpose, (actor: Actor) => string[]> = {
  write: writerGroupIds,
  steward: stewardGroupIds,
};

/** Projects, by name, in the groups where the actor's role allows the purpose. */
export async function listProjectChoices(actor: Actor, purpose: ProjectPurpose): Promise<ProjectChoice[]> {
  const groupIds = GROUPS_FOR[purpose](actor);
  if (groupIds.length === 0) return [];
  const rows = await Project.findAll({ where: { groupId: { [Op.in]: groupIds } }, order: [["name", "ASC"]] });
  const groupName = new Map(actor.memberships.map((m) => [m.groupId, m.groupName]));
  return rows.map((p) => ({ id: p.id, name: p.name, groupId: p.groupId, groupName: groupName.get(p.groupId) ?? "" }));
}
