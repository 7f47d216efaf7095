import { selectRows } from "@/lib/db";
import type { Actor } from "@/lib/auth/actor";
import { models } from "@/models";

export type ReviewItem = {
  id: string; kind: string; energyEv: number | null; fraction: number | null; shiftMeV: number | null; significance: number;
  spectrumId: string; fileName: string; sampleName: string | null; projectName: string; createdAt: string;
};

/** Signatures awaiting a decision in the groups the actor leads, most significant first. */
export async function listAwaitingSignatures(actor: Actor, limit = 100): Promise<ReviewItem[]> {
  models();
  const groupIds = actor.memberships.filter((m) => m.role === "lead").map((m) => m.groupId);
  if (groupIds.length === 0) return [];
  const rows = await selectRows<{
    id: string; kind: string; energy_ev: number | null; fraction: number | null; shift_mev: number | null; significance: number;
    spectrum_id: string; file_name: string; sample_name: string | null; project_name: string; created_at: Date;
  }>(
    `SELECT g.id, g.kind, g.energy_ev, g.fraction, g.shift_mev, g.significance, g.spectrum_id, s.file_name,
            sm.name AS sample_name, p.name AS project_name, g.created_at
     FROM signatures g JOIN spectra s ON s.id = g.spectrum_id JOIN projects p ON p.id = s.project_id
     LEFT JOIN samples sm ON sm.id = s.sample_id
     WHERE p.group_id IN (:groupIds) AND g.review_state = 'awaiting'
     ORDER BY g.significance DESC, g.created_at DESC LIMIT :limit`, { groupIds, limit },
  );
  return rows.map((r) => ({
    id: r.id, kind: r.kind, energyEv: r.energy_ev, fraction: r.fraction, shiftMeV: r.shift_mev, significance: r.significance,
    spectrumId: r.spectrum_id, fileName: r.file_name, sampleName: r.sample_name, projectName: r.project_name,
    createdAt: new Date(r.created_at).toISOString(),
  }));
}
