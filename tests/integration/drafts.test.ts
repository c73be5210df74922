// Saving the working draft over HTTP against the running server: optimistic concurrency (stale save → 409 with
// the server's draft), who may save (only researchers of the bench's lab), 400 with field paths for a bad
// document, and a save on top of a submitted revision starting a new draft revision while the old one stays.
// Making a revision: the draft is frozen (keeps its number and hash, takes no more saves) and revision n+1 starts.
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
  imagingLabId = (labs.json!.labs as { id: string; name: string }[]).find((l) => l.name === "Wrenfield Imaging Lab")!.id;
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

describe("making a revision", () => {
  let revisionBench = "";
  const draftOfBench = async (who: DemoKey = "researcher") => {
    const res = await call("GET", `/api/benches/${revisionBench}/draft`, cookies[who]);
    expect(res.status).toBe(200);
    return res.json!.draft as Draft;
  };
  const make = (who: DemoKey | undefined, body: unknown, id = revisionBench) => call("POST", `/api/benches/${id}/revisions`, who ? cookies[who] : undefined, body);

  beforeAll(async () => {
    const created = await call("POST", "/api/benches", cookies.researcher, { labId: imagingLabId, title: `Revision test ${Date.now()}` });
    expect(created.status).toBe(201);
    revisionBench = (created.json as { id: string }).id;
  });

  it("refuses to make a revision of an empty drawing (no laser yet), with a sentence", async () => {
    const res = await make("researcher", { baseRevision: 1, baseVersion: 1 });
    expect(res.status).toBe(400);
    expect((res.json!.error as { message: string }).message).toMatch(/Revision 1 cannot be made into a revision yet: .*laser/);
    expect((await draftOfBench()).revisionNumber).toBe(1);
  });

  it("freezes revision 1 and starts revision 2 with the same document", async () => {
    const saved = await call("PUT", `/api/benches/${revisionBench}/draft`, cookies.researcher, { document: doc(1200), baseRevision: 1, baseVersion: 1 });
    expect(saved.status).toBe(200);
    const base = saved.json!.draft as Draft;
    const res = await make("researcher", { baseRevision: base.revisionNumber, baseVersion: base.version });
    expect(res.status, res.text).toBe(201);
    const draft = res.json!.draft as Draft;
    expect(draft).toMatchObject({ benchId: revisionBench, revisionNumber: 2, version: 1, state: "draft", contentHash: base.contentHash, canEdit: true });
    expect(draft.document).toEqual(base.document);
    expect(res.json!.frozen).toMatchObject({ number: 1, contentHash: base.contentHash });

    const bench = await call("GET", `/api/benches/${revisionBench}`, cookies.researcher);
    const revisions = bench.json!.revisions as { number: number; state: string; contentHash: string; version: number }[];
    expect(revisions.map((r) => r.number)).toEqual([2, 1]);
    expect(revisions.find((r) => r.number === 1)).toMatchObject({ state: "draft", contentHash: base.contentHash, version: base.version });
    expect((await draftOfBench()).revisionNumber).toBe(2);
  });

  it("refuses saving to the frozen revision's number (409 with the working draft); the frozen one stays as it was", async () => {
    const frozenBefore = ((await call("GET", `/api/benches/${revisionBench}`, cookies.researcher)).json!.revisions as { number: number; contentHash: string; version: number }[]).find((r) => r.number === 1)!;
    const res = await call("PUT", `/api/benches/${revisionBench}/draft`, cookies.researcher, { document: doc(777), baseRevision: 1, baseVersion: frozenBefore.version });
    expect(res.status).toBe(409);
    expect((res.json!.current as Draft).revisionNumber).toBe(2);
    const after = ((await call("GET", `/api/benches/${revisionBench}`, cookies.researcher)).json!.revisions as { number: number; contentHash: string; version: number; document: Draft["document"] }[]).find((r) => r.number === 1)!;
    expect(after).toMatchObject({ contentHash: frozenBefore.contentHash, version: frozenBefore.version });
    expect(after.document.elements.find((e) => e.id === "screen-1")?.positionMm).toBe(1200);

    // Saves on the new working draft go on as usual, and leave revision 1 alone.
    const saved = await call("PUT", `/api/benches/${revisionBench}/draft`, cookies.researcher, { document: doc(1350), baseRevision: 2, baseVersion: 1 });
    expect(saved.status).toBe(200);
    expect(saved.json!.draft).toMatchObject({ revisionNumber: 2, version: 2 });
    expect(saved.json!.createdRevision).toBe(false);
  });

  it("refuses a stale request with 409 and the server's draft, and makes nothing", async () => {
    const res = await make("researcher", { baseRevision: 2, baseVersion: 1 });
    expect(res.status).toBe(409);
    expect((res.json!.error as { code: string }).code).toBe("conflict");
    expect(res.json!.current).toMatchObject({ revisionNumber: 2, version: 2 });
    const older = await make("researcher", { baseRevision: 1, baseVersion: 2 });
    expect(older.status).toBe(409);
    expect((await draftOfBench()).revisionNumber).toBe(2);
  });

  it("lets exactly one of two requests based on the same version make a revision", async () => {
    const base = await draftOfBench();
    const [a, b] = await Promise.all([
      make("researcher", { baseRevision: base.revisionNumber, baseVersion: base.version }),
      make("researcher", { baseRevision: base.revisionNumber, baseVersion: base.version }),
    ]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    expect((await draftOfBench()).revisionNumber).toBe(base.revisionNumber + 1);
  });

  it("answers 400 naming the fields of a bad request", async () => {
    const res = await make("researcher", { baseRevision: "two" });
    expect(res.status).toBe(400);
    const paths = (res.json!.error as { fields: { path: string }[] }).fields.map((f) => f.path);
    expect(paths).toEqual(expect.arrayContaining(["baseRevision", "baseVersion"]));
  });

  it("only researchers of the bench's lab may: others get 403, another lab 404, anonymous 401", async () => {
    const base = await draftOfBench();
    const body = { baseRevision: base.revisionNumber, baseVersion: base.version };
    for (const who of ["officer", "auditor", "technician"] as DemoKey[]) {
      const res = await make(who, body);
      expect(res.status, who).toBe(403);
    }
    const other = await make("student", body);
    const missing = await make("student", body, "00000000-0000-4000-8000-000000000000");
    expect(other.status).toBe(404);
    expect(other.json).toEqual(missing.json);
    expect((await make(undefined, body)).status).toBe(401);
    expect((await draftOfBench()).revisionNumber).toBe(base.revisionNumber);
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

  it("makes no revision on top of a submitted one (its next save starts it), and records made revisions in the trail", async () => {
    const current = await draftOf();
    await pool.query("update bench_revision set state = 'submitted' where bench_id = $1 and number = $2", [benchId, current.revisionNumber]);
    const submitted = await draftOf();
    const res = await call("POST", `/api/benches/${benchId}/revisions`, cookies.researcher, { baseRevision: submitted.revisionNumber, baseVersion: submitted.version });
    expect(res.status).toBe(409);
    expect((res.json!.error as { message: string }).message).toMatch(/no longer a draft/);
    expect((await draftOf()).revisionNumber).toBe(submitted.revisionNumber);

    // A save starts the next draft; making a revision of it freezes it and is audited with the frozen hash.
    const saved = await call("PUT", `/api/benches/${benchId}/draft`, cookies.researcher, { document: doc(1234), baseRevision: submitted.revisionNumber, baseVersion: submitted.version });
    expect(saved.status).toBe(200);
    const draft = saved.json!.draft as Draft;
    const made = await call("POST", `/api/benches/${benchId}/revisions`, cookies.researcher, { baseRevision: draft.revisionNumber, baseVersion: draft.version });
    expect(made.status).toBe(201);
    const audit = await pool.query("select action, revision_id, content_hash, detail from audit_event where bench_id = $1 and action = 'revision-made' order by at desc limit 1", [benchId]);
    expect(audit.rows[0]).toMatchObject({ content_hash: draft.contentHash, detail: expect.objectContaining({ number: draft.revisionNumber, newDraft: expect.objectContaining({ number: draft.revisionNumber + 1 }) }) });
  });
});
