// The permissions matrix over HTTP: every demo role against every route that exists, through the
// real server, better-auth sessions and PostgreSQL. Expected statuses come from lib/auth/permissions.ts
// as the product means it (researchers and technicians see their labs; officers and auditors all labs).
import { beforeAll, describe, expect, it } from "vitest";
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { rolesAllow, type Permission, type RoleName } from "@/lib/auth/permissions";
import { call, DEMO, signIn, type DemoKey } from "../support/http";

const cookies = {} as Record<DemoKey, string>;
let imagingLabId = "";
let imagingBenchId = "";
/** The demo technician's build of the signed-off HeNe bench (db/seed.ts) and its screen photo already read. */
let demoBuildId = "";
let demoReadPhotoId = "";

beforeAll(async () => {
  for (const key of Object.keys(DEMO) as DemoKey[]) {
    const { status, cookie } = await signIn(DEMO[key]);
    expect(status, `${key} signs in`).toBe(200);
    cookies[key] = cookie;
  }
  const labs = await call("GET", "/api/labs", cookies.admin);
  imagingLabId = (labs.json!.labs as { id: string; name: string }[]).find((l) => l.name === "Wrenfield Imaging Lab")!.id;
  const benches = await call("GET", "/api/benches", cookies.researcher);
  imagingBenchId = (benches.json!.benches as { id: string; labId: string }[]).find((b) => b.labId === imagingLabId)!.id;
  const buildable = await call("GET", "/api/builds", cookies.technician);
  const rows = buildable.json!.revisions as { title: string; builds: { id: string; technicianName: string }[] }[];
  demoBuildId = rows.find((r) => r.title === "HeNe through a 2 mm iris, diverging lens")!.builds.find((b) => b.technicianName === "Kit Varga-Lind")!.id;
  const demoBuild = await call("GET", `/api/builds/${demoBuildId}`, cookies.technician);
  demoReadPhotoId = ((demoBuild.json!.build as { photoReadings: { uploadId: string; result: unknown }[] }).photoReadings.find((p) => p.result !== null)!).uploadId;
});

type Row = { label: string; method: string; path: () => string; body?: () => unknown; expect: Record<DemoKey | "anonymous", number> };

const matrix: Row[] = [
  { label: "list benches", method: "GET", path: () => "/api/benches", expect: { anonymous: 401, researcher: 200, officer: 200, technician: 200, auditor: 200, admin: 403, student: 200 } },
  {
    label: "create a bench in the Wrenfield Imaging Lab",
    method: "POST",
    path: () => "/api/benches",
    body: () => ({ labId: imagingLabId, title: "Matrix test bench" }),
    expect: { anonymous: 401, researcher: 201, officer: 403, technician: 403, auditor: 403, admin: 403, student: 403 },
  },
  {
    label: "read a Wrenfield Imaging Lab bench",
    method: "GET",
    path: () => `/api/benches/${imagingBenchId}`,
    expect: { anonymous: 401, researcher: 200, officer: 200, technician: 200, auditor: 200, admin: 403, student: 404 },
  },
  { label: "list labs", method: "GET", path: () => "/api/labs", expect: { anonymous: 401, researcher: 200, officer: 200, technician: 200, auditor: 200, admin: 200, student: 200 } },
  {
    label: "add a lab",
    method: "POST",
    path: () => "/api/labs",
    body: () => ({ name: `Matrix lab ${Math.random().toString(36).slice(2, 8)}`, room: "M1" }),
    expect: { anonymous: 401, researcher: 403, officer: 403, technician: 403, auditor: 403, admin: 201, student: 403 },
  },
  { label: "what waits for me", method: "GET", path: () => "/api/inbox", expect: { anonymous: 401, researcher: 200, officer: 200, technician: 200, auditor: 200, admin: 200, student: 200 } },
  {
    label: "make a revision of a Wrenfield Imaging Lab bench (stale base: 409 for the author's lab)",
    method: "POST",
    path: () => `/api/benches/${imagingBenchId}/revisions`,
    body: () => ({ baseRevision: 1, baseVersion: 999_999 }),
    expect: { anonymous: 401, researcher: 409, officer: 403, technician: 403, auditor: 403, admin: 403, student: 404 },
  },
  {
    label: "read the demo build's screen photo (already read: 200 for the lab's technician)",
    method: "POST",
    path: () => `/api/builds/${demoBuildId}/photo-reading`,
    body: () => ({ uploadId: demoReadPhotoId, apertureId: "iris-1" }),
    expect: { anonymous: 401, researcher: 403, officer: 403, technician: 200, auditor: 403, admin: 403, student: 403 },
  },
  { label: "list people", method: "GET", path: () => "/api/people", expect: { anonymous: 401, researcher: 403, officer: 403, technician: 403, auditor: 403, admin: 200, student: 403 } },
  {
    label: "invite a person",
    method: "POST",
    path: () => "/api/invitations",
    body: () => ({ email: `matrix-${Math.random().toString(36).slice(2, 8)}@northmere.example.edu`, name: "Matrix Person", roles: ["technician"], labIds: [] }),
    expect: { anonymous: 401, researcher: 403, officer: 403, technician: 403, auditor: 403, admin: 201, student: 403 },
  },
  { label: "list eyewear", method: "GET", path: () => "/api/eyewear", expect: { anonymous: 401, researcher: 200, officer: 200, technician: 200, auditor: 200, admin: 403, student: 200 } },
  {
    label: "read the Wrenfield Imaging Lab's eyewear",
    method: "GET",
    path: () => `/api/eyewear?labId=${imagingLabId}`,
    expect: { anonymous: 401, researcher: 200, officer: 200, technician: 200, auditor: 200, admin: 403, student: 403 },
  },
  {
    label: "add eyewear (an empty name: 400 for those allowed)",
    method: "POST",
    path: () => "/api/eyewear",
    body: () => ({ labId: imagingLabId, name: "", bands: [{ fromNm: 500, toNm: 560, opticalDensity: 4 }] }),
    expect: { anonymous: 401, researcher: 403, officer: 400, technician: 403, auditor: 403, admin: 403, student: 403 },
  },
  {
    label: "pick a lab's safety standard (an unknown standard: 400 for those allowed)",
    method: "PUT",
    path: () => `/api/eyewear/standards/${imagingLabId}`,
    body: () => ({ standard: "none" }),
    expect: { anonymous: 401, researcher: 403, officer: 400, technician: 403, auditor: 403, admin: 400, student: 403 },
  },
];

describe("permissions matrix", () => {
  for (const row of matrix) {
    for (const who of ["anonymous", ...Object.keys(DEMO)] as (DemoKey | "anonymous")[]) {
      it(`${row.label} (${row.method}) as ${who} → ${row.expect[who]}`, async () => {
        const res = await call(row.method, row.path(), who === "anonymous" ? undefined : cookies[who], row.body?.());
        expect(res.status).toBe(row.expect[who]);
        if (res.status === 403) expect(String((res.json!.error as { message: string }).message)).toMatch(/may not|only create benches in a lab/);
      });
    }
  }
});

describe("what responses reveal", () => {
  it("lists people without password hashes or tokens", async () => {
    const res = await call("GET", "/api/people", cookies.admin);
    expect(res.text).not.toMatch(/password|scrypt|token/i);
    expect((res.json!.people as unknown[]).length).toBeGreaterThanOrEqual(6);
  });

  it("a student of another lab cannot tell whether the bench exists", async () => {
    const existing = await call("GET", `/api/benches/${imagingBenchId}`, cookies.student);
    const missing = await call("GET", "/api/benches/00000000-0000-4000-8000-000000000000", cookies.student);
    expect(existing.status).toBe(404);
    expect(missing.status).toBe(404);
    expect(existing.json).toEqual(missing.json);
  });

  it("a researcher cannot create a bench in a lab they do not belong to", async () => {
    const labs = await call("GET", "/api/labs", cookies.student);
    const imaging = (labs.json!.labs as { id: string; name: string }[]).find((l) => l.name === "Wrenfield Imaging Lab")!;
    const res = await call("POST", "/api/benches", cookies.student, { labId: imaging.id, title: "Not mine" });
    expect(res.status).toBe(403);
    expect((res.json!.error as { message: string }).message).toBe("You can only create benches in a lab you belong to.");
  });
});

describe("bad input gets a 400 naming the field", () => {
  it("malformed JSON", async () => {
    const res = await call("POST", "/api/benches", cookies.researcher, "{not json");
    expect(res.status).toBe(400);
    expect((res.json!.error as { message: string }).message).toMatch(/not valid JSON/);
  });

  it("missing title and a lab id that is not an id", async () => {
    const res = await call("POST", "/api/benches", cookies.researcher, { labId: "imaging" });
    expect(res.status).toBe(400);
    const fields = (res.json!.error as { fields: { path: string; message: string }[] }).fields;
    expect(fields.map((f) => f.path).sort()).toEqual(["labId", "title"]);
  });

  it("a body over 256 kB", async () => {
    const res = await call("POST", "/api/benches", cookies.researcher, { labId: imagingLabId, title: "x".repeat(300_000) });
    expect(res.status).toBe(400);
    expect((res.json!.error as { code: string }).code).toBe("payload-too-large");
  });

  it("an invitation with a bad e-mail and an unknown role", async () => {
    const res = await call("POST", "/api/invitations", cookies.admin, { email: "not-an-address", name: "X Y", roles: ["wizard"] });
    expect(res.status).toBe(400);
    const fields = (res.json!.error as { fields: { path: string; message: string }[] }).fields;
    expect(fields.find((f) => f.path === "email")?.message).toBe("Enter a valid e-mail address");
    expect(fields.find((f) => f.path.startsWith("roles"))?.message).toMatch(/Each role must be one of/);
  });
});

// ── Every route file, generated ───────────────────────────────────────────────────────────────
// The rows below come from the route files themselves: every exported method of every app/api/**/route.ts
// is called by every demo person with ids that do not exist and an empty body. A route declares its
// permission in apiRoute(…); the server must answer 401 without a session, 403 exactly when the
// permissions table refuses the person, and never a 500.
const ROLES_OF: Record<DemoKey, RoleName[]> = { researcher: ["researcher"], officer: ["officer"], technician: ["technician"], auditor: ["auditor"], admin: ["admin"], student: ["researcher"] };
const NO_SUCH_ID = "00000000-0000-4000-8000-000000000000";

type RouteMethod = { file: string; url: string; method: string; guard: "public" | "signed-in" | Permission };

function routeFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? routeFiles(path.join(dir, e.name)) : e.name === "route.ts" ? [path.join(dir, e.name)] : []));
}

function routeMethods(): RouteMethod[] {
  const root = path.join(process.cwd(), "app/api");
  const out: RouteMethod[] = [];
  for (const file of routeFiles(root).sort()) {
    const rel = path.relative(process.cwd(), file);
    if (rel.includes("[...all]")) continue; // better-auth's own endpoints (sign-in and so on), tested in accounts.test.ts
    const url = "/" + path.relative(path.join(process.cwd(), "app"), path.dirname(file)).split(path.sep).map((part) => (part.startsWith("[") ? NO_SUCH_ID : part)).join("/");
    const text = readFileSync(file, "utf8");
    for (const m of text.matchAll(/export (?:const|async function|function) (GET|POST|PUT|PATCH|DELETE)\b\s*(?:=\s*(apiRoute|publicRoute)(?:<[^>]*>)?\((null|\{[^}]*\}))?/g)) {
      const [, method, wrapper, permission] = m;
      const guard = wrapper === "apiRoute" ? (permission === "null" ? "signed-in" : (JSON.parse(permission.replace(/([a-z]+):/g, '"$1":')) as Permission)) : "public";
      out.push({ file: rel, url, method, guard });
    }
  }
  return out;
}

const routes = routeMethods();

describe("every route file is covered", () => {
  it("finds the route files and their methods", () => {
    expect(routes.length).toBeGreaterThan(40);
    // The hand-written rows above name routes that exist.
    const known = new Set(routes.map((r) => `${r.method} ${r.url.replace(new RegExp(NO_SUCH_ID, "g"), ":id")}`));
    for (const row of matrix) expect(known, row.label).toContain(`${row.method} ${row.path().replace(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/g, ":id").split("?")[0]}`);
  });
  for (const r of routes) {
    for (const who of ["anonymous", ...Object.keys(DEMO)] as (DemoKey | "anonymous")[]) {
      const expected =
        r.guard === "public" ? "answered" : who === "anonymous" ? 401 : r.guard === "signed-in" || rolesAllow(ROLES_OF[who], r.guard) ? "allowed" : 403;
      it(`${r.method} ${r.file} as ${who} → ${expected}`, async () => {
        const res = await call(r.method, r.url, who === "anonymous" ? undefined : cookies[who], r.method === "GET" ? undefined : {});
        expect(res.status, `${r.method} ${r.url}`).not.toBe(500);
        if (expected === 401 || expected === 403) expect(res.status).toBe(expected);
        else if (expected === "allowed") expect([401, 403]).not.toContain(res.status);
      });
    }
  }
});
