import type { Actor } from "@/lib/auth/actor";
import { memberGroupIds } from "@/lib/auth/access";
import { selectRows } from "@/lib/db";

export type DeletionNotice = {
  label: string;
  projectName: string;
  sizeBytes: number;
  sha256: string | null;
  deletedAt: string;
  /** Where the deleted thing went: nowhere recoverable for a spectrum (its object is deleted), only its tombstone stays. */
  recoverable: false;
};

/**
 * What a finished deletion removed, for the banner after it: read from its tombstone, and only
 * for a member of the group that owned it (another group's tombstone id shows nothing).
 */
export async function getDeletionNotice(actor: Actor, tombstoneId: string): Promise<DeletionNotice | null> {
  if (!/^[0-9a-f-]{36}$/i.test(tombstoneId)) return null;
  const groups = memberGroupIds(actor);
  if (!groups.length) return null;
  const [row] = await selectRows<{
    label: string;
    project_name: string | null;
    size_bytes: string;
    sha256: string | null;
    completed_at: Date | null;
  }>(
    `SELECT t.label, p.name AS project_name, t.size_bytes, t.sha256, t.completed_at FROM tombstones t LEFT JOIN projects p ON p.id = t.project_id
     WHERE t.id = :id AND t.state = 'done' AND t.group_id IN (:groups)`,
    { id: tombstoneId, groups },
  );
  if (!row) return null;
  return {
    label: row.label,
    projectName: row.project_name ?? "",
    sizeBytes: Number(row.size_bytes),
    sha256: row.sha256,
    deletedAt: (row.completed_at ?? new Date()).toISOString(),
    recoverable: false,
  };
}
