import { Op } from "sequelize";
import type { Actor } from "@/lib/auth/actor";
import { AuditEvent, Membership, models } from "@/models";

export type AuditRow = { id: string; at: string; actor: string; action: string; target: string; details: string };

/** Audit events of the groups the actor stewards, and sign-ins of their members. */
export async function listAuditEvents(actor: Actor, filter: { action?: string; limit?: number } = {}): Promise<AuditRow[]> {
  models();
  const groupIds = actor.memberships.filter((m) => m.role === "steward").map((m) => m.groupId);
  if (groupIds.length === 0) return [];
  const memberIds = (await Membership.findAll({ where: { groupId: { [Op.in]: groupIds } }, attributes: ["userId"] })).map((m) => m.userId);
  const where = {
    [Op.and]: [
      { [Op.or]: [{ groupId: { [Op.in]: groupIds } }, { groupId: null, actorId: { [Op.in]: memberIds } }] },
      ...(filter.action ? [{ action: filter.action }] : []),
    ],
  };
  const rows = await AuditEvent.findAll({ where, order: [["at", "DESC"], ["id", "DESC"]], limit: filter.limit ?? 200 });
  return rows.map((r) => ({
    id: String(r.id), at: r.at.toISOString(), actor: r.actorLabel || r.actorId || "system", action: r.action,
    target: r.targetType ? `${r.targetType} ${r.targetId ?? ""}`.trim() : "", details: JSON.stringify(r.details),
  }));
}
