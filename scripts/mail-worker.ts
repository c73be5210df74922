// The outbox worker process: every few seconds, sends the e-mails that are due (lib/mail/worker.ts);
// once a minute, expires sign-offs and queues expiry reminders (lib/server/review-clock.ts).
// Started and stopped by `npm start` beside the app.
import { closeDb, getDb } from "@/db";
import { env } from "@/lib/env";
import { smtpTransport } from "@/lib/mail/transport";
import { sendDueMail } from "@/lib/mail/worker";
import { runReviewClock } from "@/lib/server/review-clock";

const e = env();
const transport = smtpTransport(e);
const intervalMs = Number(process.env.MAIL_WORKER_INTERVAL_MS ?? 2000);
const clockIntervalMs = Number(process.env.REVIEW_CLOCK_INTERVAL_MS ?? 60_000);
let running = true;
let lastClock = 0;

async function loop() {
  while (running) {
    try {
      const { sent, failed } = await sendDueMail(getDb(), transport, e.MAIL_FROM);
      if (sent || failed) console.log(`[mail-worker] sent ${sent}, will retry ${failed}`);
      // Expire sign-offs past their validity and queue the 30- and 7-day reminders (idempotent).
      if (Date.now() - lastClock >= clockIntervalMs) {
        lastClock = Date.now();
        await runReviewClock(getDb());
      }
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
