// Two app servers and two mail workers on one PostgreSQL (scripts/test.ts starts the second pair), as
// an institution runs Benchwarden behind a proxy: a session made on one server works on the other,
// a sign-out or a deactivation on one holds at once on the other, every e-mail goes out once, and
// an upload stored through one server (in the S3-compatible store both use) is served by the other.
import { randomUUID } from "node:crypto";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createStorage } from "../../lib/storage";
import { APP_URL, CATCHER_URL, call, DEMO, DEMO_PASSWORD, signIn, type CaughtMail } from "../support/http";
import { DEMO_LAB_NAME } from "../support/demo";
import { createAccount, createDrawnBench, databaseUrl, labIdByName, sampleBench } from "../support/review-fixtures";

const SECOND = process.env.SECOND_APP_URL ?? "http://127.0.0.1:3101";
let pool: pg.Pool;

/** A request to the second server as the proxy would pass it on (the public origin stays APP_URL). */
async function onSecond(method: string, path: string, cookie?: string, body?: unknown): Promise<{ status: number; json: Record<string, unknown> | null }> {
  const res = await fetch(`${SECOND}${path}`, {
    method,
    headers: { origin: APP_URL, ...(cookie ? { cookie } : {}), ...(body !== undefined ? { "content-type": "application/json" } : {}) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await res.text();
  let json: Record<string, unknown> | null = null;
  try {
    json = JSON.parse(text);
  } catch {
    json = null;
  }
  return { status: res.status, json };
}

beforeAll(() => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 2 });
});

afterAll(async () => {
  await pool?.end();
});

describe("two app servers on one database", () => {
  it("a session made on the first server works on the second and sees the same benches", async () => {
    const { status, cookie } = await signIn(DEMO.researcher);
    expect(status).toBe(200);
    const first = await call("GET", "/api/benches", cookie);
    const second = await onSecond("GET", "/api/benches", cookie);
    expect(first.status).toBe(200);
    expect(second.status).toBe(200);
    expect(second.json).toEqual(first.json);
  });

  it("a sign-out on the second server holds at once on the first", async () => {
    const { cookie } = await signIn(DEMO.auditor);
    expect((await call("GET", "/api/benches", cookie)).status).toBe(200); // the first server knows the caller now
    const out = await fetch(`${SECOND}/api/auth/sign-out`, { method: "POST", headers: { origin: APP_URL, cookie, "content-type": "application/json" }, body: "{}" });
    expect(out.status).toBe(200);
    expect((await call("GET", "/api/benches", cookie)).status).toBe(401);
  });

  it("a deactivation on the first server holds at once on the second", async () => {
    const admin = await signIn(DEMO.admin);
    const labId: string = (await pool.query("select id from lab order by name limit 1")).rows[0].id;
    const password = "two-servers-password-2026";
    const person = await createAccount(pool, { name: "Orla Trevane", roles: ["researcher"], labIds: [labId], password });
    const session = await signIn(person.email, password);
    expect(session.status).toBe(200);
    expect((await onSecond("GET", "/api/benches", session.cookie)).status).toBe(200); // cached there, if anything is
    const off = await call("POST", `/api/admin/people/${person.id}/deactivate`, admin.cookie, { reason: "left the institute" });
    expect(off.status, JSON.stringify(off.json)).toBe(200);
    expect((await onSecond("GET", "/api/benches", session.cookie)).status).toBe(401);
  });
});

describe("two mail workers on one outbox", () => {
  it("send each of 40 messages exactly once", async () => {
    const marker = randomUUID().slice(0, 8);
    const addresses = Array.from({ length: 40 }, (_, i) => `twice-${marker}-${i}@northmere.example.edu`);
    for (const to of addresses) {
      await pool.query("insert into mail_outbox (to_address, subject, text_body, html_body) values ($1, $2, 'two workers', '<p>two workers</p>')", [to, `Two workers ${marker}`]);
    }
    const deadline = Date.now() + 60_000;
    for (;;) {
      const { rows } = await pool.query("select count(*)::int as n from mail_outbox where subject = $1 and state = 'sent'", [`Two workers ${marker}`]);
      if (rows[0].n === addresses.length) break;
      if (Date.now() > deadline) throw new Error(`only ${rows[0].n} of ${addresses.length} sent within 60 s`);
      await new Promise((r) => setTimeout(r, 250));
    }
    const caught = await Promise.all(
      addresses.map(async (to) => ((await (await fetch(`${CATCHER_URL}/api/messages?to=${encodeURIComponent(to)}`)).json()) as CaughtMail[]).length),
    );
    expect(caught).toEqual(addresses.map(() => 1));
  });
});

describe("two app servers on one S3-compatible store", () => {
  it("an upload stored through the first server is served by the second, from the object store", async () => {
    expect(process.env.STORAGE_DRIVER, "npm test runs both servers on the S3 fake").toBe("s3");
    const [researcher, officer, technician] = await Promise.all([signIn(DEMO.researcher), signIn(DEMO.officer), signIn(DEMO.technician)]);
    const labId = await labIdByName(researcher.cookie, DEMO_LAB_NAME);
    const b = await createDrawnBench(pool, researcher.cookie, labId, sampleBench(`Two servers upload ${randomUUID().slice(0, 8)}`));
    expect((await call("POST", `/api/revisions/${b.revisionId}/submit`, researcher.cookie, { contentHash: b.contentHash })).status).toBe(200);
    const decided = await call("POST", `/api/revisions/${b.revisionId}/decision`, officer.cookie, { outcome: "approve", contentHash: b.contentHash, password: DEMO_PASSWORD });
    expect(decided.status, decided.text).toBe(201);
    const started = await call("POST", "/api/builds", technician.cookie, { revisionId: b.revisionId });
    expect(started.status, started.text).toBe(201);
    const buildId = (started.json!.build as { id: string }).id;

    const png = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.from(randomUUID())]);
    const form = new FormData();
    form.set("file", new Blob([new Uint8Array(png)], { type: "image/png" }), "screen-two-servers.png");
    form.set("kind", "screen-photo");
    const stored = await fetch(`${APP_URL}/api/builds/${buildId}/uploads`, { method: "POST", headers: { cookie: technician.cookie, origin: APP_URL }, body: form });
    expect(stored.status).toBe(201);
    const upload = ((await stored.json()) as { upload: { id: string; url: string } }).upload;

    const served = await fetch(`${SECOND}${upload.url}`, { headers: { cookie: technician.cookie } });
    expect(served.status).toBe(200);
    expect(Buffer.compare(Buffer.from(await served.arrayBuffer()), png)).toBe(0);

    // The bytes are in the object store under the row's key (not on one server's disk).
    const { rows } = await pool.query("select storage_key from upload where id = $1", [upload.id]);
    expect(rows).toHaveLength(1);
    const store = createStorage({ ...process.env, STORAGE_DRIVER: "s3" } as Parameters<typeof createStorage>[0]);
    const kept = await store.get(rows[0].storage_key);
    expect(kept && Buffer.compare(kept, png)).toBe(0);
  }, 60_000);
});
