import { Op } from "sequelize";
import type { FlagKind } from "@/lib/registry/flagKinds";
import type { Actor } from "@/lib/auth/actor";
import { config } from "@/lib/config";
import { sendMail } from "@/lib/mail";
import { KIND_LABELS } from "@/lib/signature-labels";
import { User, models } from "@/models";

export type DecidedSignature = {
  signatureId: string; decision: string; previousState: string; kind: FlagKind; energyEv: number | null;
  spectrumId: string; fileName: string; uploadedBy: string | null;
};

/** One e-mail per uploader who wants decision mail (User.notifyDecisions); returns how many were sent. */
export async function notifyUploaders(actor: Actor, decided: DecidedSignature[], comment: string): Promise<number> {
  models();
  const uploaderIds = [...new Set(decided.map((d) => d.uploadedBy).filter((id): id is string => id !== null && id !== actor.id))];
  if (uploaderIds.length === 0) return 0;
  const people = await User.findAll({ where: { id: { [Op.in]: uploaderIds }, notifyDecisions: true } });
  const base = config().APP_URL.replace(/\/$/, "");
  let sent = 0;
  for (const person of people) {
    const mine = decided.filter((d) => d.uploadedBy === person.id);
    const verb = (d: DecidedSignature) => `${d.previousState === "awaiting" ? "" : "revised to "}${d.decision}`;
    const subject = mine.length === 1
      ? `Bandkeep: ${KIND_LABELS[mine[0]!.kind]} in ${mine[0]!.fileName} ${verb(mine[0]!)}`
      : `Bandkeep: ${mine.length} signatures in your uploads were decided`;
    const lines = mine.map((d) =>
      `- ${KIND_LABELS[d.kind]}${d.energyEv !== null ? ` at ${d.energyEv.toFixed(3)} eV` : ""} in ${d.fileName}: ${verb(d)}\n  ${base}/review/${d.signatureId}`,
    );
    const text = [
      `Hello ${person.name},`,
      "",
      `${actor.name} reviewed band changes flagged in your uploads:`,
      "",
      ...lines,
      "",
      comment ? `Comment: ${comment}` : "No comment was given.",
      "",
      `You receive this because decision e-mails are on in your settings: ${base}/settings`,
    ].join("\n");
    await sendMail(person.email, subject, text);
    sent++;
  }
  return sent;
}
