// Every hazard figure follows the safety standard the bench's lab chose (lab.safety_standard): the editor's
// POST /api/analyze?labId=, the review page, the technician's checklist OD line and the build sheet's content. Over HTTP
// against the running server and the real PostgreSQL, with a lab made for the test and set to IEC 60825-1:2014.
//
// The bench: 50 mW at 355 nm over the UV default exposure (30 000 s). Both standards give the same MPE (1.0 J/cm² over the
// exposure), but the limiting aperture differs (ANSI Z136.1-2014 Table 8: 3.5 mm for ≥ 10 s in 180–400 nm; IEC 60825-1:2014
// Table A.4: 1 mm — both from memory), so the OD needed differs by about one (4.19 against 5.22): the engine's own two
// answers are compared, and the server must give the IEC one.
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BenchDocument } from "../../lib/bench/schema";
import { assessRevision } from "../../lib/review/hazard";
import { call, DEMO, DEMO_PASSWORD, signIn } from "../support/http";
import { createAccount, createDrawnBench, databaseUrl } from "../support/review-fixtures";

const marker = `ls${Date.now().toString(36)}`;
let pool: pg.Pool;
let labId = "";
const cookie = {} as Record<"admin" | "officer" | "researcher" | "technician", string>;
type Problem = { error: { message: string; fields: { path: string }[] } };

const doc: BenchDocument = {
  version: 1,
  title: `UV under the lab's standard ${marker}`,
  elements: [
    { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 355, powerMw: 50, beamDiameterMm: 1 },
    { id: "screen-1", kind: "screen", positionMm: 800 },
  ],
};

function engineOd(standard: "ANSI Z136.1-2014" | "IEC 60825-1:2014"): number {
  const a = assessRevision(doc, { standard });
  if (!a.ok) throw new Error(a.problem);
  return a.safety.governing!.opticalDensityRequired;
}

beforeAll(async () => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 2 });
  cookie.admin = (await signIn(DEMO.admin)).cookie;
  cookie.officer = (await signIn(DEMO.officer)).cookie;
  const made = await call("POST", "/api/labs", cookie.admin, { name: `IEC lab ${marker}`, room: "S2" });
  expect(made.status, made.text).toBe(201);
  labId = String((made.json as { id?: string; lab?: { id: string } }).id ?? (made.json as { lab: { id: string } }).lab.id);
  const set = await call("PUT", `/api/eyewear/standards/${labId}`, cookie.officer, { standard: "IEC 60825-1:2014" });
  expect(set.status, set.text).toBe(200);
  const password = "lab-standard-test-2026";
  const researcher = await createAccount(pool, { name: `Researcher ${marker}`, roles: ["researcher"], labIds: [labId], password });
  const technician = await createAccount(pool, { name: `Technician ${marker}`, roles: ["technician"], labIds: [labId], password });
  cookie.researcher = (await signIn(researcher.email, password)).cookie;
  cookie.technician = (await signIn(technician.email, password)).cookie;
});

afterAll(async () => {
  await pool?.end();
});

describe("hazard figures follow the lab's chosen standard", () => {
  it("the two standards give different ODs for this bench (else the checks below prove nothing)", () => {
    expect(engineOd("IEC 60825-1:2014")).toBeGreaterThan(engineOd("ANSI Z136.1-2014") + 0.5);
  });

  it("POST /api/analyze?labId= uses the lab's standard; without a lab, the default; a wrong lab is named", async () => {
    const withLab = await call("POST", `/api/analyze?labId=${labId}`, cookie.researcher, doc);
    expect(withLab.status, withLab.text).toBe(200);
    const safety = withLab.json!.safety as { standard: string; governing: { opticalDensityRequired: number }; mpe: { source: string } };
    expect(safety.standard).toBe("IEC 60825-1:2014");
    expect(safety.governing.opticalDensityRequired).toBeCloseTo(engineOd("IEC 60825-1:2014"), 9);
    const plain = await call("POST", "/api/analyze", cookie.researcher, doc);
    expect((plain.json!.safety as { standard: string }).standard).toBe("ANSI Z136.1-2014");
    const bad = await call("POST", "/api/analyze?labId=not-a-lab", cookie.researcher, doc);
    expect(bad.status).toBe(400);
    expect((bad.json as unknown as Problem).error.fields[0].path).toBe("labId");
    const none = await call("POST", "/api/analyze?labId=00000000-0000-4000-8000-000000000000", cookie.researcher, doc);
    expect(none.status).toBe(400);
    expect((none.json as unknown as Problem).error.message).toMatch(/labId names no lab/);
    // a table (version 2) follows it too
    const table = {
      version: 2,
      table: { widthMm: 1200, depthMm: 600, holePitchMm: 25 },
      elements: [
        { id: "laser-1", kind: "laser", xMm: 100, yMm: 300, angleDeg: 0, wavelengthNm: 355, powerMw: 50, beamDiameterMm: 1 },
        { id: "block-1", kind: "beam-block", xMm: 900, yMm: 300, angleDeg: 180 },
      ],
    };
    const t = await call("POST", `/api/analyze?labId=${labId}`, cookie.researcher, table);
    expect(t.status, t.text).toBe(200);
    const tableOd = (t.json!.safety as { governing: { opticalDensityRequired: number } }).governing.opticalDensityRequired;
    expect(tableOd).toBeCloseTo(engineOd("IEC 60825-1:2014"), 6);
  });

  it("the review page, the checklist's eyewear line and the build sheet's content follow it", async () => {
    const b = await createDrawnBench(pool, cookie.researcher, labId, doc);
    const page = await call("GET", `/reviews/${b.revisionId}`, cookie.researcher);
    expect(page.status).toBe(200);
    const iecWhole = Math.ceil(engineOd("IEC 60825-1:2014") - 1e-9);
    const ansiWhole = Math.ceil(engineOd("ANSI Z136.1-2014") - 1e-9);
    expect(iecWhole).not.toBe(ansiWhole);
    expect((await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, { contentHash: b.contentHash })).status).toBe(200);
    const decided = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "approve", contentHash: b.contentHash, password: DEMO_PASSWORD });
    expect(decided.status, decided.text).toBe(201);
    // the summary kept with the signature names the lab's standard
    const { rows } = await pool.query<{ hazard_summary: { standard: string; governingOd: { value: number } } }>("select hazard_summary from review_decision where revision_id = $1", [b.revisionId]);
    expect(rows[0].hazard_summary.standard).toBe("IEC 60825-1:2014");
    expect(rows[0].hazard_summary.governingOd.value).toBeCloseTo(engineOd("IEC 60825-1:2014"), 9);

    const started = await call("POST", "/api/builds", cookie.technician, { revisionId: b.revisionId });
    expect(started.status, started.text).toBe(201);
    const eyewear = (started.json!.build as { checklist: { itemKey: string; label: string }[] }).checklist.find((c) => c.itemKey === "eyewear")!;
    expect(eyewear.label).toContain(`OD ${iecWhole} or more`);

    const sheet = await call("GET", `/print/sheets/${b.revisionId}`, cookie.technician);
    expect(sheet.status).toBe(200);
    expect(sheet.text).toContain(`OD ${iecWhole} or more`);
    expect(sheet.text).not.toContain(`OD ${ansiWhole} or more`);
    expect(sheet.text).toMatch(/IEC 60825-1:2014/);
  });
});
