import type { Transaction } from "sequelize";
import type { AuditAction } from "@/lib/auditTrail/eventKinds";
import { AuditEvent } from "@/models";

export type AuditInput = {
  actorId: string | null;
  actorLabel?: string;
  groupId?: string | null;
  /** A code of lib/auditTrail/eventKinds.ts, so every event written has a category and a sentence. */
  action: AuditAction;
  targetType?: string;
  targetId?: string;
  details?: Record<string, unknown>;
};

/** Appends one event to the audit trail; there is no edit or delete path. */
export async function recordAudit(input: AuditInput, transaction?: Transaction): Promise<void> {
  await AuditEvent.create(
    {
      actorId: input.actorId,
      actorLabel: input.actorLabel ?? "",
      groupId: input.groupId ?? null,
      action: input.action,
      targetType: input.targetType ?? null,
      targetId: input.targetId ?? null,
      details: input.details ?? {},
    },
    { transaction },
  );
}
