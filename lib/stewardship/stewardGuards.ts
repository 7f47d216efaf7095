import type { Actor } from "@/lib/auth/actor";
import { canManageMembers, canSteward } from "@/lib/auth/access";
import { recordAudit } from "@/lib/audit";
import type { AuditAction } from "@/lib/auditTrail/eventKinds";
import { refuse } from "@/lib/errors";

// The checks every stewardship write starts with. Another group's ids are answered as
// "not found", so a refusal tells nothing about what exists elsewhere.

const NOT_STEWARDED = "Not found, or not in a group you steward.";
const NOT_MANAGED = "Not found, or not a group whose members you manage.";

/** The group, when the actor is its data steward; else a refusal (naming `field` when given). */
export function requireStewardOf(actor: Actor, groupId: string | null, field?: string): string {
  if (!groupId || !canSteward(actor, groupId)) throw refuse(400, NOT_STEWARDED, field);
  return groupId;
}

/** The group, when the actor manages its members (lead or steward); else a refusal. */
export function requireManagerOf(actor: Actor, groupId: string | null, field?: string): string {
  if (!groupId || !canManageMembers(actor, groupId)) throw refuse(400, NOT_MANAGED, field);
  return groupId;
}

/** Records a stewardship event in the group's audit trail, as the actor. */
export function auditAs(
  actor: Actor,
  groupId: string,
  action: AuditAction,
  targetType: string,
  targetId: string,
  details: Record<string, unknown> = {},
) {
  return recordAudit({ actorId: actor.id, actorLabel: actor.email, groupId, action, targetType, targetId, details });
}
