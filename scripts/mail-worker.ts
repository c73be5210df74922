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
  let failuresInARow = 0;
  while (running) {
    try {
      const { sent, failed } = await sendDueMail(getDb(), transport, e.MAIL_FROM);
      if (sent || failed) console.log(`[mail-worker] sent ${sent}, will retry ${failed}`);
      // Expire sign-offs past their validity and queue the 30- and 7-day reminders (idempotent).
      if (Date.now() - lastClock >= clockIntervalMs) {
        lastClock = Date.now();
        await runReviewClock(getDb());
      }
      failuresInARow = 0;
    } catch (error) {
      // Typically the database is restarting: wait longer each time (up to 30 s), then carry on.
      failuresInARow++;
      console.error(`[mail-worker] round failed (${failuresInARow} in a row):`, error instanceof Error ? error.message : error);
    }
    const waitMs = failuresInARow === 0 ? intervalMs : Math.min(30_000, intervalMs * 2 ** Math.min(failuresInARow, 6));
    await new Promise((r) => setTimeout(r, waitMs));
  }
  await closeDb();
}

function stop() {
  running = false;
}
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
// A crash the loop did not catch is logged and ends the process; the supervisor in npm start starts
// a new worker (scripts/lib/system.ts superviseChild).
process.on("unhandledRejection", (reason) => {
  console.error("[mail-worker] unhandled rejection:", reason instanceof Error ? reason.message : reason);
  process.exit(1);
});
console.log(`[mail-worker] sending from the outbox to ${e.SMTP_HOST}:${e.SMTP_PORT} every ${intervalMs} ms`);
void loop();
