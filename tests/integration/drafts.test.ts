// Saving the working draft over HTTP against the running server: optimistic concurrency (stale save → 409 with
// the server's draft), who may save (only researchers of the bench's lab), 400 with field paths for a bad
// document, and a save on top of a submitted revision starting a new draft revision while the old one stays.
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call, DEMO, signIn, type DemoKey } from "../support/http";

const cookies = {} as Partial<Record<DemoKey, string>>;
let imagingLabId = "";
let benchId = "";

type Draft = { benchId: string; revisionNumber: number; version: number; state: string; contentHash: string; document: { elements: { id: string; positionMm: number }[] }; canEdit: boolean };

const doc = (screenMm: number, irisDiameterMm = 2) => ({
  version: 1,
  title: "Draft test bench",
  elements: [
    { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 },
    { id: "iris-1", kind: "aperture", positionMm: 300, diameterMm: irisDiameterMm },
    { id: "screen-1", kind: "screen", positionMm: screenMm },
  ],
});

const draftOf = async (who: DemoKey = "researcher") => {
  const res = await call("GET", `/api/benches/${benchId}/draft`, cookies[who]);
  expect(res.status).toBe(200);
  return res.json!.draft as Draft;
};

beforeAll(async () => {
  for (const key of ["researcher", "student", "officer", "auditor", "technician"] as DemoKey[]) {
    const { status, cookie } = await signIn(DEMO[key]);
    expect(status, `${key} signs in`).toBe(200);
    cookies[key] = cookie;
  }
  const labs = await call("GET", "/api/labs", cookies.researcher);
  imagingLabId = (labs.json!.labs as { id: string; name: string }[]).find((l) => l.name === "Coherent Imaging Lab")!.id;
  const created = await call("POST", "/api/benches", cookies.researcher, { labId: imagingLabId, title: `Draft test ${Date.now()}` });
  expect(created.status).toBe(201);
  benchId = (created.json as { id: string }).id;
});

describe("saving the working draft", () => {
  it("reads the new bench's first draft at revision 1, version 1", async () => {
    const draft = await draftOf();
    expect(draft).toMatchObject({ benchId, revisionNumber: 1, version: 1, state: "draft", canEdit: true });
  });

  it("saves a valid document on top of the version it was based on, and the version moves on", async () => {
    const res = await call("PUT", `/api/benches/${benchId}/draft`, cookies.researcher, { document: doc(1300), baseRevision: 1, baseVersion: 1 });
    expect(res.status).toBe(200);
    const draft = res.json!.draft as Draft;
    expect(draft).toMatchObject({ revisionNumber: 1, version: 2, state: "draft" });
    expect(draft.contentHash).toMatch(/^[0-9a-f]{64}$/);
    expect(res.json!.createdRevision).toBe(false);
    const again = await draftOf();
    expect(again.version).toBe(2);
    expect(again.document.elements.find((e) => e.id === "screen-1")?.positionMm).toBe(1300);
  });

  it("refuses a stale save with 409 and the server's current draft; nothing is overwritten", async () => {
    const res = await call("PUT", `/api/benches/${benchId}/draft`, cookies.researcher, { document: doc(900), baseRevision: 1, baseVersion: 1 });
    expect(res.status).toBe(409);
    expect((res.json!.error as { code: string }).code).toBe("conflict");
    const current = res.json!.current as Draft;
    expect(current.version).toBe(2);
    expect(current.document.elements.find((e) => e.id === "screen-1")?.positionMm).toBe(1300);
    const after = await draftOf();
    expect(after.version).toBe(2);
    expect(after.document.elements.find((e) => e.id === "screen-1")?.positionMm).toBe(1300);
  });

  it("lets exactly one of two saves based on the same version win", async () => {
    const base = await draftOf();
    const [a, b] = await Promise.all([
      call("PUT", `/api/benches/${benchId}/draft`, cookies.researcher, { document: doc(1400), baseRevision: base.revisionNumber, baseVersion: base.version }),
      call("PUT", `/api/benches/${benchId}/draft`, cookies.researcher, { document: doc(1500), baseRevision: base.revisionNumber, baseVersion: base.version }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    expect((await draftOf()).version).toBe(base.version + 1);
  });

  it("answers 400 naming the fields of an invalid document, and saves nothing", async () => {
    const base = await draftOf();
    const bad = doc(1300, -2);
    (bad.elements[0] as Record<string, unknown>).wavelengthNm = "red";
    const res = await call("PUT", `/api/benches/${benchId}/draft`, cookies.researcher, { document: bad, baseRevision: base.revisionNumber, baseVersion: base.version });
    expect(res.status).toBe(400);
    const fields = (res.json!.error as { fields: { path: string; message: string }[] }).fields;
    expect(fields.map((f) => f.path)).toEqual(expect.arrayContaining(["document.elements.0.wavelengthNm", "document.elements.1.diameterMm"]));
    expect(fields.find((f) => f.path === "document.elements.1.diameterMm")?.message).toMatch(/greater than 0/);
    expect((await draftOf()).version).toBe(base.version);
  });

  it("answers 400 for a document without a laser", async () => {
    const base = await draftOf();
    const res = await call("PUT", `/api/benches/${benchId}/draft`, cookies.researcher, {
      document: { version: 1, elements: [{ id: "screen-1", kind: "screen", positionMm: 10 }] },
      baseRevision: base.revisionNumber,
      baseVersion: base.version,
    });
    expect(res.status).toBe(400);
    expect((res.json!.error as { fields: { path: string; message: string }[] }).fields[0]).toMatchObject({ path: "document.elements", message: expect.stringMatching(/exactly one laser/) });
  });
});

describe("who may save", () => {
  const body = async () => {
    const base = await draftOf();
    return { document: doc(1000), baseRevision: base.revisionNumber, baseVersion: base.version };
  };

  it("a researcher of another lab gets 404, the same as for a bench that does not exist", async () => {
    const res = await call("PUT", `/api/benches/${benchId}/draft`, cookies.student, await body());
    const missing = await call("PUT", "/api/benches/00000000-0000-4000-8000-000000000000/draft", cookies.student, await body());
    expect(res.status).toBe(404);
    expect(missing.status).toBe(404);
    expect(res.json).toEqual(missing.json);
    expect((await call("GET", `/api/benches/${benchId}/draft`, cookies.student)).status).toBe(404);
  });

  for (const who of ["officer", "auditor", "technician"] as DemoKey[]) {
    it(`the ${who} may read the draft but gets 403 on saving`, async () => {
      const read = await call("GET", `/api/benches/${benchId}/draft`, cookies[who]);
      expect(read.status).toBe(200);
      expect((read.json!.draft as Draft).canEdit).toBe(false);
      const res = await call("PUT", `/api/benches/${benchId}/draft`, cookies[who], await body());
      expect(res.status).toBe(403);
      expect((res.json!.error as { message: string }).message).toMatch(/may not/);
    });
  }

  it("anonymous gets 401", async () => {
    const res = await call("PUT", `/api/benches/${benchId}/draft`, undefined, await body());
    expect(res.status).toBe(401);
  });
});

// Marking a revision submitted needs the database (the review workflow has its own routes); `npm test` sets DATABASE_URL.
describe.skipIf(!process.env.DATABASE_URL)("saving on top of a submitted revision", () => {
  let pool: pg.Pool;
  beforeAll(() => {
    pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 1 });
  });
  afterAll(async () => {
    await pool?.end();
  });

  it("starts revision n+1 as a new draft and leaves the submitted one untouched", async () => {
    const before = await draftOf();
    await pool.query("update bench_revision set state = 'submitted' where bench_id = $1 and number = $2", [benchId, before.revisionNumber]);
    const submitted = await draftOf();
    expect(submitted.state).toBe("submitted");

    const res = await call("PUT", `/api/benches/${benchId}/draft`, cookies.researcher, { document: doc(1111), baseRevision: submitted.revisionNumber, baseVersion: submitted.version });
    expect(res.status).toBe(200);
    expect(res.json!.createdRevision).toBe(true);
    expect(res.json!.draft).toMatchObject({ revisionNumber: submitted.revisionNumber + 1, version: 1, state: "draft" });

    const bench = await call("GET", `/api/benches/${benchId}`, cookies.researcher);
    const revisions = bench.json!.revisions as { number: number; state: string; contentHash: string; version: number }[];
    const old = revisions.find((r) => r.number === submitted.revisionNumber)!;
    expect(old).toMatchObject({ state: "submitted", contentHash: submitted.contentHash, version: submitted.version });

    const audit = await pool.query("select action from audit_event where bench_id = $1 order by at", [benchId]);
    expect(audit.rows.map((r) => r.action)).toEqual(expect.arrayContaining(["bench-created", "draft-saved", "draft-revision-started"]));
  });
});
