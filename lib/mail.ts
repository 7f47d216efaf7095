import nodemailer, { type Transporter } from "nodemailer";
import { config } from "./config";

const globalForMail = globalThis as unknown as { bandkeepMail?: Transporter };

export function mailer(): Transporter {
  if (!globalForMail.bandkeepMail) {
    // ignoreTLS: the local SMTP fake offers no STARTTLS; a real relay is configured by SMTP_URL.
    const url = config().SMTP_URL;
    globalForMail.bandkeepMail = nodemailer.createTransport(url, { ignoreTLS: url.startsWith("smtp://127.") });
  }
  return globalForMail.bandkeepMail;
}

export async function sendMail(to: string, subject: string, text: string): Promise<void> {
  await mailer().sendMail({ from: config().MAIL_FROM, to, subject, text });
}
