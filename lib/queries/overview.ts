import { selectRows } from "@/lib/db";
import type { FlagKind } from "@/lib/registry/flagKinds";
import type { Actor } from "@/lib/auth/actor";
import { memberGroupIds } from "@/lib/auth/access";
import { CURRENT_SIGNATURE, awaitingReviewCounts } from "@/lib/review/counts";

export type Overview = {
  spectraByStatus: Record<string, number>;
  awaitingSignatures: number;
  samples: number;
  series: number;
  recentSignatures: {
    id: string;
    kind: FlagKind;
    technique: string;
    significance: number;
    spectrumId: string;
    fileName: string;
    createdAt: string;
  }[];
};

export async function getOverview(actor: Actor): Promise<Overview | null> {
  const groupIds = memberGroupIds(actor);
  if (groupIds.length === 0) return null;
  const replacements = { groupIds };
  const [statusRows, counts, recent, awaiting] = await Promise.all([
    selectRows<{ status: string; n: string }>(
      `SELECT s.status, count(*) AS n FROM spectra s JOIN projects p ON p.id = s.project_id
       WHERE p.group_id IN (:groupIds) GROUP BY s.status`,
      replacements,
    ),
    selectRows<{ samples: string; series: string }>(
      `SELECT
         (SELECT count(*) FROM samples WHERE group_id IN (:groupIds)) AS samples,
         (SELECT count(*) FROM series r JOIN projects p ON p.id = r.project_id WHERE p.group_id IN (:groupIds)) AS series`,
      replacements,
    ),
    selectRows<{
      id: string;
      kind: FlagKind;
      technique: string;
      significance: number;
      spectrum_id: string;
      file_name: string;
      created_at: Date;
    }>(
      `SELECT g.id, g.kind, s.technique, g.significance, g.spectrum_id, s.file_name, g.created_at
       FROM signatures g JOIN spectra s ON s.id = g.spectrum_id JOIN projects p ON p.id = s.project_id
       WHERE p.group_id IN (:groupIds) AND ${CURRENT_SIGNATURE} ORDER BY g.created_at DESC LIMIT 8`,
      replacements,
    ),
    awaitingReviewCounts(groupIds),
  ]);
  return {
    spectraByStatus: Object.fromEntries(statusRows.map((r) => [r.status, Number(r.n)])),
    awaitingSignatures: awaiting.total,
    samples: Number(counts[0]?.samples ?? 0),
    series: Number(counts[0]?.series ?? 0),
    recentSignatures: recent.map((r) => ({
      id: r.id,
      kind: r.kind,
      technique: r.technique,
      significance: r.significance,
      spectrumId: r.spectrum_id,
      fileName: r.file_name,
      createdAt: new Date(r.created_at).toISOString(),
    })),
  };
}
