import nodemailer, { type Transporter } from "nodemailer";
import { env } from "@/lib/env";

const g = globalThis as unknown as { sortieMailer?: Transporter };

/** SMTP from SMTP_URL: maildev on loopback locally, a provider in production. */
function transporter(): Transporter {
  if (!g.sortieMailer) {
    const url = new URL(env().SMTP_URL);
    const local = url.hostname === "127.0.0.1" || url.hostname === "localhost";
    g.sortieMailer = nodemailer.createTransport({
      host: url.hostname,
      port: Number(url.port || (url.protocol === "smtps:" ? 465 : 587)),
      secure: url.protocol === "smtps:",
      // The loopback catcher has no certificate; real providers get STARTTLS.
      ignoreTLS: local,
      auth: url.username ? { user: decodeURIComponent(url.username), pass: decodeURIComponent(url.password) } : undefined,
      connectionTimeout: 10_000,
      greetingTimeout: 10_000,
      // A stalled server must not hold an outbox lease for long (lib/mail/outbox.ts).
      socketTimeout: 60_000,
    });
  }
  return g.sortieMailer;
}

export interface Mail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

/** Hands one message to SMTP now. Product code queues through lib/mail/outbox.ts instead. */
export async function deliverMail(mail: Mail): Promise<void> {
  await transporter().sendMail({ from: env().MAIL_FROM, ...mail });
}
