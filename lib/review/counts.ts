import { selectRows } from "@/lib/db";

/**
 * The one rule for which signatures count: those of each spectrum's newest finished run. A
 * signature that a newer run replaced carries `superseded_at` (workers/saveAnalysis.ts) and
 * leaves the queue, the Overview, the navigation badge, the digest and the API at once.
 * Use with the signatures table aliased `g`.
 */
export const CURRENT_SIGNATURE = "g.superseded_at IS NULL";

/** Signatures awaiting review in each of the given groups, from the newest runs only. */
export async function awaitingReviewCounts(groupIds: readonly string[]): Promise<{ total: number; byGroup: Map<string, number> }> {
  if (groupIds.length === 0) return { total: 0, byGroup: new Map() };
  const rows = await selectRows<{ group_id: string; n: string }>(
    `SELECT p.group_id, count(*) AS n FROM signatures g JOIN spectra s ON s.id = g.spectrum_id JOIN projects p ON p.id = s.project_id
      WHERE p.group_id IN (:groupIds) AND ${CURRENT_SIGNATURE} AND g.review_state = 'awaiting' GROUP BY p.group_id`,
    { groupIds: [...groupIds] },
  );
  const byGroup = new Map(rows.map((r) => [r.group_id, Number(r.n)]));
  return { total: [...byGroup.values()].reduce((a, b) => a + b, 0), byGroup };
}
