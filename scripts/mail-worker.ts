// The outbox worker process: every few seconds, sends the e-mails that are due (lib/mail/worker.ts).
// Started and stopped by `npm start` beside the app.
import { closeDb, getDb } from "@/db";
import { env } from "@/lib/env";
import { smtpTransport } from "@/lib/mail/transport";
import { sendDueMail } from "@/lib/mail/worker";

const e = env();
const transport = smtpTransport(e);
const intervalMs = Number(process.env.MAIL_WORKER_INTERVAL_MS ?? 2000);
let running = true;

async function loop() {
  while (running) {
    try {
      const { sent, failed } = await sendDueMail(getDb(), transport, e.MAIL_FROM);
      if (sent || failed) console.log(`[mail-worker] sent ${sent}, will retry ${failed}`);
    } catch (error) {
      console.error("[mail-worker] round failed:", error instanceof Error ? error.message : error);
    }
    await new Promise((r) => setTimeout(r, intervalMs));
  }
  await closeDb();
}

function stop() {
  running = false;
}
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
console.log(`[mail-worker] sending from the outbox to ${e.SMTP_HOST}:${e.SMTP_PORT} every ${intervalMs} ms`);
void loop();
