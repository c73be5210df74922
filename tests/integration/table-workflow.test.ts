// A table (bench document version 2) through the workflow over HTTP against the running server and PostgreSQL:
// created, saved and loaded as a draft (its content hash the canonical one), made into a revision; bad tables
// refused with a 400 naming the element, never a 500; a version 1 drawing keeps the content hash it always had.
// Then sent for review, read on the review screen (plan, open beam in red, beam ends), signed off (the summary kept
// with the signature names every laser and the open beam), printed (pdf.js reads "every beam ends here" from the
// PDF) and built (the checklist places each element by hole and angle).
import { execFileSync } from "node:child_process";
import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";
import { beforeAll, describe, expect, it } from "vitest";
import { contentHash } from "../../lib/bench/canonical";
import type { BenchDocumentV2 } from "../../lib/bench/schema-v2";
import { DEMO_LAB_NAME } from "../support/demo";
import { APP_URL, call, DEMO, DEMO_PASSWORD, signIn } from "../support/http";
import { labIdByName } from "../support/review-fixtures";

let researcher = "";
let officer = "";
let technician = "";
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
  officer = (await signIn(DEMO.officer)).cookie;
  technician = (await signIn(DEMO.technician)).cookie;
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

describe("the screen pattern behind an aperture of a table", () => {
  it("POST /api/analyze/profile answers for the iris on the splitter's arm, and names a dark aperture in words", async () => {
    const res = await call("POST", "/api/analyze/profile", researcher, { document: foldedTable(), apertureId: "iris", points: 40 });
    expect(res.status, res.text).toBe(200);
    expect(res.json).toMatchObject({ pathId: "p3", screenId: "screen" });
    expect((res.json!.radiusMm as number[]).length).toBe(40);
    const unknown = await call("POST", "/api/analyze/profile", researcher, { document: foldedTable(), apertureId: "nowhere" });
    expect(unknown.status).toBe(400);
    expect(String((unknown.json!.error as { message: string }).message)).toMatch(/No light reaches an aperture "nowhere"/);
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

/** The text of every page of a PDF, with pdf.js (Mozilla's PDF library, legacy build for Node). */
async function pdfText(bytes: Buffer): Promise<string> {
  const doc = await getDocument({ data: new Uint8Array(bytes), isEvalSupported: false, useSystemFonts: false }).promise;
  const pages: string[] = [];
  try {
    for (let n = 1; n <= doc.numPages; n++) {
      const content = await (await doc.getPage(n)).getTextContent();
      pages.push(content.items.map((item) => ("str" in item ? `${item.str}${item.hasEOL ? "\n" : ""}` : "")).join(""));
    }
  } finally {
    await doc.destroy();
  }
  return pages.join("\n").replace(/\s+/g, " ");
}

describe("a table through review, sign-off, the build sheet and a build", () => {
  let benchId = "";
  let revisionId = "";
  let hash = "";

  beforeAll(async () => {
    const created = await call("POST", "/api/benches", researcher, { labId, title: `Table to sign ${Date.now()}`, table });
    benchId = String(created.json!.id);
    // the folded table as drawn: the splitter's other arm runs off the back edge (an open beam above the MPE)
    expect((await save(benchId, foldedTable())).status).toBe(200);
    const draft = await draftOf(benchId);
    const revisions = await call("GET", `/api/benches/${benchId}`, researcher);
    revisionId = (revisions.json!.revisions as { id: string; number: number }[]).find((r) => r.number === draft.revisionNumber)!.id;
    hash = draft.contentHash;
  });

  it("is sent for review", async () => {
    const res = await call("POST", `/api/revisions/${revisionId}/submit`, researcher, { contentHash: hash });
    expect(res.status, res.text).toBe(200);
  });

  it("shows the officer the plan, the open beam in words with its direction, power and NOHD, and every beam's end", async () => {
    const res = await fetch(`${APP_URL}/reviews/${revisionId}`, { headers: { cookie: officer } });
    expect(res.status).toBe(200);
    const html = (await res.text()).replace(/<!-- -->/g, "");
    expect(html).toContain('data-testid="review-table-plan"');
    expect(html).toContain('data-testid="hazard-zone"');
    expect(html).toMatch(/data-open-beam="p4" data-exceeds-mpe="true"/);
    expect(html).toMatch(/Open beam above the MPE.*beam p4 of laser green, from beam splitter BS/);
    expect(html).toMatch(/Leaves the back edge at \(500, 900\) mm heading away from the viewer \(\+y\), 90°; 9\.9\d* mW; NOHD\s*\d/);
    expect(html).toMatch(/Beam p3 \(laser green, 9\.9\d* mW from beam splitter BS\) ends on screen screen/);
    expect(html).toContain("Class 3B");
  });

  it("is signed off, and the summary kept with the signature names the laser, the paths and the open beam", { timeout: 90_000 }, async () => {
    const res = await call("POST", `/api/revisions/${revisionId}/decision`, officer, { outcome: "approve", contentHash: hash, password: DEMO_PASSWORD, conditions: "Block the splitter's back arm before switching on" });
    expect(res.status, res.text).toBe(201);
    const review = await call("GET", `/api/revisions/${revisionId}`, officer);
    expect(review.status).toBe(200);
    const summary = (review.json!.decision as { hazardSummary: Record<string, unknown> }).hazardSummary;
    expect(summary).toMatchObject({ version: 2, hazardClass: { value: "3B" } });
    expect((summary.openBeams as { pathId: string; exceedsMpe: boolean }[]).map((o) => [o.pathId, o.exceedsMpe])).toEqual([["p4", true]]);
    expect((summary.paths as unknown[]).length).toBe(4);
  });

  it("prints a sheet whose text lists where every beam ends, the holes and angles, and the screen's figures", async () => {
    const started = await call("POST", `/api/revisions/${revisionId}/sheet`, technician, { paper: "A4" });
    expect([200, 202], started.text).toContain(started.status);
    let sheet = started.json!.sheet as { state: string; downloadUrl: string | null; error: string | null };
    const deadline = Date.now() + 150_000;
    while (sheet.state !== "ready" && sheet.state !== "failed" && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 500));
      sheet = (await call("GET", `/api/revisions/${revisionId}/sheet?paper=A4`, technician)).json!.sheet as typeof sheet;
    }
    expect(sheet.error).toBeNull();
    expect(sheet.state).toBe("ready");
    const res = await fetch(`${APP_URL}${sheet.downloadUrl}`, { headers: { cookie: technician } });
    expect(res.status).toBe(200);
    const pdf = Buffer.from(await res.arrayBuffer());
    const out = path.resolve(import.meta.dirname, "../../test-results/sheets");
    mkdirSync(out, { recursive: true });
    writeFileSync(path.join(out, "table-sheet.pdf"), pdf);
    try {
      execFileSync("pdftoppm", ["-png", "-r", "60", path.join(out, "table-sheet.pdf"), path.join(out, "table-sheet")]);
    } catch {
      // pictures are for people to look at; the text checks below are the test
    }
    const text = await pdfText(pdf);
    expect(text).toContain("Every beam ends here");
    expect(text).toMatch(/p3 laser green beam splitter BS 9\.9\d* mW ends on screen screen/);
    expect(text).toMatch(/p4 laser green beam splitter BS 9\.9\d* mW OPEN BEAM above the MPE: leaves the table at the back edge, \(500, 900\) mm, heading away from the viewer \(\+y\), 90°/);
    expect(text).toMatch(/Build order, following the light/);
    expect(text).toMatch(/Laser green: hole 5, 5 \+ \(-12\.5, -12\.5\) mm, 0°/);
    expect(text).toMatch(/Mirror M1: hole 21, 5 \+ \(-12\.5, -12\.5\) mm, 135°/);
    expect(text).toContain("On each screen");
    expect(text).toContain(hash);
  }, 180_000);

  it("can be built: the checklist places each element by hole and angle and asks for the open beam to be blocked", async () => {
    const res = await call("POST", "/api/builds", technician, { revisionId });
    expect([200, 201], res.text).toContain(res.status);
    const build = res.json!.build as { id: string; checklist: { itemKey: string; label: string; detail: string }[] };
    const labels = build.checklist.map((c) => c.label);
    expect(labels).toContain("Laser green at hole 5, 5 + (-12.5, -12.5) mm, 0°");
    expect(labels).toContain("Beam splitter BS at hole 21, 17 + (-12.5, -12.5) mm, 315°");
    expect(build.checklist.some((c) => c.itemKey === "open-beam:p4" && /back edge/.test(c.label))).toBe(true);
    const ticked = await call("PATCH", `/api/builds/${build.id}/checks`, technician, { itemKey: "element:M1", done: true });
    expect(ticked.status, ticked.text).toBe(200);
  });
});
