// Attacks on who may act: the authentication library's own admin and account endpoints are closed to
// every role (an admin cannot impersonate the officer, set their password, create, remove or promote
// anyone through them); the app's own audited admin routes still work, with their rules; a sign-out,
// a revoked session and a deactivation take effect on the very next request.
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { APP_URL, call, DEMO, DEMO_PASSWORD, signIn } from "../support/http";
import { createAccount, databaseUrl } from "../support/review-fixtures";

let pool: pg.Pool;
const cookies: Record<string, string> = {};
let officerId = "";

beforeAll(async () => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 2 });
  for (const who of ["researcher", "officer", "technician", "auditor", "admin"] as const) {
    const s = await signIn(DEMO[who]);
    expect(s.status, who).toBe(200);
    cookies[who] = s.cookie;
  }
  officerId = (await pool.query<{ id: string }>('select id from "user" where email = $1', [DEMO.officer])).rows[0].id;
});

afterAll(async () => {
  await pool?.end();
});

// What an attacker holding an admin (or any) session would try, with bodies that would work if open.
const ATTACKS: [string, string, () => unknown][] = [
  ["POST", "/api/auth/admin/impersonate-user", () => ({ userId: officerId })],
  ["POST", "/api/auth/admin/set-user-password", () => ({ userId: officerId, newPassword: "attacker-chosen-1" })],
  ["POST", "/api/auth/admin/create-user", () => ({ email: `ghost-${Date.now()}@northmere.example.edu`, password: "ghost-password-1", name: "Ghost", role: "officer" })],
  ["POST", "/api/auth/admin/remove-user", () => ({ userId: officerId })],
  ["POST", "/api/auth/admin/set-role", () => ({ userId: officerId, role: "admin" })],
  ["POST", "/api/auth/admin/ban-user", () => ({ userId: officerId })],
  ["POST", "/api/auth/admin/unban-user", () => ({ userId: officerId })],
  ["POST", "/api/auth/admin/update-user", () => ({ userId: officerId, data: { name: "Renamed" } })],
  ["POST", "/api/auth/admin/list-user-sessions", () => ({ userId: officerId })],
  ["POST", "/api/auth/admin/revoke-user-sessions", () => ({ userId: officerId })],
  ["POST", "/api/auth/admin/revoke-user-session", () => ({ sessionToken: "x" })],
  ["POST", "/api/auth/admin/has-permission", () => ({ permissions: { user: ["impersonate"] } })],
  ["POST", "/api/auth/admin/stop-impersonating", () => ({})],
  ["GET", "/api/auth/admin/list-users", () => undefined],
  ["GET", `/api/auth/admin/get-user?id=`, () => undefined],
  ["POST", "/api/auth/sign-up/email", () => ({ email: `signup-${Date.now()}@northmere.example.edu`, password: "signup-password-1", name: "Self Made" })],
  ["POST", "/api/auth/update-user", () => ({ name: "Somebody Else" })],
  ["POST", "/api/auth/change-email", () => ({ newEmail: "elsewhere@example.com" })],
  ["POST", "/api/auth/change-password", () => ({ currentPassword: DEMO_PASSWORD, newPassword: "changed-password-1" })],
  ["POST", "/api/auth/delete-user", () => ({ password: DEMO_PASSWORD })],
  ["GET", "/api/auth/list-sessions", () => undefined],
  ["POST", "/api/auth/revoke-sessions", () => ({})],
  ["POST", "/api/auth/revoke-other-sessions", () => ({})],
  ["POST", "/api/auth/verify-password", () => ({ password: DEMO_PASSWORD })],
  ["GET", "/api/auth/list-accounts", () => undefined],
  ["POST", "/api/auth/sign-in/social", () => ({ provider: "github" })],
];

describe("the authentication library's own endpoints", () => {
  for (const [method, path, body] of ATTACKS) {
    it(`${method} ${path} is refused for every role and for nobody`, async () => {
      for (const who of [...Object.keys(cookies), "nobody"]) {
        const res = await call(method, path.replace(/=$/, `=${officerId}`), cookies[who], body());
        expect(res.status, `${who}: ${res.text.slice(0, 200)}`).toBe(404);
        expect((res.json?.error as { message?: string } | undefined)?.message).toMatch(/does not offer/);
      }
    });
  }

  it("left the officer as they were: same password, same role, not banned, one account", async () => {
    const { rows } = await pool.query<{ role: string; banned: boolean | null; name: string }>('select role, banned, name from "user" where id = $1', [officerId]);
    expect(rows[0]).toMatchObject({ role: "officer", name: expect.not.stringMatching(/Renamed/) });
    expect(rows[0].banned ?? false).toBe(false);
    expect((await signIn(DEMO.officer)).status).toBe(200);
    expect((await signIn(DEMO.officer, "attacker-chosen-1")).status).toBe(401);
    const ghosts = await pool.query(`select 1 from "user" where email like 'ghost-%' or email like 'signup-%'`);
    expect(ghosts.rowCount).toBe(0);
    const impersonated = await pool.query("select 1 from session where impersonated_by is not null");
    expect(impersonated.rowCount).toBe(0);
  });

  it("keeps the endpoints the screens use: session, sign-out, password reset request", async () => {
    const session = await call("GET", "/api/auth/get-session", cookies.researcher);
    expect(session.status).toBe(200);
    expect((session.json!.user as { email: string }).email).toBe(DEMO.researcher);
    const reset = await call("POST", "/api/auth/request-password-reset", undefined, { email: "nobody-at-all@northmere.example.edu", redirectTo: "/reset-password" });
    expect(reset.status).toBe(200);
  });
});

describe("the app's own admin routes stay the only way, audited and with their rules", () => {
  it("the admin role holds only what those routes need", async () => {
    // better-auth's permission check for the admin role, asked through the app's table.
    const { rolesAllow } = await import("../../lib/auth/permissions");
    expect(rolesAllow(["admin"], { user: ["list", "create", "set-role", "ban"], session: ["revoke"] })).toBe(true);
    for (const action of ["impersonate", "set-password", "delete", "update", "get", "set-email"] as const) {
      expect(rolesAllow(["admin"], { user: [action] }), action).toBe(false);
    }
    expect(rolesAllow(["admin"], { session: ["list"] })).toBe(false);
    expect(rolesAllow(["admin"], { session: ["delete"] })).toBe(false);
  });

  it("the last active admin cannot take the role from themselves", async () => {
    const adminId = (await pool.query<{ id: string }>('select id from "user" where email = $1', [DEMO.admin])).rows[0].id;
    const res = await call("PUT", `/api/admin/people/${adminId}/roles`, cookies.admin, { roles: ["researcher"] });
    expect(res.status).toBe(409);
    const { rows } = await pool.query<{ role: string }>('select role from "user" where id = $1', [adminId]);
    expect(rows[0].role).toContain("admin");
  });

  it("a role change through the app is in the trail and applies on the very next request", async () => {
    const person = await createAccount(pool, { name: "Role Changed Person", roles: ["researcher"], labIds: [], password: "role-changed-password" });
    const s = await signIn(person.email, "role-changed-password");
    expect((await call("GET", "/api/benches", s.cookie)).status).toBe(200);
    const changed = await call("PUT", `/api/admin/people/${person.id}/roles`, cookies.admin, { roles: ["auditor"] });
    expect(changed.status, changed.text).toBe(200);
    // No cache grace period: the next request already sees the auditor.
    expect((await call("POST", "/api/benches", s.cookie, { labId: "00000000-0000-4000-8000-000000000000", title: "x" })).status).toBe(403);
    const audit = await pool.query("select 1 from audit_event where action = 'person-roles-changed' and detail->>'userId' = $1", [person.id]);
    expect(audit.rowCount).toBe(1);
  });
});

describe("sign-out and revocation take effect at once", () => {
  it("a signed-out cookie is refused on the next request", async () => {
    const s = await signIn(DEMO.technician);
    expect((await call("GET", "/api/builds", s.cookie)).status).toBe(200);
    const out = await call("POST", "/api/auth/sign-out", s.cookie, {});
    expect(out.status).toBe(200);
    expect((await call("GET", "/api/builds", s.cookie)).status).toBe(401);
  });

  it("a deactivated person's open session is refused on the next request", async () => {
    const person = await createAccount(pool, { name: "Soon Deactivated", roles: ["researcher"], labIds: [], password: "soon-deactivated-pw" });
    const s = await signIn(person.email, "soon-deactivated-pw");
    expect((await call("GET", "/api/benches", s.cookie)).status).toBe(200);
    const off = await call("POST", `/api/admin/people/${person.id}/deactivate`, cookies.admin, { reason: "left the institute" });
    expect(off.status, off.text).toBe(200);
    expect((await call("GET", "/api/benches", s.cookie)).status).toBe(401);
    expect((await signIn(person.email, "soon-deactivated-pw")).status).not.toBe(200);
  });

  it("a session deleted in the database (another server's sign-out) is refused at once", async () => {
    const s = await signIn(DEMO.auditor);
    expect((await call("GET", "/api/desk/approvals", s.cookie)).status).toBe(200);
    const token = decodeURIComponent(s.cookie.match(/better-auth\.session_token=([^;]+)/)![1]).split(".")[0];
    const deleted = await pool.query("delete from session where token = $1", [token]);
    expect(deleted.rowCount).toBe(1);
    expect((await call("GET", "/api/desk/approvals", s.cookie)).status).toBe(401);
  });
});

void APP_URL;
