import nodemailer from "nodemailer";

import type { Env } from "../env";

export interface OutgoingMail {
  messageId: string;
  to: string;
  subject: string;
  text: string;
  html: string | null;
}

export interface Mailer {
  send: (mail: OutgoingMail) => Promise<void>;
  close: () => void;
}

/** Sends through the configured SMTP server; the local mail catcher and a real server alike. */
export function createMailer(env: Env): Mailer {
  const transport = nodemailer.createTransport({
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE === "true",
    auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? "" } : undefined,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  });
  return {
    async send(mail) {
      await transport.sendMail({
        from: env.LINTEL_MAIL_FROM,
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        html: mail.html ?? undefined,
        messageId: mail.messageId,
      });
    },
    close: () => transport.close(),
  };
}
