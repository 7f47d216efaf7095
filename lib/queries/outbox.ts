import { config } from "@/lib/config";

export type OutboxMessage = { id: string; receivedAt: string; from: string; to: string[]; subject: string; body: string };

function bodyOf(raw: string): string {
  const parts = raw.split(/\r?\n\r?\n/);
  const body = parts.slice(1).join("\n\n");
  // nodemailer writes quoted-printable text: undo soft breaks and escapes for reading.
  return body.replace(/=\r?\n/g, "").replace(/=([0-9A-F]{2})/g, (_, h: string) => String.fromCharCode(parseInt(h, 16))).slice(0, 4000);
}

/** Mail captured by the local SMTP fake; null where no capture service is configured. */
export async function listOutbox(): Promise<OutboxMessage[] | null> {
  const base = config().MAIL_VIEW_URL;
  if (!base) return null;
  const res = await fetch(`${base}/messages`, { cache: "no-store", signal: AbortSignal.timeout(2000) });
  if (!res.ok) throw new Error(`the mail capture answered ${res.status}`);
  const list = (await res.json()) as (Omit<OutboxMessage, "body"> & { raw: string })[];
  return list.slice(0, 100).map(({ raw, ...m }) => ({ ...m, body: bodyOf(raw) }));
}
