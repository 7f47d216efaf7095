import { Op } from "sequelize";
import type { Actor } from "@/lib/auth/actor";
import { WRITER_ROLES } from "@/lib/auth/access";
import { Project, models } from "@/models";

export type ProjectChoice = { id: string; name: string; groupId: string; groupName: string };

/** Projects in groups where the actor may add data. */
export async function listProjectChoices(actor: Actor): Promise<ProjectChoice[]> {
  models();
  const writable = actor.memberships.filter((m) => WRITER_ROLES.includes(m.role));
  if (writable.length === 0) return [];
  const rows = await Project.findAll({ where: { groupId: { [Op.in]: writable.map((m) => m.groupId) } }, order: [["name", "ASC"]] });
  const groupName = new Map(writable.map((m) => [m.groupId, m.groupName]));
  return rows.map((p) => ({ id: p.id, name: p.name, groupId: p.groupId, groupName: groupName.get(p.groupId) ?? "" }));
}

