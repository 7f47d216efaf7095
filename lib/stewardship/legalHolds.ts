import type { Actor } from "@/lib/auth/actor";
import { groupOfTarget } from "@/lib/auth/access";
import { refuse } from "@/lib/errors";
import { LegalHold } from "@/models";
import { auditAs, requireStewardOf } from "./stewardGuards";

// Placing and lifting legal holds; what a hold protects is answered in holdOn.ts.

export type HoldTarget = "project" | "series" | "sample" | "spectrum";

export async function placeHold(actor: Actor, input: { targetType: HoldTarget; targetId: string; reason: string }): Promise<void> {
  const groupId = requireStewardOf(actor, await groupOfTarget(input.targetType, input.targetId), "targetId");
  const hold = await LegalHold.create({ groupId, ...input, placedBy: actor.id, liftedBy: null, liftedAt: null });
  await auditAs(actor, groupId, "hold-placed", input.targetType, input.targetId, { holdId: hold.id, reason: input.reason });
}

export async function liftHold(actor: Actor, id: string): Promise<void> {
  const hold = await LegalHold.findByPk(id);
  const groupId = requireStewardOf(actor, hold?.groupId ?? null);
  if (hold!.liftedAt) throw refuse(400, "This hold was already lifted.");
  await hold!.update({ liftedAt: new Date(), liftedBy: actor.id });
  await auditAs(actor, groupId, "hold-lifted", hold!.targetType, hold!.targetId, { holdId: hold!.id, reason: hold!.reason });
}
