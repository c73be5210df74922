// "Waiting for you" over HTTP against the running server: an officer's count rises when a researcher
// submits; the sign-off then waits for the lab's technician but not for a technician of another lab; a bench
// sent back waits for its author; a sign-off ending within 30 days waits for the auditor; lab scope holds.
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call, DEMO, DEMO_PASSWORD, signIn } from "../support/http";
import { createAccount, createDrawnBench, databaseUrl, labIdByName, sampleBench } from "../support/review-fixtures";

const run = Date.now().toString(36);
let pool: pg.Pool;
const cookie = {} as Record<"researcher" | "officer" | "technician" | "auditor" | "admin" | "student" | "otherTechnician", string>;
let coherentLabId = "";

type Item = { id: string; title: string; detail: string; href: string; at: string };
type Section = { role: string; label: string; navHref: string; listHref: string; count: number; items: Item[] };
type Inbox = { total: number; sections: Section[] };

async function inbox(who: string): Promise<Inbox> {
  const res = await call("GET", "/api/inbox", who);
  expect(res.status, res.text).toBe(200);
  return res.json as unknown as Inbox;
}

async function section(who: string, role: string): Promise<Section> {
  const found = (await inbox(who)).sections.find((s) => s.role === role);
  expect(found, `a ${role} section`).toBeTruthy();
  return found!;
}

beforeAll(async () => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 2 });
  for (const key of ["researcher", "officer", "technician", "auditor", "admin", "student"] as const) {
    const s = await signIn(DEMO[key]);
    expect(s.status, `${key} signs in`).toBe(200);
    cookie[key] = s.cookie;
  }
  coherentLabId = await labIdByName(cookie.researcher, "Wrenfield Imaging Lab");
  const teachingLabId = await labIdByName(cookie.admin, "Spectroscopy Teaching Lab");
  const password = `other-tech-${run}-pw`;
  const other = await createAccount(pool, { name: `Other Technician ${run}`, roles: ["technician"], labIds: [teachingLabId], password });
  const s = await signIn(other.email, password);
  expect(s.status).toBe(200);
  cookie.otherTechnician = s.cookie;
});

afterAll(async () => {
  await pool?.end();
});

describe("GET /api/inbox", () => {
  it("needs a session, and gives an administrator no sections", async () => {
    expect((await call("GET", "/api/inbox")).status).toBe(401);
    expect(await inbox(cookie.admin)).toEqual({ total: 0, sections: [] });
  });

  it("gives each role its own section, beside its own nav link", async () => {
    expect((await inbox(cookie.officer)).sections.map((s) => [s.role, s.navHref])).toEqual([["officer", "/reviews"]]);
    expect((await inbox(cookie.researcher)).sections.map((s) => [s.role, s.navHref])).toEqual([["researcher", "/benches"]]);
    expect((await inbox(cookie.technician)).sections.map((s) => [s.role, s.navHref])).toEqual([["technician", "/builds"]]);
    expect((await inbox(cookie.auditor)).sections.map((s) => [s.role, s.navHref])).toEqual([["auditor", "/desk"]]);
  });

  it("a submission raises the officer's count by one; its sign-off waits for the lab's technician, not another lab's", async () => {
    const title = `Inbox submit ${run}`;
    const b = await createDrawnBench(pool, cookie.researcher, coherentLabId, sampleBench(title));
    const officerBefore = await section(cookie.officer, "officer");
    const submitted = await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, { contentHash: b.contentHash });
    expect(submitted.status, submitted.text).toBe(200);
    const officerAfter = await section(cookie.officer, "officer");
    expect(officerAfter.count).toBe(officerBefore.count + 1);
    const item = officerAfter.items.find((i) => i.href === `/reviews/${b.revisionId}`);
    expect(item, "the new submission is listed first").toBeTruthy();
    expect(item!.title).toBe(`${title}, revision 1`);
    expect(item!.detail).toMatch(/Sent for review by .+ \(Wrenfield Imaging Lab\)/);

    const techBefore = await section(cookie.technician, "technician");
    const otherBefore = await section(cookie.otherTechnician, "technician");
    const decided = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "approve", contentHash: b.contentHash, password: DEMO_PASSWORD });
    expect(decided.status, decided.text).toBe(201);
    expect((await section(cookie.officer, "officer")).items.some((i) => i.href === `/reviews/${b.revisionId}`)).toBe(false);

    const techAfter = await section(cookie.technician, "technician");
    expect(techAfter.count).toBe(techBefore.count + 1);
    expect(techAfter.items.some((i) => i.id === `build-${b.revisionId}`)).toBe(true);
    const otherAfter = await section(cookie.otherTechnician, "technician");
    expect(otherAfter.count).toBe(otherBefore.count);
    expect(otherAfter.items.some((i) => i.id === `build-${b.revisionId}`)).toBe(false);

    // Once built (a completed build record), it no longer waits.
    const started = await call("POST", "/api/builds", cookie.technician, { revisionId: b.revisionId });
    expect(started.status, started.text).toBe(201);
    await pool.query("update build_record set state = 'completed', signed_off_at = now() where id = $1", [(started.json!.build as { id: string }).id]);
    const techDone = await section(cookie.technician, "technician");
    expect(techDone.items.some((i) => i.id === `build-${b.revisionId}`)).toBe(false);
    expect(techDone.count).toBe(techAfter.count - 1);
  });

  it("a bench sent back waits for its author, with the officer's comment folded into the same line", async () => {
    const title = `Inbox sent back ${run}`;
    const b = await createDrawnBench(pool, cookie.researcher, coherentLabId, sampleBench(title));
    expect((await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, { contentHash: b.contentHash })).status).toBe(200);
    const before = await section(cookie.researcher, "researcher");
    const decided = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "request-changes", contentHash: b.contentHash, comment: "Add a beam block behind the screen." });
    expect(decided.status, decided.text).toBe(201);
    const after = await section(cookie.researcher, "researcher");
    expect(after.count).toBe(before.count + 1);
    const item = after.items.find((i) => i.id === `bench-${b.benchId}`)!;
    expect(item.title).toBe(title);
    expect(item.detail).toBe("Changes asked on revision 1 · 1 new comment in the last 7 days");
    expect(item.href).toBe(`/reviews/${b.revisionId}`);
    // Another lab's researcher (the student) never sees it.
    const student = await section(cookie.student, "researcher");
    expect(student.items.some((i) => i.id === `bench-${b.benchId}`)).toBe(false);
  });

  it("a sign-off ending within 30 days waits for the auditor", async () => {
    const title = `Inbox expiring ${run}`;
    const b = await createDrawnBench(pool, cookie.researcher, coherentLabId, sampleBench(title));
    expect((await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, { contentHash: b.contentHash })).status).toBe(200);
    const before = await section(cookie.auditor, "auditor");
    const soon = new Date(Date.now() + 2 * 86_400_000).toISOString().slice(0, 10);
    const decided = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "approve", contentHash: b.contentHash, password: DEMO_PASSWORD, validUntil: soon });
    expect(decided.status, decided.text).toBe(201);
    const after = await section(cookie.auditor, "auditor");
    expect(after.count).toBe(before.count + 1);
    expect(after.listHref).toBe("/desk?expiring=30");
    const item = after.items.find((i) => i.id === `expiring-${b.revisionId}`);
    expect(item, "soonest expiries come first").toBeTruthy();
    expect(item!.detail).toContain(`ends ${soon}`);
    expect(item!.href).toBe(`/desk/benches/${b.benchId}`);
  });
});
