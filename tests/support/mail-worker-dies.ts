// A mail worker that dies at the worst moment: it claims due outbox rows and sends the first over
// real SMTP (to the catcher), then is killed (SIGKILL) before it can mark the row sent — as a
// worker killed by the out-of-memory killer or a power cut would be. Run by
// tests/integration/mail-delivery.test.ts with tsx:
//   SCRATCH_DATABASE_URL=… SMTP_PORT=… MAIL_FROM=… tsx tests/support/mail-worker-dies.ts
import { drizzle } from "drizzle-orm/node-postgres";
import pg from "pg";
import type { Database } from "../../db";
import { smtpTransport } from "../../lib/mail/transport";
import { sendDueMail } from "../../lib/mail/worker";

const pool = new pg.Pool({ connectionString: process.env.SCRATCH_DATABASE_URL, max: 1 });
const real = smtpTransport({ SMTP_HOST: "127.0.0.1", SMTP_PORT: Number(process.env.SMTP_PORT ?? 2525), SMTP_SECURE: "false" });
const dying = {
  async send(message: Parameters<typeof real.send>[0]) {
    await real.send(message); // the SMTP server has accepted the message …
    process.kill(process.pid, "SIGKILL"); // … and the worker dies before the mark
  },
};
void sendDueMail(drizzle(pool) as unknown as Database, dying, process.env.MAIL_FROM ?? "Benchwarden <benchwarden@optics.example.edu>");
