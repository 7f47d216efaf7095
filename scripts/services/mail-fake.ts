// Local SMTP fake: accepts every message and keeps it, so the app's outbox view and
// the tests can read what would have been sent. Messages are kept as JSON lines
// under the data directory and served read-only over loopback HTTP.
import { SMTPServer } from "smtp-server";
import { createServer } from "node:http";
import { appendFileSync, existsSync, mkdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { randomUUID } from "node:crypto";

const smtpPort = Number(process.env.SMTP_PORT_LOCAL ?? 25250);
const viewPort = Number(process.env.MAIL_VIEW_PORT_LOCAL ?? 25350);
const dir = join(process.env.BANDKEEP_DATA_DIR ?? ".data/dev", "mail");
const store = join(dir, "messages.jsonl");
mkdirSync(dir, { recursive: true });

type CapturedMail = { id: string; receivedAt: string; from: string; to: string[]; subject: string; raw: string };

function headerOf(raw: string, name: string): string {
  const head = raw.split(/\r?\n\r?\n/, 1)[0] ?? "";
  const unfolded = head.replace(/\r?\n[ \t]+/g, " ");
  const line = unfolded.split(/\r?\n/).find((l) => l.toLowerCase().startsWith(`${name.toLowerCase()}:`));
  return line ? line.slice(name.length + 1).trim() : "";
}

function decodeSubject(value: string): string {
  // RFC 2047 encoded words, as nodemailer writes them for non-ASCII subjects.
  return value.replace(/=\?utf-8\?([bq])\?([^?]*)\?=/gi, (_, enc: string, text: string) =>
    enc.toLowerCase() === "b"
      ? Buffer.from(text, "base64").toString("utf8")
      : Buffer.from(
          text.replace(/_/g, " ").replace(/=([0-9a-f]{2})/gi, (_m, h: string) => String.fromCharCode(parseInt(h, 16))),
          "latin1",
        ).toString("utf8"),
  );
}

const smtp = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  disableReverseLookup: true, // no DNS on loopback-only machines: a reverse lookup only adds delay
  logger: false,
  size: 10 * 1024 * 1024,
  onData(stream, session, callback) {
    const chunks: Buffer[] = [];
    stream.on("data", (c: Buffer) => chunks.push(c));
    stream.on("end", () => {
      const raw = Buffer.concat(chunks).toString("utf8");
      const mail: CapturedMail = {
        id: randomUUID(),
        receivedAt: new Date().toISOString(),
        from: session.envelope.mailFrom ? session.envelope.mailFrom.address : "",
        to: session.envelope.rcptTo.map((r) => r.address),
        subject: decodeSubject(headerOf(raw, "Subject")),
        raw,
      };
      appendFileSync(store, JSON.stringify(mail) + "\n");
      callback();
    });
  },
});
smtp.listen(smtpPort, "127.0.0.1");

function readAll(): CapturedMail[] {
  if (!existsSync(store)) return [];
  return readFileSync(store, "utf8")
    .split("\n")
    .filter(Boolean)
    .map((l) => JSON.parse(l) as CapturedMail);
}

const view = createServer((req, res) => {
  const url = new URL(req.url ?? "/", "http://localhost");
  if (req.method === "GET" && url.pathname === "/messages") {
    const to = url.searchParams.get("to");
    const all = readAll().reverse();
    const list = to ? all.filter((m) => m.to.some((t) => t.toLowerCase() === to.toLowerCase())) : all;
    res.writeHead(200, { "content-type": "application/json" });
    res.end(JSON.stringify(list.slice(0, 500)));
    return;
  }
  res.writeHead(404, { "content-type": "application/json" });
  res.end(JSON.stringify({ error: "not found" }));
});
view.listen(viewPort, "127.0.0.1");
console.log(`mail fake: SMTP 127.0.0.1:${smtpPort}, messages at http://127.0.0.1:${viewPort}/messages`);

for (const signal of ["SIGTERM", "SIGINT"] as const) {
  process.on(signal, () => {
    view.close();
    smtp.close(() => process.exit(0));
  });
}
