// The outbox's delivery promise when a worker dies between the SMTP server's reply and marking the
// row sent: at least once, never sooner than the lease, and every copy with the row's own
// Message-ID, so a receiver can tell a repeat and fold it away. A real worker process is killed
// (tests/support/mail-worker-dies.ts) after real SMTP to the catcher. A scratch database keeps the
// rows away from the mail workers `npm test` runs.
import { spawnSync } from "node:child_process";
import path from "node:path";
import { drizzle } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Database } from "../../db";
import * as schema from "../../db/schema";
import { CATCHER_URL, type CaughtMail } from "../support/http";
import { superuserUrl } from "../support/review-fixtures";

const ROOT = path.resolve(import.meta.dirname, "../..");
const FROM = "Benchwarden <benchwarden@optics.example.edu>";
const SMTP_PORT = Number(process.env.SMTP_PORT ?? 2525);

async function caught(to: string): Promise<CaughtMail[]> {
  const res = await fetch(`${CATCHER_URL}/api/messages?to=${encodeURIComponent(to)}`);
  return (await res.json()) as CaughtMail[];
}

async function waitForCopies(to: string, copies: number, timeoutMs = 15_000): Promise<CaughtMail[]> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = await caught(to);
    if (found.length >= copies || Date.now() > deadline) return found;
    await new Promise((r) => setTimeout(r, 200));
  }
}

describe("a mail worker that dies between sending and marking", () => {
  const scratch = `bw_mail_delivery_${process.pid}`;
  const run = `${process.pid}-${Date.now()}`;
  let scratchUrl: string;
  let pool: pg.Pool;
  let db: Database;

  beforeAll(async () => {
    const admin = new pg.Client({ connectionString: superuserUrl() });
    await admin.connect();
    await admin.query(`drop database if exists ${scratch}`);
    await admin.query(`create database ${scratch}`);
    await admin.end();
    const url = new URL(superuserUrl());
    url.pathname = `/${scratch}`;
    scratchUrl = url.toString();
    pool = new pg.Pool({ connectionString: scratchUrl, max: 2 });
    await migrate(drizzle(pool), { migrationsFolder: path.resolve(ROOT, "migrations") });
    db = drizzle(pool, { schema }) as unknown as Database;
  });

  afterAll(async () => {
    await pool?.end();
    const admin = new pg.Client({ connectionString: superuserUrl() });
    await admin.connect();
    await admin.query(`drop database if exists ${scratch}`);
    await admin.end();
  });

  it("sends again only after the lease, with the same Message-ID; a message claimed but not sent goes out once", async () => {
    const { enqueueMail } = await import("../../lib/mail/outbox");
    const { sendDueMail, outboxMessageId, LEASE_S } = await import("../../lib/mail/worker");
    const { smtpTransport } = await import("../../lib/mail/transport");
    const addresses = [`dies-a-${run}@northmere.example.edu`, `dies-b-${run}@northmere.example.edu`];
    for (const to of addresses) await enqueueMail(db, { to, subject: `Delivery test ${run}`, text: "delivery", html: "<p>delivery</p>" });
    const ids = new Map((await pool.query<{ id: string; to_address: string }>("select id, to_address from mail_outbox")).rows.map((r) => [r.to_address, r.id]));

    const died = spawnSync(path.join(ROOT, "node_modules/.bin/tsx"), ["tests/support/mail-worker-dies.ts"], {
      cwd: ROOT,
      env: { ...process.env, SCRATCH_DATABASE_URL: scratchUrl, SMTP_PORT: String(SMTP_PORT), MAIL_FROM: FROM },
      encoding: "utf8",
      timeout: 60_000,
    });
    // Killed by SIGKILL (tsx ends with 128 + 9), not finished or failed.
    expect(died.status, `the worker should have been killed:\n${died.stdout}\n${died.stderr}`).toBe(137);

    // The worker claimed both and sent one (whichever came first in its batch) before it died: the
    // catcher holds that one once, with its row's own Message-ID, and nothing for the other.
    const deadline = Date.now() + 15_000;
    let copies = await Promise.all(addresses.map(caught));
    while (copies.flat().length < 1 && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 200));
      copies = await Promise.all(addresses.map(caught));
    }
    expect(copies.map((c) => c.length).sort()).toEqual([0, 1]);
    const first = addresses[copies.findIndex((c) => c.length === 1)];
    const second = addresses.find((a) => a !== first)!;
    expect((await caught(first))[0].messageId).toBe(`<outbox.${ids.get(first)}@optics.example.edu>`);

    // Both rows are still claimed: pending, one attempt counted, the lease running for LEASE_S.
    const held = await pool.query<{ to_address: string; state: string; attempts: number; lease_s: number }>(
      "select to_address, state, attempts, extract(epoch from next_attempt_at - now())::float as lease_s from mail_outbox order by created_at",
    );
    for (const row of held.rows) {
      expect(row).toMatchObject({ state: "pending", attempts: 1 });
      expect(row.lease_s).toBeGreaterThan(LEASE_S - 60);
    }

    // A worker started again at once sends nothing while the lease runs.
    const transport = smtpTransport({ SMTP_HOST: "127.0.0.1", SMTP_PORT, SMTP_SECURE: "false" });
    expect(await sendDueMail(db, transport, FROM)).toEqual({ sent: 0, failed: 0 });
    await new Promise((r) => setTimeout(r, 500));
    expect(await caught(first)).toHaveLength(1);

    // The lease ends: both go out. The first arrives a second time — at least once, not exactly
    // once — with the same Message-ID, so a receiver can tell it is a repeat; the second arrives once.
    await pool.query("update mail_outbox set next_attempt_at = now()");
    expect(await sendDueMail(db, transport, FROM)).toEqual({ sent: 2, failed: 0 });
    const again = await waitForCopies(first, 2);
    expect(again).toHaveLength(2);
    expect(new Set(again.map((m) => m.messageId))).toEqual(new Set([outboxMessageId(ids.get(first)!, FROM)]));
    const secondCopies = await waitForCopies(second, 1);
    expect(secondCopies).toHaveLength(1);
    expect(secondCopies[0].messageId).toBe(`<outbox.${ids.get(second)}@optics.example.edu>`);
    expect(secondCopies[0].messageId).not.toBe(again[0].messageId);
    const done = await pool.query<{ state: string; attempts: number }>("select state, attempts from mail_outbox order by created_at");
    expect(done.rows).toEqual([
      { state: "sent", attempts: 2 },
      { state: "sent", attempts: 2 },
    ]);
    expect(await sendDueMail(db, transport, FROM)).toEqual({ sent: 0, failed: 0 });
  });

  it("stops sending a message whose every claim ended with its worker dead, and marks it failed", async () => {
    const { enqueueMail } = await import("../../lib/mail/outbox");
    const { sendDueMail, LOST_CLAIMS_ERROR, MAX_ATTEMPTS } = await import("../../lib/mail/worker");
    const { smtpTransport } = await import("../../lib/mail/transport");
    const to = `claimed-too-often-${run}@northmere.example.edu`;
    await enqueueMail(db, { to, subject: `Delivery test ${run} (lost claims)`, text: "lost", html: "<p>lost</p>" });
    // As after MAX_ATTEMPTS claims whose workers all died before the mark, the last lease now over.
    await pool.query("update mail_outbox set attempts = $2, next_attempt_at = now() where to_address = $1", [to, MAX_ATTEMPTS]);
    const transport = smtpTransport({ SMTP_HOST: "127.0.0.1", SMTP_PORT, SMTP_SECURE: "false" });
    expect(await sendDueMail(db, transport, FROM)).toEqual({ sent: 0, failed: 0 });
    const { rows } = await pool.query("select state, attempts, last_error from mail_outbox where to_address = $1", [to]);
    expect(rows[0]).toEqual({ state: "failed", attempts: MAX_ATTEMPTS, last_error: LOST_CLAIMS_ERROR });
    await new Promise((r) => setTimeout(r, 500));
    expect(await caught(to)).toHaveLength(0);
  });
});
