// Attacks on the secrets: guessing a password by rotating X-Forwarded-For, by rotating accounts, and
// guessing the signing (step-up) password. Limits are counted in PostgreSQL per account and per client
// address; the address comes from X-Forwarded-For only when a trusted proxy is configured. `npm test`
// runs the app with TRUSTED_PROXY_COUNT=1 (the tests stand where the proxy would); a second server
// started here has no trusted proxy and must ignore the header.
import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { APP_URL, call, DEMO, signIn } from "../support/http";
import { createAccount, createDrawnBench, databaseUrl, labIdByName, sampleBench } from "../support/review-fixtures";

const root = path.resolve(import.meta.dirname, "../..");
const UNTRUSTING_PORT = Number(process.env.TEST_UNTRUSTING_PORT ?? 3199);
const UNTRUSTING_URL = `http://127.0.0.1:${UNTRUSTING_PORT}`;
let untrusting: ChildProcess | null = null;
let pool: pg.Pool;

async function signInAt(base: string, email: string, password: string, forwardedFor?: string) {
  const res = await fetch(`${base}/api/auth/sign-in/email`, {
    method: "POST",
    // The app's own origin (both servers serve the same APP_URL, as two instances behind one name).
    headers: { "content-type": "application/json", origin: APP_URL, ...(forwardedFor ? { "x-forwarded-for": forwardedFor } : {}) },
    body: JSON.stringify({ email, password }),
  });
  return res.status;
}

async function lastSignInAddress(userId: string): Promise<string | null> {
  const { rows } = await pool.query<{ ip_address: string | null }>("select ip_address from audit_event where action = 'signed-in' and actor_id = $1 order by at desc limit 1", [userId]);
  return rows[0]?.ip_address ?? null;
}

beforeAll(async () => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 2 });
  untrusting = spawn(path.join(root, "node_modules/.bin/next"), ["start", "-H", "127.0.0.1", "-p", String(UNTRUSTING_PORT)], {
    cwd: root,
    env: { ...process.env, NODE_ENV: "production", TRUSTED_PROXY_COUNT: "0" },
    stdio: ["ignore", "ignore", "inherit"],
  });
  const deadline = Date.now() + 30_000;
  for (;;) {
    const ok = await fetch(`${UNTRUSTING_URL}/api/health`).then((r) => r.ok).catch(() => false);
    if (ok) break;
    if (Date.now() > deadline) throw new Error("the second server did not start");
    await new Promise((r) => setTimeout(r, 250));
  }
});

afterAll(async () => {
  untrusting?.kill("SIGTERM");
  // The untrusting server saw every test from 127.0.0.1: forget that address's attempts, so the
  // browser tests that follow (also from 127.0.0.1) start with a clean count.
  await pool?.query("delete from auth_attempt where subject = 'address:127.0.0.1'");
  await pool?.end();
});

describe("sign-in limits", () => {
  it("one account cannot be guessed by rotating X-Forwarded-For: the account's own limit holds", async () => {
    const victim = await createAccount(pool, { name: "Guessed Person", roles: ["researcher"], labIds: [], password: "the-real-password-1" });
    const statuses: number[] = [];
    for (let i = 0; i < 14; i++) statuses.push(await signInAt(APP_URL, victim.email, `guess-number-${i}`, `198.18.${i}.${i + 1}`));
    expect(statuses.slice(0, 10)).toEqual(Array(10).fill(401));
    expect(statuses.slice(10)).toEqual(Array(4).fill(429));
    // Even the right password waits now, from any address: the guesser cannot tell a hit.
    expect(await signInAt(APP_URL, victim.email, "the-real-password-1", "198.18.200.1")).toBe(429);
    const { rows } = await pool.query<{ n: number }>("select count(*)::int as n from auth_attempt where scope = 'sign-in' and subject = $1", [`account:${victim.email}`]);
    expect(rows[0].n).toBe(10);
  });

  it("a burst of parallel guesses cannot outrun the count", async () => {
    const victim = await createAccount(pool, { name: "Burst Target", roles: ["researcher"], labIds: [], password: "the-real-password-2" });
    const statuses = await Promise.all(Array.from({ length: 25 }, (_, i) => signInAt(APP_URL, victim.email, `burst-${i}`, `198.19.${i}.7`)));
    expect(statuses.filter((s) => s === 401).length).toBeLessThanOrEqual(10);
    expect(statuses.filter((s) => s === 429).length).toBeGreaterThanOrEqual(15);
  });

  it("with a trusted proxy configured, the forwarded client address is used and recorded", async () => {
    const person = await createAccount(pool, { name: "Proxied Person", roles: ["researcher"], labIds: [], password: "proxied-password-1" });
    expect(await signInAt(APP_URL, person.email, "proxied-password-1", "203.0.113.50")).toBe(200);
    expect(await lastSignInAddress(person.id)).toBe("203.0.113.50");
    // One trusted hop: the right-most entry is what our proxy saw; what the client wrote before it is not trusted.
    expect(await signInAt(APP_URL, person.email, "proxied-password-1", "192.0.2.66, 203.0.113.51")).toBe(200);
    expect(await lastSignInAddress(person.id)).toBe("203.0.113.51");
  });

  it("without a trusted proxy, X-Forwarded-For is ignored: the socket's address is recorded and limited", async () => {
    const person = await createAccount(pool, { name: "Direct Person", roles: ["researcher"], labIds: [], password: "direct-password-1" });
    expect(await signInAt(UNTRUSTING_URL, person.email, "direct-password-1", "203.0.113.77")).toBe(200);
    expect(await lastSignInAddress(person.id)).toBe("127.0.0.1");
    // Guessing many accounts while rotating the header still counts against the one real address.
    const statuses: number[] = [];
    for (let i = 0; i < 34; i++) statuses.push(await signInAt(UNTRUSTING_URL, `rotating-${i}-${Date.now()}@northmere.example.edu`, "wrong-password-x", `198.18.77.${i + 1}`));
    expect(statuses.slice(0, 25).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(-3)).toEqual([429, 429, 429]);
    const { rows } = await pool.query<{ n: number }>("select count(*)::int as n from auth_attempt where subject like 'address:198.18.77.%' and attempted_at > now() - interval '1 minute'");
    expect(rows[0].n).toBe(0);
  });
});

describe("the signing step-up", () => {
  it("is limited per account, and every failure and the refusal are in the trail", async () => {
    const researcherCookie = (await signIn(DEMO.researcher)).cookie;
    const labId = await labIdByName(researcherCookie, "Wrenfield Imaging Lab");
    const b = await createDrawnBench(pool, researcherCookie, labId, sampleBench(`Step-up guessing ${Date.now()}`));
    expect((await call("POST", `/api/revisions/${b.revisionId}/submit`, researcherCookie, { contentHash: b.contentHash })).status).toBe(200);
    const officer = await createAccount(pool, { name: "Guessing Officer", roles: ["officer"], labIds: [], password: "officer-real-password" });
    const cookie = (await signIn(officer.email, "officer-real-password")).cookie;
    const statuses: number[] = [];
    for (let i = 0; i < 10; i++) {
      const res = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie, { outcome: "approve", contentHash: b.contentHash, password: `guess-${i}` });
      statuses.push(res.status);
    }
    expect(statuses.slice(0, 8)).toEqual(Array(8).fill(403));
    expect(statuses.slice(8)).toEqual([429, 429]);
    const right = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie, { outcome: "approve", contentHash: b.contentHash, password: "officer-real-password" });
    expect(right.status).toBe(429);
    expect((right.json!.error as { message: string }).message).toMatch(/Too many wrong signing password attempts for this account/);
    const trail = await pool.query<{ action: string }>("select action from audit_event where actor_id = $1 and revision_id = $2 order by at", [officer.id, b.revisionId]);
    expect(trail.rows.filter((r) => r.action === "sign-off-password-refused").length).toBe(8);
    expect(trail.rows.filter((r) => r.action === "sign-off-password-limited").length).toBe(3);
    const state = await pool.query<{ state: string }>("select state from bench_revision where id = $1", [b.revisionId]);
    expect(state.rows[0].state).toBe("submitted");
  });
});
