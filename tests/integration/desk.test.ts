// The auditor's desk over HTTP: filters, sorting and paging against hand-computed expectations on
// sign-offs this test writes into a lab of its own; CSV exports; and an auditor who cannot change
// anything — every write route found under app/api answers 403.
import { randomUUID } from "node:crypto";
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call, DEMO, signIn, type DemoKey } from "../support/http";
import { createAccount, databaseUrl } from "../support/review-fixtures";
import { DEMO_LAB_NAME } from "../support/demo";

const DAY = 86_400_000;
const marker = `dk${Date.now().toString(36)}`;
const cookies = {} as Record<DemoKey, string>;
let pool: pg.Pool;
let labId = "";
const officers = { one: { id: "", name: `Ines Corran ${marker}` }, two: { id: "", name: `Pim Lowther ${marker}` } };
const benchIds: Record<string, string> = {};
const revisionIds: Record<string, string> = {};

// Five sign-offs and one request for changes, with dates relative to now.
type Spec = { key: string; title: string; cls: string; officer: "one" | "two"; decidedDays: number; validDays: number | null; state: string; outcome: string; conditions?: string };
const SPECS: Spec[] = [
  { key: "A", title: `Alpha spatial filter ${marker}`, cls: "2", officer: "one", decidedDays: -100, validDays: 200, state: "approved", outcome: "approved", conditions: "Eyewear OD 2 at 633 nm, \"always\", on" },
  { key: "B", title: `Bravo expander ${marker}`, cls: "3B", officer: "two", decidedDays: -50, validDays: 10, state: "approved", outcome: "approved" },
  { key: "C", title: `Charlie pump line ${marker}`, cls: "4", officer: "one", decidedDays: -400, validDays: -35, state: "expired", outcome: "approved", conditions: "=1+1 keep the door shut" },
  { key: "D", title: `Delta probe path ${marker}`, cls: "3B", officer: "two", decidedDays: -20, validDays: 25, state: "approved", outcome: "approved" },
  { key: "E", title: `Echo double slit ${marker}`, cls: "2", officer: "one", decidedDays: -300, validDays: 60, state: "superseded", outcome: "approved" },
  { key: "F", title: `Foxtrot refused ${marker}`, cls: "4", officer: "two", decidedDays: -10, validDays: null, state: "changes-requested", outcome: "changes-requested" },
];

async function desk(query: string, who: DemoKey = "auditor") {
  const res = await call("GET", `/api/desk/approvals?lab=${labId}&${query}`, cookies[who]);
  expect(res.status, res.text).toBe(200);
  return res.json as {
    rows: { title: string; hazardClass: string; signerName: string; state: string; validUntil: string; conditions: string | null; builds: number; mismatches: number; photoMismatches: number }[];
    total: number;
    mismatchTotal: number;
    pageCount: number;
  };
}
const keys = (rows: { title: string }[]) => rows.map((r) => SPECS.find((s) => s.title === r.title)!.key).join("");

beforeAll(async () => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 2 });
  for (const key of Object.keys(DEMO) as DemoKey[]) cookies[key] = (await signIn(DEMO[key])).cookie;
  const lab = await call("POST", "/api/labs", cookies.admin, { name: `Desk test lab ${marker}`, room: "Harbour Building D001" });
  expect(lab.status).toBe(201);
  labId = String(lab.json!.id);
  const author = await createAccount(pool, { name: `Tove Marchbank ${marker}`, roles: ["researcher"], labIds: [labId], password: "desk-test-password" });
  for (const o of ["one", "two"] as const) officers[o].id = (await createAccount(pool, { name: officers[o].name, roles: ["officer"], labIds: [], password: "desk-test-password" })).id;
  const now = Date.now();
  for (const s of SPECS) {
    const benchId = randomUUID();
    const revisionId = randomUUID();
    benchIds[s.key] = benchId;
    revisionIds[s.key] = revisionId;
    const hash = `${s.key.charCodeAt(0).toString(16)}${marker}`.padEnd(64, "0").slice(0, 64);
    const doc = { version: 1, title: s.title, elements: [{ id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 }] };
    const created = new Date(now + (s.decidedDays - 5) * DAY);
    await pool.query("insert into bench (id, lab_id, title, author_id, created_at) values ($1, $2, $3, $4, $5)", [benchId, labId, s.title, author.id, created]);
    await pool.query("insert into bench_revision (id, bench_id, number, document, content_hash, state, created_by, created_at) values ($1, $2, 1, $3, $4, $5, $6, $7)", [revisionId, benchId, JSON.stringify(doc), hash, s.state, author.id, created]);
    await pool.query(
      `insert into review_decision (revision_id, bench_id, outcome, signer_id, signer_name, signer_role, meaning, conditions, reason, valid_until, content_hash, hazard_summary, step_up_verified, decided_at)
       values ($1, $2, $3, $4, $5, 'Laser safety officer', $6, $7, $8, $9, $10, $11, true, $12)`,
      [
        revisionId,
        benchId,
        s.outcome,
        officers[s.officer].id,
        officers[s.officer].name,
        s.outcome === "approved" ? "Approved for operation as drawn, with the conditions listed." : "Not approved: changes are asked for before this bench may be operated.",
        s.conditions ?? null,
        s.outcome === "approved" ? null : "Add a beam block.",
        s.validDays === null ? null : new Date(now + s.validDays * DAY),
        hash,
        JSON.stringify({ hazardClass: { value: s.cls, source: "test" } }),
        new Date(now + s.decidedDays * DAY),
      ],
    );
    await pool.query("insert into review_comment (revision_id, bench_id, thread_id, author_id, author_name, author_role, body) values ($1, $2, gen_random_uuid(), $3, $4, 'Researcher', $5)", [revisionId, benchId, author.id, `Tove Marchbank ${marker}`, `Comment on ${s.key}`]);
  }
  await recordBuilds((await createAccount(pool, { name: `Lio Brannagh ${marker}`, roles: ["technician"], labIds: [labId], password: "desk-test-password" })).id);
});

/**
 * Builds of the signed revisions: A's build recorded a typed mismatch, a mismatch read from a screen photo and a
 * matching observation; B's build matched; D has two builds, the second with a typed mismatch; C and E were never built.
 */
async function recordBuilds(technicianId: string) {
  const build = async (key: string) => {
    const { rows } = await pool.query<{ id: string }>("insert into build_record (revision_id, bench_id, content_hash, technician_id, state) values ($1, $2, 'x', $3, 'completed') returning id", [revisionIds[key], benchIds[key], technicianId]);
    return rows[0].id;
  };
  const observe = async (buildId: string, mismatch: boolean) => {
    const { rows } = await pool.query<{ id: string }>("insert into build_observation (build_id, aperture_id, centre_seen, centre_predicted, mismatch, reasons, recorded_by) values ($1, 'iris', 'dark', 'bright', $2, $3, $4) returning id", [
      buildId,
      mismatch,
      JSON.stringify(mismatch ? ["Centre: predicted bright, seen dark"] : []),
      technicianId,
    ]);
    return rows[0].id;
  };
  const a = await build("A");
  await observe(a, true);
  await observe(a, false);
  const fromPhoto = await observe(a, true);
  const { rows: up } = await pool.query<{ id: string }>(
    "insert into upload (build_id, kind, file_name, content_type, size_bytes, sha256, storage_key, uploaded_by) values ($1, 'screen-photo', 'screen.png', 'image/png', 1, 'x', 'uploads/none.png', $2) returning id",
    [a, technicianId],
  );
  await pool.query("insert into photo_reading (build_id, upload_id, aperture_id, observation_id, result, prediction_engine, read_by) values ($1, $2, 'iris', $3, '{}', 'test', $4)", [a, up[0].id, fromPhoto, technicianId]);
  await observe(await build("B"), false);
  await build("D");
  await observe(await build("D"), true);
}

afterAll(async () => {
  await pool?.end();
});

describe("approvals list: filters, sorting, paging", () => {
  it("lists only sign-offs of the lab, newest first by default", async () => {
    const page = await desk("");
    expect(page.total).toBe(5);
    expect(keys(page.rows)).toBe("DBAEC");
  });

  it("sorts by title both ways, by validity end and by hazard class", async () => {
    expect(keys((await desk("sort=title&dir=asc")).rows)).toBe("ABCDE");
    expect(keys((await desk("sort=title&dir=desc")).rows)).toBe("EDCBA");
    expect(keys((await desk("sort=validUntil&dir=asc")).rows)).toBe("CBDEA");
    expect(keys((await desk("sort=class&dir=desc")).rows)).toBe("CDBAE"); // 4, 3B (newest first), 2 (newest first)
    expect(keys((await desk("sort=officer&dir=asc")).rows)).toBe("AECDB"); // Ines before Pim, then newest first
  });

  it("filters by class, state, officer, signing dates and expiry", async () => {
    expect(keys((await desk("class=3B")).rows)).toBe("DB");
    expect(keys((await desk("state=expired")).rows)).toBe("C");
    expect(keys((await desk("state=superseded")).rows)).toBe("E");
    expect(keys((await desk(`officer=${officers.one.id}`)).rows)).toBe("AEC");
    const day = (d: number) => new Date(Date.now() + d * DAY).toISOString().slice(0, 10);
    expect(keys((await desk(`from=${day(-120)}&to=${day(-30)}`)).rows)).toBe("BA");
    expect(keys((await desk("expiring=30")).rows)).toBe("DB");
    expect(keys((await desk("expiring=90")).rows)).toBe("DB"); // E ends within 90 days too, but it is superseded: no longer in force
    expect(keys((await desk(`class=3B&officer=${officers.two.id}&expiring=15`)).rows)).toBe("B");
  });

  it("flags each sign-off whose builds recorded an observation that differs from the prediction, with the counts, and filters to them", async () => {
    const all = await desk("");
    const byKey = Object.fromEntries(all.rows.map((r) => [SPECS.find((s) => s.title === r.title)!.key, r]));
    expect(byKey.A).toMatchObject({ builds: 1, mismatches: 2, photoMismatches: 1 });
    expect(byKey.B).toMatchObject({ builds: 1, mismatches: 0, photoMismatches: 0 });
    expect(byKey.D).toMatchObject({ builds: 2, mismatches: 1, photoMismatches: 0 });
    expect(byKey.C).toMatchObject({ builds: 0, mismatches: 0 });
    expect(all.mismatchTotal).toBe(2);
    const only = await desk("builds=mismatch");
    expect(keys(only.rows)).toBe("DA");
    expect(only.total).toBe(2);
    expect(keys((await desk("builds=mismatch&class=3B")).rows)).toBe("D");
    expect((await desk("class=2")).mismatchTotal).toBe(1); // A (E of class 2 was never built)
    const bad = await call("GET", `/api/desk/approvals?lab=${labId}&builds=some`, cookies.auditor);
    expect(bad.status).toBe(400);
    expect((bad.json!.error as { fields: { path: string }[] }).fields[0].path).toBe("builds");
  });

  it("searches inside titles, case-insensitively, with LIKE characters taken literally", async () => {
    expect(keys((await desk("q=bravo")).rows)).toBe("B");
    expect(keys((await desk("q=%25")).rows)).toBe("");
  });

  it("pages on the server", async () => {
    const second = await desk("pageSize=10&page=1");
    expect(second.pageCount).toBe(1);
    const res = await call("GET", `/api/desk/approvals?lab=${labId}&pageSize=25&page=2`, cookies.auditor);
    expect((res.json as { rows: unknown[] }).rows).toHaveLength(0);
    const bad = await call("GET", `/api/desk/approvals?pageSize=7`, cookies.auditor);
    expect(bad.status).toBe(400);
  });

  it("is open to auditors and officers, not to researchers, technicians or admins", async () => {
    expect((await call("GET", `/api/desk/approvals?lab=${labId}`, cookies.officer)).status).toBe(200);
    for (const who of ["researcher", "technician", "admin", "student"] as const) expect((await call("GET", `/api/desk/approvals`, cookies[who])).status).toBe(403);
    expect((await call("GET", `/api/desk/approvals`)).status).toBe(401);
  });
});

describe("a bench's trail", () => {
  it("shows a revision's row with the content hash it had when it was made, not the hash its draft has now", async () => {
    const labs = await call("GET", "/api/labs", cookies.researcher);
    const demoLabId = (labs.json!.labs as { id: string; name: string }[]).find((l) => l.name === DEMO_LAB_NAME)!.id;
    const created = await call("POST", "/api/benches", cookies.researcher, { labId: demoLabId, title: `Trail hash ${marker}` });
    expect(created.status).toBe(201);
    const id = (created.json as { id: string }).id;
    const document = { version: 1, title: `Trail hash ${marker}`, elements: [{ id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 }] };
    const saved = await call("PUT", `/api/benches/${id}/draft`, cookies.researcher, { document, baseRevision: 1, baseVersion: 1 });
    expect(saved.status, saved.text).toBe(200);
    const res = await call("GET", `/api/desk/benches/${id}/trail`, cookies.auditor);
    expect(res.status).toBe(200);
    const trail = res.json as { revisions: { contentHash: string }[]; entries: { kind: string; action?: string; contentHash?: string | null }[] };
    const made = trail.entries.find((e) => e.kind === "revision")!;
    const createdEvent = trail.entries.find((e) => e.kind === "event" && e.action === "bench-created")!;
    const savedEvent = trail.entries.find((e) => e.kind === "event" && e.action === "draft-saved")!;
    expect(made.contentHash).toBe(createdEvent.contentHash);
    expect(trail.revisions[0].contentHash).toBe(savedEvent.contentHash);
    expect(made.contentHash).not.toBe(trail.revisions[0].contentHash);
  });

  it("shows every revision with its hash, the decision with its meaning and conditions, comments and events", async () => {
    const res = await call("GET", `/api/desk/benches/${benchIds.A}/trail`, cookies.auditor);
    expect(res.status).toBe(200);
    const trail = res.json as { revisions: { contentHash: string }[]; entries: { kind: string; meaning?: string; conditions?: string; body?: string }[] };
    expect(trail.revisions).toHaveLength(1);
    expect(trail.revisions[0].contentHash).toHaveLength(64);
    const decision = trail.entries.find((e) => e.kind === "decision")!;
    expect(decision.meaning).toBe("Approved for operation as drawn, with the conditions listed.");
    expect(decision.conditions).toContain("Eyewear OD 2");
    expect(trail.entries.some((e) => e.kind === "comment" && e.body === "Comment on A")).toBe(true);
    expect((await call("GET", `/api/desk/benches/${randomUUID()}/trail`, cookies.auditor)).status).toBe(404);
  });
});

describe("CSV exports", () => {
  it("streams the filtered sign-offs as CSV, newest first, quoted and defused, and audits the export", async () => {
    const res = await fetch(`${process.env.APP_URL ?? "http://127.0.0.1:3100"}/api/desk/approvals/export?lab=${labId}`, { headers: { cookie: cookies.auditor } });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(res.headers.get("content-disposition")).toMatch(/attachment; filename="sign-offs-\d{4}-\d{2}-\d{2}\.csv"/);
    const text = (await res.text()).replace(/^\uFEFF/, "");
    const lines = text.trimEnd().split("\r\n");
    expect(lines[0]).toBe("signed_at_utc,bench,lab,revision,content_hash,state,state_words,hazard_class_at_signing,signed_by,signer_role,signature_meaning,conditions,valid_until_utc,password_reentered,bench_id,revision_id,decision_id,builds,observations_differing,of_which_read_from_a_photo");
    expect(lines).toHaveLength(6);
    const order = lines.slice(1).map((l) => SPECS.find((s) => l.includes(s.title))!.key).join("");
    expect(order).toBe("DBAEC");
    expect(lines.find((l) => l.includes(SPECS[0].title))!.endsWith(",1,2,1")).toBe(true); // A: one build, two observations differ, one read from a photo
    expect(text).toContain(`"Eyewear OD 2 at 633 nm, ""always"", on"`); // quotes doubled, commas quoted
    expect(text).toContain("'=1+1 keep the door shut"); // a leading = cannot run as a formula in a spreadsheet
    const { rows } = await pool.query("select detail from audit_event where action = 'desk-exported-approvals' and detail->'filters'->>'lab' = $1", [labId]);
    expect(rows.length).toBeGreaterThanOrEqual(1);
  });

  it("exports a trail and refuses exports to officers (read only) and researchers", async () => {
    const trail = await call("GET", `/api/desk/benches/${benchIds.B}/trail/export`, cookies.auditor);
    expect(trail.status).toBe(200);
    expect(trail.text).toContain("decision");
    expect(trail.text).toContain("Approved for operation as drawn");
    expect((await call("GET", `/api/desk/approvals/export?lab=${labId}`, cookies.officer)).status).toBe(403);
    expect((await call("GET", `/api/desk/benches/${benchIds.B}/trail/export`, cookies.researcher)).status).toBe(403);
  });
});

describe("the auditor cannot change anything", () => {
  const apiRoot = path.resolve(import.meta.dirname, "../../app/api");
  // POSTs that change no record (better-auth's own endpoints, e.g. sign-out, are skipped too):
  // the auditor's own check of a printed sheet, and asking for a signed-off revision's build sheet,
  // which renders a cached PDF of the unchanged revision (bench:read, which auditors hold).
  const READING_POSTS = new Set(["POST /api/verify", "POST /api/revisions/[revisionId]/sheet"]);
  const routes: { method: string; path: string }[] = [];
  const walk = (dir: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else if (entry.name === "route.ts") {
        const source = readFileSync(full, "utf8");
        const url = `/api/${path.relative(apiRoot, path.dirname(full)).split(path.sep).join("/")}`;
        if (url.startsWith("/api/auth/") || source.includes("publicRoute(")) continue;
        for (const method of ["POST", "PUT", "PATCH", "DELETE"]) {
          if (new RegExp(`export const ${method}\\b|export async function ${method}\\b`).test(source) && !READING_POSTS.has(`${method} ${url}`)) routes.push({ method, path: url });
        }
      }
    }
  };
  walk(apiRoot);

  it("finds the write routes", () => {
    expect(routes.length).toBeGreaterThanOrEqual(10);
  });

  for (const route of routes) {
    it(`${route.method} ${route.path} → 403`, async () => {
      const concrete = route.path.replace(/\[[^\]]+\]/g, () => randomUUID());
      const res = await call(route.method, concrete, cookies.auditor, {});
      expect(res.status, res.text).toBe(403);
    });
  }
});
