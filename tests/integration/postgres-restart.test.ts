// A real PostgreSQL restart under load: the test cluster's postgres is stopped (pg_ctl, fast mode,
// as the postgres user — scripts/lib/postgres.ts) and started again while both app servers answer
// requests and both mail workers send. Afterwards both servers answer again with the same session,
// and every e-mail queued before, during and after the restart is sent exactly once.
// The cluster is started again in afterAll whatever happens, for the tests after this one.
import { randomUUID } from "node:crypto";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startCluster, stopCluster, type Cluster } from "../../scripts/lib/postgres";
import { APP_URL, CATCHER_URL, DEMO, signIn, type CaughtMail } from "../support/http";
import { databaseUrl } from "../support/review-fixtures";

const SECOND = process.env.SECOND_APP_URL ?? "http://127.0.0.1:3101";
const SERVERS = [APP_URL, SECOND];
const dataDir = process.env.TEST_PG_DATA_DIR;
const cluster: Cluster | null = dataDir ? { dataDir, port: Number(process.env.TEST_PG_PORT ?? 5434), superPassword: "" } : null;

let pool: pg.Pool;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

beforeAll(() => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 2, connectionTimeoutMillis: 2000 });
  pool.on("error", () => undefined); // the restart ends this pool's idle connections on purpose
});

afterAll(async () => {
  if (cluster) startCluster(cluster); // no-op when it is running
  await pool?.end();
});

/** Queues one e-mail with its own id; retried until the database takes it (the id makes a retry harmless). */
async function enqueue(to: string, subject: string, deadline: number): Promise<void> {
  const id = randomUUID();
  for (;;) {
    try {
      await pool.query(
        "insert into mail_outbox (id, to_address, subject, text_body, html_body) values ($1, $2, $3, 'restart check', '<p>restart check</p>') on conflict (id) do nothing",
        [id, to, subject],
      );
      return;
    } catch (error) {
      if (Date.now() > deadline) throw error;
      await sleep(200);
    }
  }
}

async function ready(server: string): Promise<number> {
  try {
    return (await fetch(`${server}/api/health/ready`)).status;
  } catch {
    return 0;
  }
}

describe.skipIf(!cluster)("a PostgreSQL restart under load", () => {
  it("loses no e-mail, sends none twice, and both servers answer again with the same session", async () => {
    const { cookie, status } = await signIn(DEMO.researcher);
    expect(status).toBe(200);
    const before = await fetch(`${SECOND}/api/benches`, { headers: { cookie } });
    expect(before.status).toBe(200);
    const benchesBefore = ((await before.json()) as { benches: unknown[] }).benches.length;

    const marker = randomUUID().slice(0, 8);
    const subject = `Restart check ${marker}`;
    const addresses: string[] = [];
    const address = () => {
      const to = `restart-${marker}-${addresses.length}@northmere.example.edu`;
      addresses.push(to);
      return to;
    };
    const deadline = Date.now() + 90_000;
    for (let i = 0; i < 30; i++) await enqueue(address(), subject, deadline);

    // Load: both servers asked for the bench list, and e-mails queued, the whole time.
    let loading = true;
    const answers: { phase: string; status: number; json: boolean }[] = [];
    let phase = "before";
    const requests = (async () => {
      for (let i = 0; loading && i < 2000; i++) {
        const server = SERVERS[i % 2];
        try {
          const res = await fetch(`${server}/api/benches`, { headers: { cookie }, signal: AbortSignal.timeout(10_000) });
          const text = await res.text();
          let json = false;
          try {
            JSON.parse(text);
            json = true;
          } catch {
            json = false;
          }
          answers.push({ phase, status: res.status, json });
        } catch {
          answers.push({ phase, status: 0, json: false });
        }
        await sleep(50);
      }
    })();
    const mail = (async () => {
      for (let i = 0; loading && i < 200; i++) {
        await enqueue(address(), subject, deadline);
        await sleep(100);
      }
    })();

    await sleep(1500);
    phase = "down";
    stopCluster(cluster!);
    await sleep(3000);
    startCluster(cluster!);
    phase = "after";

    // Both servers report ready again by themselves.
    for (const server of SERVERS) {
      let s = await ready(server);
      for (let i = 0; i < 60 && s !== 200; i++) {
        await sleep(500);
        s = await ready(server);
      }
      expect(s, `${server} ready after the restart`).toBe(200);
    }
    await sleep(1500);
    loading = false;
    await Promise.all([requests, mail]);

    // The same session works on both servers, with the same benches.
    for (const server of SERVERS) {
      const res = await fetch(`${server}/api/benches`, { headers: { cookie } });
      expect(res.status, server).toBe(200);
      expect(((await res.json()) as { benches: unknown[] }).benches.length).toBe(benchesBefore);
    }
    // While the database was away, an answer was a refusal in JSON (never an HTML error page);
    // before and after, every answer was a 200.
    expect(answers.filter((a) => a.phase !== "down" && a.phase !== "after").every((a) => a.status === 200)).toBe(true);
    expect(answers.filter((a) => a.status !== 200 && a.status !== 0 && !a.json)).toEqual([]);
    const after = answers.filter((a) => a.phase === "after");
    expect(after.length).toBeGreaterThan(0);
    expect(after.slice(-10).every((a) => a.status === 200)).toBe(true);

    // Every queued e-mail goes out, each exactly once.
    expect(addresses.length).toBeGreaterThan(30);
    for (;;) {
      const { rows } = await pool.query("select count(*)::int as n from mail_outbox where subject = $1 and state = 'sent'", [subject]);
      if (rows[0].n === addresses.length) break;
      if (Date.now() > deadline) throw new Error(`only ${rows[0].n} of ${addresses.length} e-mails sent within 90 s of the restart`);
      await sleep(500);
    }
    const { rows: queued } = await pool.query("select count(*)::int as n from mail_outbox where subject = $1", [subject]);
    expect(queued[0].n).toBe(addresses.length);
    const caught = await Promise.all(
      addresses.map(async (to) => ((await (await fetch(`${CATCHER_URL}/api/messages?to=${encodeURIComponent(to)}`)).json()) as CaughtMail[]).length),
    );
    expect(caught).toEqual(addresses.map(() => 1));
  }, 150_000);
});
