import nodemailer, { type Transporter } from "nodemailer";
import { config } from "./config";
import { processSingleton } from "@/lib/processSingleton";

export function mailer(): Transporter {
  return processSingleton("bandkeepMail", () => {
    // ignoreTLS: the local SMTP fake offers no STARTTLS; a real relay is configured by SMTP_URL.
    const url = config().SMTP_URL;
    return nodemailer.createTransport(url, { ignoreTLS: url.startsWith("smtp://127.") });
  });
}

/**
 * Sends a plain-text message built by nodemailer: UTF-8 throughout (RFC 2047 words in the subject,
 * quoted-printable body), so σ, µ, ⁻¹ and accents arrive intact. The text's last line is ended
 * with a line break, as every line of a message is (RFC 5322), so a MIME reader gives it back exactly.
 */
export async function sendMail(to: string, subject: string, text: string): Promise<void> {
  await mailer().sendMail({ from: config().MAIL_FROM, to, subject, text: text.endsWith("\n") ? text : `${text}\n` });
}
