import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { env } from "@/lib/env";

let transporter: Transporter | undefined;

function transport(): Transporter {
  transporter ??= nodemailer.createTransport({
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE,
    // The local fake speaks plain SMTP on loopback; a real relay is configured with SMTP_SECURE.
    ignoreTLS: !env.SMTP_SECURE && ["127.0.0.1", "localhost"].includes(env.SMTP_HOST),
    auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? "" } : undefined,
  });
  return transporter;
}

export interface OutgoingMail {
  to: string | string[];
  messageId?: string;
  subject: string;
  text: string;
  html: string;
}

/** Sends one message. Addresses come from our own records; user text never goes into headers. */
export async function sendMail(mail: OutgoingMail): Promise<void> {
  await transport().sendMail({
    from: env.MAIL_FROM,
    to: mail.to,
    subject: mail.subject,
    text: mail.text,
    html: mail.html,
    messageId: mail.messageId,
  });
}
