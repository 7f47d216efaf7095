import { config } from "@/lib/config";
import { QueryTypes } from "sequelize";
import { selectRows, sequelize } from "@/lib/db";
import { sendMail } from "@/lib/mail";
import { kindLabel, type FlagKind } from "@/lib/registry/flagKinds";
import { CURRENT_SIGNATURE, awaitingReviewCounts } from "./counts";

export type DigestSummary = { groups: number; signatures: number; mailed: number };

type Pending = {
  id: string;
  kind: FlagKind;
  significance: number;
  energy_ev: number | null;
  review_state: string;
  superseded: boolean;
  file_name: string;
  technique: string;
  project_name: string;
};

/**
 * Mails each group lead who wants it (User.notifyDigest) one digest of the signatures flagged
 * since the last digest, and marks them (signatures.digested_at) in the same transaction, per
 * group. Rows are claimed with FOR UPDATE SKIP LOCKED, so two workers running it at once never
 * mail the same signature twice; a failed send rolls the group back for the next run.
 * Signatures already decided or superseded by a newer run by then are marked without being mailed.
 * The mail states how many await review in all, from the same count as the queue and Overview.
 */
export async function runReviewDigest(): Promise<DigestSummary> {
  const groups = await selectRows<{ group_id: string; group_name: string }>(
    `SELECT DISTINCT p.group_id, gr.name AS group_name FROM signatures g JOIN spectra s ON s.id = g.spectrum_id
     JOIN projects p ON p.id = s.project_id JOIN groups gr ON gr.id = p.group_id WHERE g.digested_at IS NULL`,
  );
  const base = config().APP_URL.replace(/\/$/, "");
  const summary: DigestSummary = { groups: 0, signatures: 0, mailed: 0 };
  for (const group of groups) {
    await sequelize().transaction(async (transaction) => {
      const rows = await sequelize().query<Pending>(
        `SELECT g.id, g.kind, g.significance, g.energy_ev, g.review_state, NOT (${CURRENT_SIGNATURE}) AS superseded, s.file_name, s.technique, p.name AS project_name
         FROM signatures g JOIN spectra s ON s.id = g.spectrum_id JOIN projects p ON p.id = s.project_id
         WHERE g.digested_at IS NULL AND p.group_id = :groupId
         ORDER BY g.significance DESC LIMIT 500 FOR UPDATE OF g SKIP LOCKED`,
        { replacements: { groupId: group.group_id }, type: QueryTypes.SELECT, transaction },
      );
      if (rows.length === 0) return;
      // A flag that a newer run already replaced is marked without being mailed.
      const awaiting = rows.filter((r) => r.review_state === "awaiting" && !r.superseded);
      if (awaiting.length > 0) {
        const leads = await sequelize().query<{ email: string; name: string }>(
          `SELECT u.email, u.name FROM memberships m JOIN users u ON u.id = m.user_id
           WHERE m.group_id = :groupId AND m.role = 'lead' AND u.notify_digest`,
          { replacements: { groupId: group.group_id }, type: QueryTypes.SELECT, transaction },
        );
        const lines = awaiting.map(
          (r) =>
            `- ${kindLabel(r.kind, r.technique)}${r.energy_ev !== null ? ` at ${r.energy_ev.toFixed(3)} eV` : ""}, ${r.significance.toFixed(1)}σ, in ${r.file_name} (${r.project_name})\n  ${base}/review/${r.id}`,
        );
        const { total } = await awaitingReviewCounts([group.group_id]);
        for (const lead of leads) {
          await sendMail(
            lead.email,
            `Bandkeep: ${awaiting.length} new signature${awaiting.length === 1 ? "" : "s"} to review in ${group.group_name}`,
            [
              `Hello ${lead.name},`,
              "",
              `The analysis flagged these band changes in ${group.group_name} since the last digest:`,
              "",
              ...lines,
              "",
              `${total} signature${total === 1 ? "" : "s"} in ${group.group_name} await review in all: ${base}/review`,
              `You receive this because the review digest is on in your settings: ${base}/settings`,
            ].join("\n"),
          );
          summary.mailed++;
        }
      }
      await sequelize().query(`UPDATE signatures SET digested_at = now() WHERE id IN (:ids)`, {
        replacements: { ids: rows.map((r) => r.id) },
        transaction,
      });
      summary.groups++;
      summary.signatures += awaiting.length;
    });
  }
  return summary;
}
