// The sign-off workflow over HTTP against the running server, the real PostgreSQL and the mail
// catcher: submit → comment → decide, every illegal move refused with a sentence, the step-up
// password, two officers at once, the expiry clock, the outbox with SMTP down, append-only records.
import path from "node:path";
import { drizzle } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as schema from "../../db/schema";
import type { Database } from "../../db";
import { APP_URL, call, DEMO, DEMO_PASSWORD, signIn, waitForMail } from "../support/http";
import { addDraftRevision, createAccount, createDrawnBench, databaseUrl, labIdByName, sampleBench, superuserUrl } from "../support/review-fixtures";

// The lib code builds links from env(); give it what the server has when run outside `npm test`.
process.env.APP_URL ??= APP_URL;
process.env.DATABASE_URL ??= databaseUrl();
process.env.BETTER_AUTH_SECRET ??= "review-tests-only-secret-0123456789abcdef";

const run = Date.now().toString(36);
let pool: pg.Pool;
let db: Database;
const cookie = {} as Record<"researcher" | "officer" | "technician" | "auditor", string>;
let imagingLabId = "";

type Json = Record<string, unknown>;
const errorOf = (res: { json: Json | null }) => (res.json?.error ?? {}) as { code: string; message: string; fields: { path: string }[] };

// Revisions left waiting are withdrawn at the end, so the shared dev queue does not fill up with test benches.
const leftWaiting: { revisionId: string; cookie: () => string }[] = [];

async function submitted(title: string, overrides?: Parameters<typeof sampleBench>[1]) {
  const b = await createDrawnBench(pool, cookie.researcher, imagingLabId, sampleBench(title, overrides));
  const res = await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, { contentHash: b.contentHash });
  expect(res.status, res.text).toBe(200);
  leftWaiting.push({ revisionId: b.revisionId, cookie: () => cookie.researcher });
  return b;
}

const approve = (revisionId: string, hash: string, who = cookie.officer, extra: Json = {}) =>
  call("POST", `/api/revisions/${revisionId}/decision`, who, { outcome: "approve", contentHash: hash, password: DEMO_PASSWORD, ...extra });

beforeAll(async () => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 4 });
  db = drizzle(pool, { schema }) as unknown as Database;
  for (const key of ["researcher", "officer", "technician", "auditor"] as const) {
    const s = await signIn(DEMO[key]);
    expect(s.status, `${key} signs in`).toBe(200);
    cookie[key] = s.cookie;
  }
  imagingLabId = await labIdByName(cookie.researcher, "Wrenfield Imaging Lab");
});

afterAll(async () => {
  for (const w of leftWaiting) {
    const { rows } = await pool.query("select state from bench_revision where id = $1", [w.revisionId]);
    if (rows[0]?.state === "submitted") await call("POST", `/api/revisions/${w.revisionId}/withdraw`, w.cookie(), {});
  }
  await pool?.end();
});

describe("the whole review cycle", () => {
  const title = `Review happy path ${run}`;
  let b: Awaited<ReturnType<typeof createDrawnBench>>;

  it("a researcher sends a revision for review and every officer is e-mailed", async () => {
    b = await submitted(title);
    const mail = await waitForMail(DEMO.officer, new RegExp(`Waiting for your review: ${title}`));
    const link = `/reviews/${b.revisionId}`;
    for (const part of [mail.text, mail.html]) {
      expect(part).toContain(title);
      expect(part).toContain(b.contentHash);
      expect(part).toContain(link);
      expect(part).toContain("Wrenfield Imaging Lab");
    }
    expect(mail.text).toMatch(/Revision: 1/);
    expect(mail.html).toMatch(/<a href="http[^"]+\/reviews\//);
    const status = await call("GET", `/api/revisions/${b.revisionId}`, cookie.researcher);
    expect(status.json!.revision).toMatchObject({ state: "submitted", number: 1, contentHash: b.contentHash });
    expect(status.json!.may).toMatchObject({ withdraw: true, submit: false, decide: false });
  });

  it("comments go to the other party, in threads pinned to an element", async () => {
    const first = await call("POST", `/api/revisions/${b.revisionId}/comments`, cookie.officer, { body: "Is the iris mount lockable?", elementId: "iris-1" });
    expect(first.status, first.text).toBe(201);
    const toAuthor = await waitForMail(DEMO.researcher, new RegExp(`New comment on ${title}`));
    expect(toAuthor.text).toContain("Is the iris mount lockable?");
    expect(toAuthor.text).toContain('"iris-1"');
    expect(toAuthor.html).toContain(b.contentHash);

    const reply = await call("POST", `/api/revisions/${b.revisionId}/comments`, cookie.researcher, { body: "Yes, with a set screw.", parentId: first.json!.id });
    expect(reply.status, reply.text).toBe(201);
    expect(reply.json).toMatchObject({ threadId: first.json!.id, elementId: "iris-1" });
    const toOfficer = await waitForMail(DEMO.officer, new RegExp(`New comment on ${title}`));
    expect(toOfficer.text).toContain("Yes, with a set screw.");

    const unknown = await call("POST", `/api/revisions/${b.revisionId}/comments`, cookie.officer, { body: "?", elementId: "mirror-9" });
    expect(unknown.status).toBe(400);
    const threads = await call("GET", `/api/revisions/${b.revisionId}/comments`, cookie.auditor);
    expect((threads.json!.threads as { comments: unknown[] }[])[0].comments).toHaveLength(2);
    const technicianMayNot = await call("POST", `/api/revisions/${b.revisionId}/comments`, cookie.technician, { body: "hi" });
    expect(technicianMayNot.status).toBe(403);
  });

  it("the officer signs off with conditions and a re-entered password; author and technicians are told", async () => {
    const res = await approve(b.revisionId, b.contentHash, cookie.officer, { conditions: "Eyewear OD 2 at 633 nm for everyone in the room." });
    expect(res.status, res.text).toBe(201);
    const decision = res.json!.decision as Json;
    expect(res.json!.state).toBe("approved");
    expect(decision).toMatchObject({
      outcome: "approved",
      signerName: "Rafe Dunmore",
      signerRole: "Laser safety officer",
      meaning: "Approved for operation as drawn, with the conditions listed.",
      conditions: "Eyewear OD 2 at 633 nm for everyone in the room.",
      contentHash: b.contentHash,
    });
    const months = (new Date(String(decision.validUntil)).getTime() - Date.now()) / (30.44 * 86_400_000);
    expect(months).toBeGreaterThan(11.9);
    expect(months).toBeLessThan(12.1);
    const summary = decision.hazardSummary as Json;
    expect(summary.laser).toMatchObject({ wavelengthNm: 632.8, powerMw: 4 });
    expect((summary.hazardClass as Json).value).toMatch(/^(1|1M|2|2M|3R|3B|4)$/);
    expect(summary).toHaveProperty("mpe.value");
    expect(summary).toHaveProperty("nohd.value");
    expect(summary).toHaveProperty("governingOd.elementId");

    for (const to of [DEMO.researcher, DEMO.technician]) {
      const mail = await waitForMail(to, new RegExp(`Signed off: ${title}`));
      for (const part of [mail.text, mail.html]) {
        expect(part).toContain(b.contentHash);
        expect(part).toContain("Eyewear OD 2 at 633 nm");
        // the author opens the revision; the technician lands where the build is started
        expect(part).toContain(to === DEMO.technician ? `/builds#revision-${b.revisionId}` : `/reviews/${b.revisionId}`);
      }
    }
    const seen = await call("GET", `/api/revisions/${b.revisionId}`, cookie.researcher);
    expect(seen.json!.revision).toMatchObject({ state: "approved" });
    const { rows } = await pool.query("select action from audit_event where revision_id = $1 and action like 'review-%' order by at", [b.revisionId]);
    expect(rows.map((r) => r.action)).toEqual(["review-submitted", "review-comment", "review-comment", "review-approved"]);
  });

  it("the database refuses to change or remove a decision or a comment", async () => {
    // The app's role holds no UPDATE or DELETE on these tables (privileges); the owner meets the
    // append-only triggers (tests/integration/security-*). Either way the row stays as signed.
    await expect(pool.query("update review_decision set conditions = 'none' where revision_id = $1", [b.revisionId])).rejects.toThrow(/append-only|permission denied/);
    await expect(pool.query("delete from review_decision where revision_id = $1", [b.revisionId])).rejects.toThrow(/append-only|permission denied/);
    await expect(pool.query("update review_comment set body = 'rewritten' where revision_id = $1", [b.revisionId])).rejects.toThrow(/append-only|permission denied/);
    await expect(pool.query("delete from review_comment where revision_id = $1", [b.revisionId])).rejects.toThrow(/append-only|permission denied/);
    const { rows } = await pool.query("select conditions from review_decision where revision_id = $1", [b.revisionId]);
    expect(rows).toEqual([{ conditions: "Eyewear OD 2 at 633 nm for everyone in the room." }]);
  });

  it("a newer revision's sign-off replaces the older one, and the review shows what changed", async () => {
    const next = await addDraftRevision(pool, b.benchId, sampleBench(title, { irisMm: 3 }));
    const sub = await call("POST", `/api/revisions/${next.revisionId}/submit`, cookie.researcher, {});
    expect(sub.status, sub.text).toBe(200);
    const detail = await call("GET", `/api/revisions/${next.revisionId}`, cookie.officer);
    const last = detail.json!.lastApproved as { number: number; diff: { elements: { id: string; change: string; fields?: { field: string; before: unknown; after: unknown }[] }[] } };
    expect(last.number).toBe(1);
    expect(last.diff.elements.find((e) => e.id === "iris-1")).toMatchObject({ change: "changed", fields: [{ field: "diameterMm", before: 2, after: 3 }] });
    const res = await approve(next.revisionId, next.contentHash);
    expect(res.status, res.text).toBe(201);
    const old = await call("GET", `/api/revisions/${b.revisionId}`, cookie.auditor);
    expect(old.json!.revision).toMatchObject({ state: "superseded" });
  });
});

describe("illegal moves get 409 with a sentence", () => {
  it("refuses moves out of the wrong state", async () => {
    const b = await createDrawnBench(pool, cookie.researcher, imagingLabId, sampleBench(`Illegal moves ${run}`));
    const onDraft = await approve(b.revisionId, b.contentHash);
    expect(onDraft.status).toBe(409);
    expect(errorOf(onDraft).message).toMatch(/still a draft/);
    const withdrawDraft = await call("POST", `/api/revisions/${b.revisionId}/withdraw`, cookie.researcher, {});
    expect(withdrawDraft.status).toBe(409);
    const commentDraft = await call("POST", `/api/revisions/${b.revisionId}/comments`, cookie.officer, { body: "early" });
    expect(commentDraft.status).toBe(409);

    expect((await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, {})).status).toBe(200);
    const twice = await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, {});
    expect(twice.status).toBe(409);
    expect(errorOf(twice).message).toMatch(/already waiting for review/);

    const staleHash = await approve(b.revisionId, "0".repeat(64));
    expect(staleHash.status).toBe(409);
    expect(errorOf(staleHash).message).toMatch(/not the one you reviewed/);

    expect((await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "reject", contentHash: b.contentHash, reason: "Beam path crosses the walkway." })).status).toBe(201);
    const again = await approve(b.revisionId, b.contentHash);
    expect(again.status).toBe(409);
    expect(errorOf(again).message).toMatch(/turned down.*Rafe Dunmore decided/);
    const withdrawRejected = await call("POST", `/api/revisions/${b.revisionId}/withdraw`, cookie.researcher, {});
    expect(withdrawRejected.status).toBe(409);
    const resubmitRejected = await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, {});
    expect(resubmitRejected.status).toBe(409);
    expect(errorOf(resubmitRejected).message).toMatch(/new revision/);
    const mail = await waitForMail(DEMO.researcher, new RegExp(`Turned down: Illegal moves ${run}`));
    expect(mail.text).toContain("Beam path crosses the walkway.");
  });

  it("withdraw while waiting, then send again; a bench without a laser cannot be sent", async () => {
    const b = await submitted(`Withdraw ${run}`);
    const w = await call("POST", `/api/revisions/${b.revisionId}/withdraw`, cookie.researcher, {});
    expect(w.status, w.text).toBe(200);
    expect(w.json).toEqual({ state: "withdrawn" });
    // The officers, told it was waiting, are told it no longer is (text and HTML, the hash, the link).
    const notice = await waitForMail(DEMO.officer, new RegExp(`No longer waiting for review: Withdraw ${run}`));
    expect(notice.text).toContain(b.contentHash);
    expect(notice.text).toContain(`/reviews/${b.revisionId}`);
    expect(notice.html).toContain("withdrawn");
    const decideWithdrawn = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "request-changes", contentHash: b.contentHash, comment: "x" });
    expect(decideWithdrawn.status).toBe(409);
    expect((await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, {})).status).toBe(200);

    const empty = await call("POST", "/api/benches", cookie.researcher, { labId: imagingLabId, title: `Empty ${run}` });
    const detail = await call("GET", `/api/benches/${empty.json!.id}`, cookie.researcher);
    const revisionId = (detail.json!.revisions as { id: string }[])[0].id;
    const res = await call("POST", `/api/revisions/${revisionId}/submit`, cookie.researcher, {});
    expect(res.status).toBe(400);
    expect(errorOf(res).message).toMatch(/needs exactly one laser/);
  });

  it("asking for changes needs a comment, turning down needs a reason", async () => {
    const b = await submitted(`Changes ${run}`);
    const noComment = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "request-changes", contentHash: b.contentHash, comment: "  " });
    expect(noComment.status).toBe(400);
    expect(errorOf(noComment).fields[0].path).toBe("comment");
    const noReason = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "reject", contentHash: b.contentHash });
    expect(noReason.status).toBe(400);
    expect(errorOf(noReason).fields[0].path).toBe("reason");
    const ok = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "request-changes", contentHash: b.contentHash, comment: "Add a beam block after the screen." });
    expect(ok.status, ok.text).toBe(201);
    const detail = await call("GET", `/api/revisions/${b.revisionId}`, cookie.researcher);
    expect(detail.json!.revision).toMatchObject({ state: "changes-requested" });
    expect((detail.json!.threads as { comments: { body: string }[] }[])[0].comments[0].body).toBe("Add a beam block after the screen.");
    const mail = await waitForMail(DEMO.researcher, new RegExp(`Changes asked: Changes ${run}`));
    expect(mail.html).toContain("Add a beam block after the screen.");
  });

  it("two officers deciding at the same moment: exactly one decision, the other gets 409", async () => {
    const second = await createAccount(pool, { name: "Second Officer", roles: ["officer"], labIds: [], password: "second-officer-pass" });
    const secondCookie = (await signIn(second.email, "second-officer-pass")).cookie;
    const b = await submitted(`Race ${run}`);
    const results = await Promise.all([approve(b.revisionId, b.contentHash), call("POST", `/api/revisions/${b.revisionId}/decision`, secondCookie, { outcome: "reject", contentHash: b.contentHash, reason: "No." })]);
    expect(results.map((r) => r.status).sort()).toEqual([201, 409]);
    const { rows } = await pool.query("select count(*)::int as n from review_decision where revision_id = $1", [b.revisionId]);
    expect(rows[0].n).toBe(1);
  });
});

describe("who may decide", () => {
  it("a researcher cannot approve", async () => {
    const b = await submitted(`Researcher approves ${run}`);
    const res = await approve(b.revisionId, b.contentHash, cookie.researcher);
    expect(res.status).toBe(403);
    expect(errorOf(res).message).toMatch(/may not decide reviews/);
  });

  it("an officer who drew the bench cannot decide on it, holding both roles", async () => {
    const both = await createAccount(pool, { name: "Dual Role", roles: ["researcher", "officer"], labIds: [imagingLabId], password: "dual-role-password" });
    const bothCookie = (await signIn(both.email, "dual-role-password")).cookie;
    const b = await createDrawnBench(pool, bothCookie, imagingLabId, sampleBench(`Own bench ${run}`));
    expect((await call("POST", `/api/revisions/${b.revisionId}/submit`, bothCookie, {})).status).toBe(200);
    leftWaiting.push({ revisionId: b.revisionId, cookie: () => bothCookie });
    const res = await call("POST", `/api/revisions/${b.revisionId}/decision`, bothCookie, { outcome: "approve", contentHash: b.contentHash, password: "dual-role-password" });
    expect(res.status).toBe(403);
    expect(errorOf(res).message).toMatch(/You drew this bench/);
    const { rows } = await pool.query("select state from bench_revision where id = $1", [b.revisionId]);
    expect(rows[0].state).toBe("submitted");
  });

  it("a wrong password signs nothing", async () => {
    const b = await submitted(`Wrong password ${run}`);
    const res = await approve(b.revisionId, b.contentHash, cookie.officer, { password: "not-my-password" });
    expect(res.status).toBe(403);
    expect(errorOf(res).message).toMatch(/password is not right/);
    const decisions = await pool.query("select count(*)::int as n from review_decision where revision_id = $1", [b.revisionId]);
    expect(decisions.rows[0].n).toBe(0);
    const state = await pool.query("select state from bench_revision where id = $1", [b.revisionId]);
    expect(state.rows[0].state).toBe("submitted");
    const trail = await pool.query("select action from audit_event where revision_id = $1 order by at", [b.revisionId]);
    expect(trail.rows.map((r) => r.action)).toEqual(["bench-created", "review-submitted", "sign-off-password-refused"]);
  });

  it("a student of another lab cannot see or decide on it (404)", async () => {
    const b = await submitted(`Other lab ${run}`);
    const student = (await signIn(DEMO.student)).cookie;
    expect((await call("GET", `/api/revisions/${b.revisionId}`, student)).status).toBe(404);
    expect((await call("POST", `/api/revisions/${b.revisionId}/withdraw`, student, {})).status).toBe(404);
  });
});

describe("the review clock: reminders and expiry", () => {
  it("reminds once 7 days before, then expires the sign-off and says so", async () => {
    const { expireApprovals, sendExpiryReminders } = await import("../../lib/server/review-clock");
    const title = `Short sign-off ${run}`;
    const b = await submitted(title);
    const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
    const res = await approve(b.revisionId, b.contentHash, cookie.officer, { validUntil: tomorrow });
    expect(res.status, res.text).toBe(201);

    const now = new Date();
    expect(await sendExpiryReminders(db, now)).toBeGreaterThanOrEqual(1);
    await sendExpiryReminders(db, now);
    const reminders = await pool.query("select kind from review_reminder r join review_decision d on d.id = r.decision_id where d.revision_id = $1", [b.revisionId]);
    expect(reminders.rows).toEqual([{ kind: "7-days" }]);
    const reminder = await waitForMail(DEMO.researcher, new RegExp(`Sign-off ends in \\d+ days?: ${title}`));
    expect(reminder.text).toContain(b.contentHash);
    await waitForMail(DEMO.officer, new RegExp(`Sign-off ends in \\d+ days?: ${title}`));

    const later = new Date(Date.now() + 3 * 86_400_000);
    expect(await expireApprovals(db, later)).toBeGreaterThanOrEqual(1);
    const state = await pool.query("select state from bench_revision where id = $1", [b.revisionId]);
    expect(state.rows[0].state).toBe("expired");
    const expired = await waitForMail(DEMO.researcher, new RegExp(`Sign-off expired: ${title}`));
    expect(expired.html).toContain(`/reviews/${b.revisionId}`);
    expect(await expireApprovals(db, later)).toBe(0);
  });
});

describe("the outbox with the SMTP server down", () => {
  const scratch = `bw_outbox_${process.pid}`;
  let scratchPool: pg.Pool;

  beforeAll(async () => {
    const admin = new pg.Client({ connectionString: superuserUrl() });
    await admin.connect();
    await admin.query(`drop database if exists ${scratch}`);
    await admin.query(`create database ${scratch}`);
    await admin.end();
    const url = new URL(superuserUrl());
    url.pathname = `/${scratch}`;
    scratchPool = new pg.Pool({ connectionString: url.toString(), max: 2 });
    await migrate(drizzle(scratchPool), { migrationsFolder: path.resolve(import.meta.dirname, "../../migrations") });
  });

  afterAll(async () => {
    await scratchPool?.end();
    const admin = new pg.Client({ connectionString: superuserUrl() });
    await admin.connect();
    await admin.query(`drop database if exists ${scratch}`);
    await admin.end();
  });

  it("keeps a message pending with the reason while the port is closed, and sends it once it is open", async () => {
    const { enqueueMail } = await import("../../lib/mail/outbox");
    const { sendDueMail } = await import("../../lib/mail/worker");
    const { smtpTransport } = await import("../../lib/mail/transport");
    const { reviewSubmittedMail } = await import("../../lib/mail/review-mail");
    const scratchDb = drizzle(scratchPool, { schema }) as unknown as Database;
    const to = `outbox-${run}@northmere.example.edu`;
    const hash = "ab".repeat(32);
    await enqueueMail(scratchDb, reviewSubmittedMail({ email: to, name: "Outbox Test" }, { benchTitle: `Outbox ${run}`, labName: "Wrenfield Imaging Lab", revisionId: "00000000-0000-4000-8000-000000000000", revisionNumber: 1, contentHash: hash, authorName: "A" }));

    const closedPort = 1; // nothing listens on port 1 here; connecting is refused at once
    const down = smtpTransport({ SMTP_HOST: "127.0.0.1", SMTP_PORT: closedPort, SMTP_SECURE: "false" });
    expect(await sendDueMail(scratchDb, down, "Benchwarden <benchwarden@optics.example.edu>")).toEqual({ sent: 0, failed: 1 });
    const { rows } = await scratchPool.query("select state, attempts, last_error, next_attempt_at > now() as later from mail_outbox where to_address = $1", [to]);
    expect(rows[0]).toMatchObject({ state: "pending", attempts: 1, later: true });
    expect(rows[0].last_error).toMatch(/ECONNREFUSED|connect/i);

    // The backoff has passed; the server is back.
    await scratchPool.query("update mail_outbox set next_attempt_at = now() where to_address = $1", [to]);
    const up = smtpTransport({ SMTP_HOST: "127.0.0.1", SMTP_PORT: Number(process.env.SMTP_PORT ?? 2525), SMTP_SECURE: "false" });
    expect(await sendDueMail(scratchDb, up, "Benchwarden <benchwarden@optics.example.edu>")).toEqual({ sent: 1, failed: 0 });
    const after = await scratchPool.query("select state, attempts, last_error from mail_outbox where to_address = $1", [to]);
    expect(after.rows[0]).toEqual({ state: "sent", attempts: 2, last_error: null });
    const mail = await waitForMail(to, new RegExp(`Outbox ${run}`));
    expect(mail.text).toContain(hash);
    expect(await sendDueMail(scratchDb, up, "Benchwarden <benchwarden@optics.example.edu>")).toEqual({ sent: 0, failed: 0 });
  });
});
