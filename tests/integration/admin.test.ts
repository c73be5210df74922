// Administration over HTTP with a person invited by e-mail for this test: a role change takes effect
// on their next request; deactivation signs them out and keeps them out while their history stays;
// reactivation lets them back in; lab membership is added and removed; only admins may do any of it.
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call, DEMO, signIn, waitForMail, type DemoKey } from "../support/http";
import { databaseUrl, labIdByName } from "../support/review-fixtures";

const marker = `ad${Date.now().toString(36)}`;
const email = `nils-ormsby-${marker}@northmere.example.edu`;
const PASSWORD = "a-long-enough-secret";
const cookies = {} as Record<DemoKey, string>;
let pool: pg.Pool;
let imagingLabId = "";
let spectroLabId = "";
let userId = "";
let personCookie = "";
let benchId = "";

beforeAll(async () => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 2 });
  for (const key of Object.keys(DEMO) as DemoKey[]) cookies[key] = (await signIn(DEMO[key])).cookie;
  imagingLabId = await labIdByName(cookies.admin, "Wrenfield Imaging Lab");
  spectroLabId = await labIdByName(cookies.admin, "Spectroscopy Teaching Lab");
  const invited = await call("POST", "/api/invitations", cookies.admin, { email, name: `Nils Ormsby ${marker}`, roles: ["researcher"], labIds: [imagingLabId] });
  expect(invited.status, invited.text).toBe(201);
  const mail = await waitForMail(email, /invitation/i);
  const token = mail.text.match(/accept-invitation\?token=([\w-]+)/)![1];
  expect((await call("POST", "/api/invitations/accept", undefined, { token, password: PASSWORD })).status).toBe(200);
  const signedIn = await signIn(email, PASSWORD);
  expect(signedIn.status).toBe(200);
  personCookie = signedIn.cookie;
  const people = await call("GET", "/api/admin/people", cookies.admin);
  userId = (people.json!.people as { id: string; email: string }[]).find((p) => p.email === email)!.id;
  const bench = await call("POST", "/api/benches", personCookie, { labId: imagingLabId, title: `Bench by a person later deactivated ${marker}` });
  expect(bench.status).toBe(201);
  benchId = String(bench.json!.id);
});

afterAll(async () => {
  await pool?.end();
});

describe("administration", () => {
  it("lists people with roles, labs and whether the account is active — and no secrets", async () => {
    const res = await call("GET", "/api/admin/people", cookies.admin);
    expect(res.status).toBe(200);
    const me = (res.json!.people as { id: string; roles: string[]; labIds: string[]; active: boolean }[]).find((p) => p.id === userId)!;
    expect(me).toMatchObject({ roles: ["researcher"], labIds: [imagingLabId], active: true });
    expect(res.text).not.toMatch(/password|scrypt|token/i);
  });

  it("a role change takes effect on the person's next request", async () => {
    expect((await call("GET", "/api/desk/approvals", personCookie)).status).toBe(403);
    const res = await call("PUT", `/api/admin/people/${userId}/roles`, cookies.admin, { roles: ["researcher", "auditor"] });
    expect(res.status, res.text).toBe(200);
    expect(res.json!.roles).toEqual(["researcher", "auditor"]);
    expect((await call("GET", "/api/desk/approvals", personCookie)).status).toBe(200);
    const back = await call("PUT", `/api/admin/people/${userId}/roles`, cookies.admin, { roles: ["researcher"] });
    expect(back.status).toBe(200);
    expect((await call("GET", "/api/desk/approvals", personCookie)).status).toBe(403);
    const { rows } = await pool.query("select detail from audit_event where action = 'person-roles-changed' and detail->>'userId' = $1", [userId]);
    expect(rows).toHaveLength(2);
  });

  it("deactivating signs the person out at once and keeps them out; their history stays", async () => {
    const res = await call("POST", `/api/admin/people/${userId}/deactivate`, cookies.admin, { reason: "Left the department" });
    expect(res.status, res.text).toBe(200);
    expect(res.json!.sessionsRevoked).toBeGreaterThanOrEqual(1);
    expect((await call("GET", "/api/benches", personCookie)).status).toBe(401);
    const again = await signIn(email, PASSWORD);
    expect(again.status).not.toBe(200);
    expect(again.cookie).not.toMatch(/session_token=[^;]+/);
    // History: their bench, its author name and the audit rows are all still there.
    const bench = await call("GET", `/api/benches/${benchId}`, cookies.officer);
    expect(bench.status).toBe(200);
    expect(bench.json!.authorName).toBe(`Nils Ormsby ${marker}`);
    const { rows } = await pool.query("select action from audit_event where actor_id = $1 order by at", [userId]);
    expect(rows.map((r) => r.action)).toEqual(expect.arrayContaining(["invitation-accepted", "signed-in", "bench-created"]));
    const people = await call("GET", "/api/admin/people", cookies.admin);
    expect((people.json!.people as { id: string; active: boolean }[]).find((p) => p.id === userId)!.active).toBe(false);
    expect((await call("POST", `/api/admin/people/${userId}/deactivate`, cookies.admin, {})).status).toBe(409);
  });

  it("reactivating lets the person sign in again", async () => {
    const res = await call("POST", `/api/admin/people/${userId}/reactivate`, cookies.admin, {});
    expect(res.status, res.text).toBe(200);
    const back = await signIn(email, PASSWORD);
    expect(back.status).toBe(200);
    personCookie = back.cookie;
    expect((await call("GET", "/api/benches", personCookie)).status).toBe(200);
  });

  // Memberships may be cached for up to 10 s per server process (lib/server/authorize.ts), so wait for the change to show.
  const eventually = async (path: string, status: number) => {
    const deadline = Date.now() + 15_000;
    for (;;) {
      const res = await call("GET", path, personCookie);
      if (res.status === status || Date.now() > deadline) return res.status;
      await new Promise((r) => setTimeout(r, 500));
    }
  };

  it("adds and removes lab membership, which changes what the person sees", async () => {
    expect((await call("GET", `/api/lasers?labId=${spectroLabId}`, personCookie)).status).toBe(403);
    const add = await call("POST", `/api/admin/labs/${spectroLabId}/members`, cookies.admin, { userId });
    expect(add.status, add.text).toBe(201);
    expect((await call("POST", `/api/admin/labs/${spectroLabId}/members`, cookies.admin, { userId })).status).toBe(409);
    expect(await eventually(`/api/lasers?labId=${spectroLabId}`, 200)).toBe(200);
    const remove = await call("DELETE", `/api/admin/labs/${spectroLabId}/members/${userId}`, cookies.admin);
    expect(remove.status).toBe(200);
    expect((await call("DELETE", `/api/admin/labs/${spectroLabId}/members/${userId}`, cookies.admin)).status).toBe(404);
    expect(await eventually(`/api/lasers?labId=${spectroLabId}`, 403)).toBe(403);
  });

  it("guards against locking the institution out", async () => {
    const admins = await call("GET", "/api/admin/people", cookies.admin);
    const adminId = (admins.json!.people as { id: string; email: string }[]).find((p) => p.email === DEMO.admin)!.id;
    expect((await call("POST", `/api/admin/people/${adminId}/deactivate`, cookies.admin, {})).status).toBe(409);
    expect((await call("PUT", `/api/admin/people/${adminId}/roles`, cookies.admin, { roles: ["auditor"] })).status).toBe(409);
    expect((await call("PUT", `/api/admin/people/${userId}/roles`, cookies.admin, { roles: [] })).status).toBe(400);
  });

  it("only administrators may do any of it", async () => {
    for (const who of ["researcher", "officer", "technician", "auditor", "student"] as const) {
      expect((await call("GET", "/api/admin/people", cookies[who])).status, who).toBe(403);
      expect((await call("PUT", `/api/admin/people/${userId}/roles`, cookies[who], { roles: ["admin"] })).status, who).toBe(403);
      expect((await call("POST", `/api/admin/people/${userId}/deactivate`, cookies[who], {})).status, who).toBe(403);
      expect((await call("POST", `/api/admin/labs/${spectroLabId}/members`, cookies[who], { userId })).status, who).toBe(403);
    }
  });
});
