import { Op, type WhereOptions } from "sequelize";
import { csvDocument, csvLine } from "@/lib/formats/csv";
import { z } from "zod";
import type { Actor } from "@/lib/auth/actor";
import { AuditEvent, models } from "@/models";

export type AuditRow = { id: string; at: string; actor: string; action: string; target: string; details: string };

const day = z.string().trim().regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date as YYYY-MM-DD.").refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), "Not a real date.");

/** The filter of the audit page and its CSV export; every field optional, each error names its field. */
export const auditFilterSchema = z.object({
  action: z.string().trim().max(60, "action: at most 60 characters.").optional().transform((v) => v || undefined),
  actor: z.string().trim().max(200, "actor: at most 200 characters.").optional().transform((v) => v || undefined),
  target: z.string().trim().max(200, "target: at most 200 characters.").optional().transform((v) => v || undefined),
  from: day.optional().or(z.literal("").transform(() => undefined)),
  to: day.optional().or(z.literal("").transform(() => undefined)),
}).refine((f) => !f.from || !f.to || f.from <= f.to, { message: "to: the end date comes before the start date.", path: ["to"] });

export type AuditFilter = Partial<z.infer<typeof auditFilterSchema>> & { limit?: number };

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/**
 * Audit events of the groups the actor stewards. Personal events (no group: sign-ins with
 * their address, API tokens by name) belong to their person: a steward sees their own, a
 * site admin sees everyone's. A person who is also in another group, or a collaborator with
 * a share, does not show their sign-ins to that group's stewards.
 */
export async function listAuditEvents(actor: Actor, filter: AuditFilter = {}): Promise<AuditRow[]> {
  models();
  const groupIds = actor.memberships.filter((m) => m.role === "steward").map((m) => m.groupId);
  if (groupIds.length === 0) return [];
  const personal: WhereOptions = actor.isSiteAdmin ? { groupId: null } : { groupId: null, actorId: actor.id };
  const conditions: WhereOptions[] = [{ [Op.or]: [{ groupId: { [Op.in]: groupIds } }, personal] }];
  if (filter.action) conditions.push({ action: filter.action });
  if (filter.actor) conditions.push({ actorLabel: { [Op.iLike]: `%${escapeLike(filter.actor)}%` } });
  if (filter.target) {
    const t = filter.target;
    conditions.push({ [Op.or]: [{ targetId: t }, { targetType: t }, ...(/^[0-9a-f-]{8,36}$/i.test(t) ? [{ targetId: { [Op.iLike]: `${escapeLike(t)}%` } }] : [])] });
  }
  if (filter.from) conditions.push({ at: { [Op.gte]: new Date(`${filter.from}T00:00:00Z`) } });
  if (filter.to) conditions.push({ at: { [Op.lt]: new Date(new Date(`${filter.to}T00:00:00Z`).getTime() + 86_400_000) } });
  const rows = await AuditEvent.findAll({ where: { [Op.and]: conditions }, order: [["at", "DESC"], ["id", "DESC"]], limit: filter.limit ?? 200 });
  return rows.map((r) => ({
    id: String(r.id), at: r.at.toISOString(), actor: r.actorLabel || r.actorId || "system", action: r.action,
    target: r.targetType ? `${r.targetType} ${r.targetId ?? ""}`.trim() : "", details: JSON.stringify(r.details),
  }));
}

/** Distinct action names seen in the actor's groups, for the filter's suggestions. */
export async function auditActions(actor: Actor): Promise<string[]> {
  models();
  const groupIds = actor.memberships.filter((m) => m.role === "steward").map((m) => m.groupId);
  if (!groupIds.length) return [];
  const rows = await AuditEvent.findAll({ where: { groupId: { [Op.in]: groupIds } }, attributes: ["action"], group: ["action"], order: [["action", "ASC"]] });
  return [...new Set(["sign-in", ...rows.map((r) => r.action)])].sort();
}

/** RFC 4180 CSV; cells that a spreadsheet would run as a formula are prefixed with '. */
export function auditCsv(rows: AuditRow[]): string {
  return csvDocument(["id,at,actor,action,target,details", ...rows.map((r) => csvLine([r.id, r.at, r.actor, r.action, r.target, r.details]))]);
}
