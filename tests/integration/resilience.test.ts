// The app and the mail worker survive losing their database connections (what a PostgreSQL restart
// does to them), the worker sends with no row lock held, and the readiness route reports the queue.
import { randomUUID } from "node:crypto";
import { drizzle } from "drizzle-orm/node-postgres";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as schema from "../../db/schema";
import type { Database } from "../../db";
import type { MailTransport } from "../../lib/mail/transport";
import { APP_URL, waitForMail } from "../support/http";
import { databaseUrl, superuserUrl } from "../support/review-fixtures";

let pool: pg.Pool;
let superPool: pg.Pool;
let db: Database;

beforeAll(() => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 3 });
  pool.on("error", () => undefined); // this test kills connections on purpose
  superPool = new pg.Pool({ connectionString: superuserUrl(), max: 1 });
  db = drizzle(pool, { schema }) as unknown as Database;
});

afterAll(async () => {
  await pool?.end();
  await superPool?.end();
});

async function enqueue(to: string, subject: string): Promise<string> {
  const id = randomUUID();
  await pool.query(
    "insert into mail_outbox (id, to_address, subject, text_body, html_body) values ($1, $2, $3, 'resilience check', '<p>resilience check</p>')",
    [id, to, subject],
  );
  return id;
}

async function readiness(): Promise<{ status: number; body: { ok: boolean; database: string; outbox: { pending: number; failed: number; oldestPendingS: number | null } | null } }> {
  const res = await fetch(`${APP_URL}/api/health/ready`);
  return { status: res.status, body: await res.json() };
}

describe("readiness", () => {
  it("reports the database up and the outbox's depth and oldest waiting message", async () => {
    const { status, body } = await readiness();
    expect(status).toBe(200);
    expect(body).toMatchObject({ ok: true, database: "up" });
    expect(body.outbox?.pending).toBeGreaterThanOrEqual(0);
    expect(body.outbox?.failed).toBeGreaterThanOrEqual(0);
  });
});

describe("losing every database connection", () => {
  it("leaves the app answering and the mail worker sending afterwards", async () => {
    // What a PostgreSQL restart does to the clients: every server process of this database ends.
    const killed = await superPool.query(
      "select count(pg_terminate_backend(pid)) as n from pg_stat_activity where datname = $1 and pid <> pg_backend_pid()",
      [new URL(databaseUrl()).pathname.slice(1)],
    );
    expect(Number(killed.rows[0].n)).toBeGreaterThan(0);

    // The app's pool opens new connections on the next request.
    let ready = await readiness();
    for (let i = 0; i < 20 && ready.status !== 200; i++) {
      await new Promise((r) => setTimeout(r, 250));
      ready = await readiness();
    }
    expect(ready.status).toBe(200);

    // The worker process is still there (or was started again) and still sends.
    const to = `resilience-${Date.now().toString(36)}@northmere.example.edu`;
    await enqueue(to, "Resilience check after the connections were lost");
    const mail = await waitForMail(to, /Resilience check/, 30_000);
    expect(mail.text).toContain("resilience check");
  });
});

describe("claim, then send", () => {
  it("holds no lock on the row while the SMTP conversation runs, and sends each message once", async () => {
    const { sendDueMail } = await import("../../lib/mail/worker");
    const { smtpTransport } = await import("../../lib/mail/transport");
    const real = smtpTransport({ SMTP_HOST: "127.0.0.1", SMTP_PORT: Number(process.env.SMTP_PORT ?? 2525), SMTP_SECURE: "false" });
    const to = `claim-${Date.now().toString(36)}@northmere.example.edu`;
    const id = await enqueue(to, "Claim check");
    // The background worker (every 300 ms) may claim it first; either way it is sent exactly once.
    const probe = await pool.connect();
    let lockedDuringSend: boolean | null = null;
    const sent: string[] = [];
    const transport: MailTransport = {
      async send(message) {
        sent.push(String(message.to));
        if (message.to !== to) return real.send(message); // other tests' mail goes out as usual
        try {
          await probe.query("begin");
          await probe.query("select id from mail_outbox where id = $1 for update nowait", [id]);
          lockedDuringSend = false;
        } catch {
          lockedDuringSend = true;
        } finally {
          await probe.query("rollback");
        }
      },
    };
    try {
      await sendDueMail(db, transport, "Benchwarden <benchwarden@optics.example.edu>", 50);
    } finally {
      probe.release();
    }
    const { rows } = await pool.query("select state from mail_outbox where id = $1", [id]);
    if (sent.includes(to)) {
      expect(lockedDuringSend).toBe(false);
      expect(rows[0].state).toBe("sent");
    } else {
      // The background worker took it first; it was still sent exactly once, by the worker.
      const mail = await waitForMail(to, /Claim check/, 15_000);
      expect(mail.subject).toBe("Claim check");
    }
  });
});
