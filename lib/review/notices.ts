import { QueryTypes, type Transaction } from "sequelize";
import { config } from "@/lib/config";
import { selectRows, sequelize } from "@/lib/db";
import { sendMail } from "@/lib/mail";
import { noticeQueue } from "@/lib/queue";
import { kindLabel, type FlagKind } from "@/lib/registry/flagKinds";
import { User } from "@/models";
import { countOf } from "@/lib/format/quantity";

// Decision mail to uploaders, coalesced per person: each decision adds a notice row in the
// decision's transaction; a delayed job per person (its id taken from the person's oldest unsent
// notice, so every decision inside one window lands on the same job) sends one message with the
// net change of each signature, and nothing for a signature that ended where it started.

export type Notice = { recipientId: string; signatureId: string; reviewId: string; reviewerName: string };

/** Adds notice rows in the caller's transaction; schedule them with scheduleNotices after it commits. */
export async function addNotices(notices: readonly Notice[], transaction: Transaction): Promise<void> {
  if (notices.length === 0) return;
  await sequelize().query(
    `INSERT INTO decision_notices (recipient_id, signature_id, review_id, reviewer_name)
     SELECT n."recipientId", n."signatureId", n."reviewId", n."reviewerName"
       FROM jsonb_to_recordset(CAST(:rows AS jsonb)) AS n("recipientId" uuid, "signatureId" uuid, "reviewId" uuid, "reviewerName" text)`,
    { replacements: { rows: JSON.stringify(notices) }, transaction },
  );
}

/**
 * Makes sure each person with unsent notices has a delayed job. The job id names the person's
 * oldest unsent notice: a second decision within the window finds the same id and adds nothing.
 * Call after the notices' transaction committed.
 */
export async function scheduleNotices(recipientIds: readonly string[], delayMs = config().NOTICE_WINDOW_MS): Promise<void> {
  if (recipientIds.length === 0) return;
  const oldest = await selectRows<{ recipient_id: string; id: string }>(
    `SELECT recipient_id, min(id)::text AS id FROM decision_notices WHERE sent_at IS NULL AND recipient_id IN (:ids) GROUP BY recipient_id`,
    { ids: [...new Set(recipientIds)] },
  );
  for (const o of oldest) {
    await noticeQueue().add("decision-notice", { recipientId: o.recipient_id }, { jobId: `notice-${o.id}`, delay: delayMs });
  }
}

/** Schedules every person with unsent notices (a safety net run with the digest, for jobs lost to a Redis outage). */
export async function scheduleAllPendingNotices(): Promise<number> {
  const rows = await selectRows<{ recipient_id: string }>(`SELECT DISTINCT recipient_id FROM decision_notices WHERE sent_at IS NULL`);
  await scheduleNotices(
    rows.map((r) => r.recipient_id),
    0,
  );
  return rows.length;
}

type PendingRow = {
  id: string;
  signature_id: string;
  reviewer_name: string;
  decision: string;
  previous_state: string | null;
  comment: string;
  origin: string;
  current_state: string;
  kind: FlagKind;
  energy_ev: number | null;
  significance: number;
  file_name: string;
  technique: string;
};

const STATE_TEXT: Record<string, string> = { awaiting: "awaiting review", confirmed: "confirmed", dismissed: "dismissed" };

/** One message's subject and text from the notices of one person, or null when their net effect is nothing. */
export function composeNotice(name: string, rows: readonly PendingRow[], base: string): { subject: string; text: string } | null {
  const bySignature = new Map<string, PendingRow[]>();
  for (const r of rows) bySignature.set(r.signature_id, [...(bySignature.get(r.signature_id) ?? []), r]);
  const changed = [...bySignature.values()].filter((list) => (list[0]!.previous_state ?? "awaiting") !== list[0]!.current_state);
  if (changed.length === 0) return null;
  const label = (r: PendingRow) => kindLabel(r.kind, r.technique);
  const lines = changed.flatMap((list) => {
    const first = list[0]!;
    const head =
      `- ${label(first)}${first.energy_ev !== null ? ` at ${first.energy_ev.toFixed(3)} eV` : ""} (${first.significance.toFixed(1)}σ) in ${first.file_name}: ` +
      `${STATE_TEXT[first.current_state] ?? first.current_state} (was ${STATE_TEXT[first.previous_state ?? "awaiting"] ?? first.previous_state})`;
    const steps = list.map(
      (r) =>
        `  ${r.origin === "undo" ? "undone" : (STATE_TEXT[r.decision] ?? r.decision)} by ${r.reviewer_name}${r.comment ? `: ${r.comment}` : ""}`,
    );
    return [head, ...steps, `  ${base}/review/${first.signature_id}`];
  });
  const one = changed.length === 1 ? changed[0]![0]! : null;
  const subject = one
    ? `Bandkeep: ${label(one)} in ${one.file_name} ${STATE_TEXT[one.current_state] ?? one.current_state}`
    : `Bandkeep: ${changed.length === 1 ? "a decision" : "decisions"} on ${countOf(changed.length, "signature")} in your uploads`;
  const text = [
    `Hello ${name},`,
    "",
    `Band changes flagged in your uploads were reviewed:`,
    "",
    ...lines,
    "",
    `You receive this because decision e-mails are on in your settings: ${base}/settings`,
  ].join("\n");
  return { subject, text };
}

/**
 * Sends one person's unsent notices as one message (worker side). Rows are claimed with
 * FOR UPDATE SKIP LOCKED and marked sent in the same transaction; a failed send rolls back for a
 * retry. Notices that arrived meanwhile are scheduled again. Returns the number of messages sent.
 */
export async function sendPendingNotices(recipientId: string): Promise<number> {
  const base = config().APP_URL.replace(/\/$/, "");
  const sent = await sequelize().transaction(async (transaction) => {
    const rows = await sequelize().query<PendingRow>(
      `SELECT n.id, n.signature_id, n.reviewer_name, v.decision, v.previous_state, v.comment, v.origin,
              g.review_state AS current_state, g.kind, g.energy_ev, g.significance, s.file_name, s.technique
         FROM decision_notices n JOIN reviews v ON v.id = n.review_id JOIN signatures g ON g.id = n.signature_id
         JOIN spectra s ON s.id = g.spectrum_id
        WHERE n.recipient_id = :recipientId AND n.sent_at IS NULL
        ORDER BY n.id FOR UPDATE OF n SKIP LOCKED`,
      { replacements: { recipientId }, type: QueryTypes.SELECT, transaction },
    );
    if (rows.length === 0) return 0;
    const person = await User.findByPk(recipientId, { transaction });
    const message = person?.notifyDecisions ? composeNotice(person.name, rows, base) : null;
    if (person && message) await sendMail(person.email, message.subject, message.text);
    await sequelize().query(`UPDATE decision_notices SET sent_at = now() WHERE id IN (:ids)`, {
      replacements: { ids: rows.map((r) => r.id) },
      transaction,
    });
    return message ? 1 : 0;
  });
  const [left] = await selectRows<{ n: string }>(
    `SELECT count(*) AS n FROM decision_notices WHERE recipient_id = :recipientId AND sent_at IS NULL`,
    { recipientId },
  );
  if (Number(left?.n ?? 0) > 0) await scheduleNotices([recipientId]);
  return sent;
}
