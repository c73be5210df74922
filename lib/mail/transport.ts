// SMTP through nodemailer. Host, port and sender come from the environment: the local mail
// catcher in development and tests, a real relay by configuration.
import nodemailer, { type Transporter } from "nodemailer";
import type { Env } from "@/lib/env";

/** messageId: the Message-ID header, "<…@…>"; nodemailer makes a random one when it is absent. */
export type MailTransport = { send(message: { from: string; to: string; subject: string; text: string; html: string; messageId?: string }): Promise<void> };

export function smtpTransport(e: Pick<Env, "SMTP_HOST" | "SMTP_PORT" | "SMTP_SECURE" | "SMTP_USER" | "SMTP_PASSWORD">): MailTransport {
  const transporter: Transporter = nodemailer.createTransport({
    host: e.SMTP_HOST,
    port: e.SMTP_PORT,
    secure: e.SMTP_SECURE === "true",
    ignoreTLS: e.SMTP_SECURE !== "true",
    auth: e.SMTP_USER ? { user: e.SMTP_USER, pass: e.SMTP_PASSWORD ?? "" } : undefined,
    connectionTimeout: 5000,
    greetingTimeout: 5000,
    socketTimeout: 10000,
  });
  return {
    async send(message) {
      await transporter.sendMail(message);
    },
  };
}
