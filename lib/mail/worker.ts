// Sends due outbox rows. A round first CLAIMS rows in a short transaction (FOR UPDATE SKIP LOCKED,
// then a lease: next_attempt_at moves LEASE_S ahead, so no other worker takes them, and the claim
// counts as an attempt), then sends over SMTP with no transaction or row lock held, then marks each
// row sent, or pending with a backoff, or failed after MAX_ATTEMPTS. The mark is retried while the
// database is away (a restart, a failover) for up to MARK_RETRY_MS, so a message sent just before
// PostgreSQL went down is recorded as sent when it is back, not sent again when its lease ends.
//
// Delivery is AT LEAST ONCE. A worker that dies between the SMTP server's reply and the mark leaves
// the row claimed: no worker — a restarted one included — takes it before the lease ends, then it is
// sent again. What limits the harm:
// - every message carries a Message-ID made from its outbox row's id (`outboxMessageId`), the same
//   on every attempt, so a receiving system or mail client that de-duplicates by Message-ID shows
//   the repeat once, and anyone can tell a repeat from a second message;
// - a claim counts as an attempt, so a message whose sending keeps killing its worker is tried at
//   most MAX_ATTEMPTS times and then marked failed (the readiness route counts those), instead of
//   going out again every LEASE_S for ever.
import { sql } from "drizzle-orm";
import type { Database } from "@/db";
import type { MailTransport } from "./transport";

export const MAX_ATTEMPTS = 8;
const BASE_DELAY_S = 15;
/** How long a claimed row stays invisible to other workers; far longer than one SMTP send. */
export const LEASE_S = 300;

/** Delay before the next attempt after `attempts` failures: 15 s, 30 s, 60 s … capped at 1 h. */
export function backoffSeconds(attempts: number): number {
  return Math.min(3600, BASE_DELAY_S * 2 ** Math.max(0, attempts - 1));
}

/** attempts: this claim included. */
type OutboxRow = { id: string; to_address: string; subject: string; text_body: string; html_body: string; attempts: number };

/**
 * The Message-ID of an outbox row, the same on every attempt: `<outbox.ROW-ID@DOMAIN>`, the domain
 * taken from the sender's address (RFC 5322 §3.6.4 asks for a unique left part and a domain).
 */
export function outboxMessageId(rowId: string, from: string): string {
  const address = from.match(/<([^>]+)>/)?.[1] ?? from;
  const domain = address.includes("@") ? address.slice(address.lastIndexOf("@") + 1).trim() : "";
  return `<outbox.${rowId}@${/^[A-Za-z0-9.-]+$/.test(domain) ? domain : "benchwarden.invalid"}>`;
}

/** Sentence kept on a row whose claims all ended without an outcome recorded. */
export const LOST_CLAIMS_ERROR = `Claimed ${MAX_ATTEMPTS} times without an outcome recorded (the worker stopped while sending); it may have been delivered.`;

/**
 * Claims up to `limit` due rows for this worker: a lease of LEASE_S seconds, and one attempt
 * counted. A due row that already had MAX_ATTEMPTS claims (each ended by its worker dying before the
 * mark) is not sent again but marked failed.
 */
export async function claimDueMail(db: Database, limit: number): Promise<OutboxRow[]> {
  await db.execute(sql`
    update mail_outbox set state = 'failed', last_error = ${LOST_CLAIMS_ERROR}
    where state = 'pending' and next_attempt_at <= now() and attempts >= ${MAX_ATTEMPTS}`);
  const claimed = await db.execute<OutboxRow>(sql`
    update mail_outbox set next_attempt_at = now() + make_interval(secs => ${LEASE_S}), attempts = attempts + 1
    where id in (
      select id from mail_outbox
      where state = 'pending' and next_attempt_at <= now() and attempts < ${MAX_ATTEMPTS}
      order by created_at limit ${limit} for update skip locked)
    returning id, to_address, subject, text_body, html_body, attempts`);
  return claimed.rows;
}

/** How long a round keeps trying to record a message's outcome while the database does not answer. */
export const MARK_RETRY_MS = 120_000;

/** Runs a database write until it succeeds: every 250 ms at first, doubling to 5 s, for at most `retryMs`. */
async function untilWritten(write: () => Promise<unknown>, retryMs: number): Promise<void> {
  const deadline = Date.now() + retryMs;
  let waitMs = 250;
  for (;;) {
    try {
      await write();
      return;
    } catch (error) {
      if (Date.now() + waitMs > deadline) throw error;
      await new Promise((r) => setTimeout(r, waitMs));
      waitMs = Math.min(5000, waitMs * 2);
    }
  }
}

/** Sends up to `limit` due messages; returns how many were sent and how many failed this round. */
export async function sendDueMail(db: Database, transport: MailTransport, from: string, limit = 20, markRetryMs = MARK_RETRY_MS): Promise<{ sent: number; failed: number }> {
  let sent = 0;
  let failed = 0;
  const due = await claimDueMail(db, limit);
  for (const row of due) {
    // Only the SMTP conversation decides whether the message failed; a database error while
    // recording the outcome is retried, never counted as a failed send.
    let failure: unknown = null;
    try {
      await transport.send({ from, to: row.to_address, subject: row.subject, text: row.text_body, html: row.html_body, messageId: outboxMessageId(row.id, from) });
    } catch (error) {
      failure = error;
    }
    if (failure === null) {
      await untilWritten(() => db.execute(sql`update mail_outbox set state = 'sent', sent_at = now(), last_error = null where id = ${row.id}`), markRetryMs);
      sent++;
    } else {
      const attempts = row.attempts;
      const reason = failure instanceof Error ? failure.message : String(failure);
      const finalState = attempts >= MAX_ATTEMPTS ? "failed" : "pending";
      await untilWritten(
        () =>
          db.execute(sql`update mail_outbox set attempts = ${attempts}, last_error = ${reason.slice(0, 500)},
            state = ${finalState}, next_attempt_at = now() + make_interval(secs => ${backoffSeconds(attempts)}) where id = ${row.id}`),
        markRetryMs,
      );
      failed++;
    }
  }
  return { sent, failed };
}

export type OutboxHealth = { pending: number; failed: number; oldestPendingS: number | null };

/** Queue depth and the age of the oldest message still waiting, for the health route. */
export async function outboxHealth(db: Database): Promise<OutboxHealth> {
  const { rows } = await db.execute<{ pending: string; failed: string; oldest_s: string | null }>(sql`
    select count(*) filter (where state = 'pending') as pending,
           count(*) filter (where state = 'failed') as failed,
           extract(epoch from now() - min(created_at) filter (where state = 'pending')) as oldest_s
    from mail_outbox`);
  const row = rows[0];
  return {
    pending: Number(row?.pending ?? 0),
    failed: Number(row?.failed ?? 0),
    oldestPendingS: row?.oldest_s == null ? null : Math.round(Number(row.oldest_s)),
  };
}
