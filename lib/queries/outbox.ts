import { simpleParser } from "mailparser";
import { config } from "@/lib/config";

export type OutboxMessage = { id: string; receivedAt: string; from: string; to: string[]; subject: string; body: string };

/** The text part of a raw message, decoded as a MIME reader does (charset, quoted-printable, soft breaks). */
async function bodyOf(raw: string): Promise<{ subject: string | null; text: string }> {
  const parsed = await simpleParser(raw, { skipHtmlToText: true, skipImageLinks: true, skipTextLinks: true });
  return { subject: parsed.subject ?? null, text: parsed.text ?? "" };
}

/** Mail captured by the local SMTP fake; null where no capture service is configured. */
export async function listOutbox(): Promise<OutboxMessage[] | null> {
  const base = config().MAIL_VIEW_URL;
  if (!base) return null;
  const res = await fetch(`${base}/messages`, { cache: "no-store", signal: AbortSignal.timeout(2000) });
  if (!res.ok) throw new Error(`the mail capture answered ${res.status}`);
  const list = (await res.json()) as (Omit<OutboxMessage, "body"> & { raw: string })[];
  return Promise.all(
    list.slice(0, 100).map(async ({ raw, ...m }) => {
      const { subject, text } = await bodyOf(raw);
      return { ...m, subject: subject ?? m.subject, body: text };
    }),
  );
}
