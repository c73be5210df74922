// A table (bench document version 2) through the workflow over HTTP against the running server and PostgreSQL:
// created, saved and loaded as a draft (its content hash the canonical one), made into a revision; bad tables
// refused with a 400 naming the element, never a 500; a version 1 drawing keeps the content hash it always had.
import { beforeAll, describe, expect, it } from "vitest";
import { contentHash } from "../../lib/bench/canonical";
import type { BenchDocumentV2 } from "../../lib/bench/schema-v2";
import { DEMO_LAB_NAME } from "../support/demo";
import { call, DEMO, signIn } from "../support/http";
import { labIdByName } from "../support/review-fixtures";

let researcher = "";
let labId = "";
let tableBenchId = "";

const table = { widthMm: 1200, depthMm: 900, holePitchMm: 25 };
export const foldedTable = (): BenchDocumentV2 => ({
  version: 2 as const,
  title: "Folded table with a splitter",
  table,
  elements: [
    { id: "green", kind: "laser", xMm: 100, yMm: 100, angleDeg: 0, wavelengthNm: 532, powerMw: 20, beamDiameterMm: 1 },
    { id: "M1", kind: "mirror", xMm: 500, yMm: 100, angleDeg: 135 },
    { id: "BS", kind: "beam-splitter", xMm: 500, yMm: 400, angleDeg: 315, reflectance: 0.5 },
    { id: "iris", kind: "aperture", xMm: 800, yMm: 400, angleDeg: 180, diameterMm: 2 },
    { id: "screen", kind: "screen", xMm: 1100, yMm: 400, angleDeg: 180 },
  ],
});

type Draft = { benchId: string; revisionNumber: number; version: number; contentHash: string; document: { version: number; table?: unknown; elements: { id: string }[] } };
type Problem = { path: string; message: string };
const problemsOf = (json: Record<string, unknown> | null) => ((json?.error as { fields: Problem[] }) ?? { fields: [] }).fields;

async function draftOf(benchId: string): Promise<Draft> {
  const res = await call("GET", `/api/benches/${benchId}/draft`, researcher);
  expect(res.status).toBe(200);
  return res.json!.draft as Draft;
}

async function save(benchId: string, document: unknown) {
  const base = await draftOf(benchId);
  return call("PUT", `/api/benches/${benchId}/draft`, researcher, { document, baseRevision: base.revisionNumber, baseVersion: base.version });
}

beforeAll(async () => {
  researcher = (await signIn(DEMO.researcher)).cookie;
  labId = await labIdByName(researcher, DEMO_LAB_NAME);
  const created = await call("POST", "/api/benches", researcher, { labId, title: `Table workflow ${Date.now()}`, table });
  expect(created.status).toBe(201);
  tableBenchId = String(created.json!.id);
});


describe("a table bench's draft", () => {
  it("starts as an empty version 2 document of the size asked for", async () => {
    const draft = await draftOf(tableBenchId);
    expect(draft.document).toMatchObject({ version: 2, table, elements: [] });
  });

  it("saves and loads a folded table with a splitter; the stored hash is the canonical one", async () => {
    const doc = foldedTable();
    const res = await save(tableBenchId, doc);
    expect(res.status, res.text).toBe(200);
    const draft = await draftOf(tableBenchId);
    expect(draft.document).toEqual(doc);
    expect(draft.contentHash).toBe(contentHash(doc));
  });

  it("makes a revision of the table: the frozen one keeps its hash, the new draft holds the same table", async () => {
    const base = await draftOf(tableBenchId);
    const res = await call("POST", `/api/benches/${tableBenchId}/revisions`, researcher, { baseRevision: base.revisionNumber, baseVersion: base.version });
    expect(res.status, res.text).toBe(201);
    expect((res.json!.frozen as { contentHash: string }).contentHash).toBe(base.contentHash);
    const next = await draftOf(tableBenchId);
    expect(next.revisionNumber).toBe(base.revisionNumber + 1);
    expect(next.document).toEqual(base.document);
  });

  it.each([
    ["an element off the table", { ...foldedTable(), elements: [...foldedTable().elements, { id: "stray", kind: "beam-block", xMm: 1500, yMm: 100, angleDeg: 180 }] }, /Beam block "stray".*off the table/],
    ["a splitter reflectance of 1.5", { ...foldedTable(), elements: foldedTable().elements.map((e) => (e.id === "BS" ? { ...e, reflectance: 1.5 } : e)) }, /Beam splitter "BS": reflectance must be between 0 and 1/],
    [
      "501 elements",
      {
        ...foldedTable(),
        elements: [
          ...foldedTable().elements,
          ...Array.from({ length: 496 }, (_, i) => ({ id: `b${i}`, kind: "beam-block", xMm: 20 + (i % 40) * 25, yMm: 500 + Math.floor(i / 40) * 25, angleDeg: 0 })),
        ],
      },
      /at most 500 elements/,
    ],
  ])("refuses %s with a 400 naming it, and the stored draft is unchanged", async (_name, document, message) => {
    const before = await draftOf(tableBenchId);
    const res = await save(tableBenchId, document);
    expect(res.status).toBe(400);
    expect(problemsOf(res.json).some((p) => message.test(p.message)), JSON.stringify(res.json)).toBe(true);
    const after = await draftOf(tableBenchId);
    expect(after.contentHash).toBe(before.contentHash);
    expect(after.version).toBe(before.version);
  });
});

describe("a rail bench (version 1) beside it", () => {
  // The content hash of this drawing computed by the first canonical JSON (before version 2 existed): it must not move.
  const pinned = "a6c2c8f4654499bb534f2adafe827879cd4a37d9be01cdd7506aa457e23153e3";
  const rail = {
    version: 1,
    title: "Pinned rail",
    elements: [
      { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 4, beamDiameterMm: 0.8 },
      { id: "lens-1", kind: "lens", positionMm: 100, focalLengthMm: -25 },
      { id: "iris-1", kind: "aperture", positionMm: 400, diameterMm: 2 },
      { id: "screen-1", kind: "screen", positionMm: 1400 },
    ],
  };

  it("saves and loads as before, with the content hash it always had", async () => {
    const created = await call("POST", "/api/benches", researcher, { labId, title: `Rail beside tables ${Date.now()}` });
    expect(created.status).toBe(201);
    const benchId = String(created.json!.id);
    expect((await draftOf(benchId)).document).toMatchObject({ version: 1, elements: [] });
    const res = await save(benchId, rail);
    expect(res.status, res.text).toBe(200);
    const draft = await draftOf(benchId);
    expect(draft.contentHash).toBe(pinned);
    expect(draft.document).toEqual(rail);
  });

  it("refuses a new bench whose table is not a table", async () => {
    const res = await call("POST", "/api/benches", researcher, { labId, title: "No size", table: { widthMm: -1, depthMm: 900, holePitchMm: 25 } });
    expect(res.status).toBe(400);
    expect(problemsOf(res.json).some((p) => /Table width must be greater than 0/.test(p.message))).toBe(true);
  });
});
