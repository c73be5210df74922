// Sends due outbox rows: claims them with FOR UPDATE SKIP LOCKED (several workers never send the
// same message), retries with exponential backoff, marks each one sent or failed with the reason.
import { sql } from "drizzle-orm";
import type { Database } from "@/db";
import type { MailTransport } from "./transport";

export const MAX_ATTEMPTS = 8;
const BASE_DELAY_S = 15;

/** Delay before the next attempt after `attempts` failures: 15 s, 30 s, 60 s … capped at 1 h. */
export function backoffSeconds(attempts: number): number {
  return Math.min(3600, BASE_DELAY_S * 2 ** Math.max(0, attempts - 1));
}

type OutboxRow = { id: string; to_address: string; subject: string; text_body: string; html_body: string; attempts: number };

/** Sends up to `limit` due messages; returns how many were sent and how many failed this round. */
export async function sendDueMail(db: Database, transport: MailTransport, from: string, limit = 20): Promise<{ sent: number; failed: number }> {
  let sent = 0;
  let failed = 0;
  await db.transaction(async (tx) => {
    const due = await tx.execute<OutboxRow>(sql`
      select id, to_address, subject, text_body, html_body, attempts from mail_outbox
      where state = 'pending' and next_attempt_at <= now()
      order by created_at limit ${limit} for update skip locked`);
    for (const row of due.rows) {
      try {
        await transport.send({ from, to: row.to_address, subject: row.subject, text: row.text_body, html: row.html_body });
        await tx.execute(sql`update mail_outbox set state = 'sent', sent_at = now(), attempts = attempts + 1, last_error = null where id = ${row.id}`);
        sent++;
      } catch (error) {
        const attempts = row.attempts + 1;
        const reason = error instanceof Error ? error.message : String(error);
        const finalState = attempts >= MAX_ATTEMPTS ? "failed" : "pending";
        await tx.execute(sql`update mail_outbox set attempts = ${attempts}, last_error = ${reason.slice(0, 500)},
          state = ${finalState}, next_attempt_at = now() + make_interval(secs => ${backoffSeconds(attempts)}) where id = ${row.id}`);
        failed++;
      }
    }
  });
  return { sent, failed };
}
