// Eyewear on the lab's shelf over HTTP with the real PostgreSQL: officers keep it, lab members read it, every change is
// audited, bad input is refused with the field named, the lab's standard is chosen by an admin or officer, and the
// review API and page say per line which item covers the OD needed (coverage rule: lib/safety/eyewear.ts, OD = log10(H/MPE)).
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BenchDocument } from "../../lib/bench/schema";
import { call, DEMO, signIn, type DemoKey } from "../support/http";
import { createDrawnBench, databaseUrl, labIdByName } from "../support/review-fixtures";

const marker = `ew${Date.now().toString(36)}`;
const cookies = {} as Record<DemoKey, string>;
let pool: pg.Pool;
let imagingLabId = "";
const created: string[] = [];

type Item = { id: string; labId: string; name: string; version: number; bands: { fromNm: number; toNm: number; opticalDensity: number; en207ScaleNumber: number | null }[] };
type Problem = { error: { code: string; message: string; fields: { path: string; message: string }[] } };

const goggles = (over: Record<string, unknown> = {}) => ({
  labId: imagingLabId,
  name: `Test goggles ${marker}`,
  quantity: 2,
  bands: [
    { fromNm: 190, toNm: 400, opticalDensity: 5 },
    { fromNm: 515, toNm: 545, opticalDensity: 6, en207ScaleNumber: 5 },
  ],
  ...over,
});

async function auditRows(eyewearId: string) {
  const { rows } = await pool.query<{ action: string; actor_id: string | null; detail: Record<string, unknown> }>(
    "select action, actor_id, detail from audit_event where detail->>'eyewearId' = $1 order by at",
    [eyewearId],
  );
  return rows;
}

beforeAll(async () => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 2 });
  for (const key of Object.keys(DEMO) as DemoKey[]) cookies[key] = (await signIn(DEMO[key])).cookie;
  imagingLabId = await labIdByName(cookies.officer, "Wrenfield Imaging Lab");
});

afterAll(async () => {
  if (created.length) await pool.query("delete from eyewear_item where id = any($1::uuid[])", [created]);
  await pool?.end();
});

describe("keeping the eyewear list", () => {
  let itemId = "";

  it("an officer adds an item; it is audited with who and what", async () => {
    const res = await call("POST", "/api/eyewear", cookies.officer, goggles());
    expect(res.status, res.text).toBe(201);
    const item = res.json as unknown as Item;
    itemId = item.id;
    created.push(itemId);
    expect(item.version).toBe(1);
    expect(item.bands).toEqual([
      { fromNm: 190, toNm: 400, opticalDensity: 5, en207ScaleNumber: null },
      { fromNm: 515, toNm: 545, opticalDensity: 6, en207ScaleNumber: 5 },
    ]);
    const rows = await auditRows(itemId);
    expect(rows.map((r) => r.action)).toEqual(["eyewear-added"]);
    const [{ rows: officer }] = [await pool.query<{ id: string }>("select id from \"user\" where email = $1", [DEMO.officer])];
    expect(rows[0].actor_id).toBe(officer[0].id);
    expect((rows[0].detail.entry as { name: string }).name).toBe(`Test goggles ${marker}`);
  });

  it("researchers, technicians and auditors may read but not change it; nobody outside the lab sees it", async () => {
    for (const who of ["researcher", "technician", "auditor"] as const) {
      const list = await call("GET", `/api/eyewear?labId=${imagingLabId}`, cookies[who]);
      expect(list.status, who).toBe(200);
      expect((list.json!.eyewear as Item[]).some((i) => i.id === itemId), who).toBe(true);
      const add = await call("POST", "/api/eyewear", cookies[who], goggles({ name: `Not allowed ${marker}` }));
      expect(add.status, who).toBe(403);
      expect((add.json as unknown as Problem).error.message).toMatch(/may not manage eyewear/);
      expect((await call("DELETE", `/api/eyewear/${itemId}`, cookies[who])).status, who).toBe(403);
    }
    // The student belongs to the Spectroscopy Teaching Lab only.
    expect((await call("GET", `/api/eyewear/${itemId}`, cookies.student)).status).toBe(404);
    expect((await call("GET", `/api/eyewear?labId=${imagingLabId}`, cookies.student)).status).toBe(403);
    const own = await call("GET", "/api/eyewear", cookies.student);
    expect((own.json!.eyewear as Item[]).some((i) => i.id === itemId)).toBe(false);
    expect((await call("GET", "/api/eyewear", undefined)).status).toBe(401);
    const { rows } = await pool.query<{ n: number }>("select count(*)::int as n from eyewear_item where name = $1", [`Not allowed ${marker}`]);
    expect(rows[0].n).toBe(0);
  });

  it("an edit from the current version is saved and audited; a stale one gets 409", async () => {
    const res = await call("PUT", `/api/eyewear/${itemId}`, cookies.officer, { ...goggles({ quantity: 3 }), version: 1 });
    expect(res.status, res.text).toBe(200);
    expect((res.json as unknown as Item).version).toBe(2);
    const stale = await call("PUT", `/api/eyewear/${itemId}`, cookies.officer, { ...goggles({ quantity: 4 }), version: 1 });
    expect(stale.status).toBe(409);
    const rows = await auditRows(itemId);
    expect(rows.map((r) => r.action)).toEqual(["eyewear-added", "eyewear-updated"]);
    expect(rows[1].detail.changes).toEqual({ quantity: { from: 2, to: 3 } });
  });

  it("bad input is refused with the field named, never a 500", async () => {
    const cases: [unknown, RegExp, string][] = [
      [goggles({ bands: [{ fromNm: 500, toNm: 600, opticalDensity: 11 }] }), /Optical density \(opticalDensity\) must be at most 10/, "bands.0.opticalDensity"],
      [goggles({ bands: [{ fromNm: 500, toNm: 600, opticalDensity: -0.5 }] }), /Optical density \(opticalDensity\) must be at least 0/, "bands.0.opticalDensity"],
      [goggles({ bands: [{ fromNm: 600, toNm: 500, opticalDensity: 3 }] }), /Band end \(toNm\) must be greater/, "bands.0.toNm"],
      [goggles({ bands: [{ fromNm: 600, toNm: 600, opticalDensity: 3 }] }), /cannot be empty/, "bands.0.toNm"],
      [goggles({ bands: [] }), /Bands \(bands\): give at least one/, "bands"],
      [goggles({ bands: [{ fromNm: 500, toNm: 700, opticalDensity: 3 }, { fromNm: 650, toNm: 800, opticalDensity: 3 }] }), /Bands \(bands\) overlap/, "bands.1.fromNm"],
      [goggles({ name: "   " }), /Name \(name\) must not be empty/, "name"],
      [goggles({ quantity: 0 }), /Quantity \(quantity\) must be at least 1/, "quantity"],
      [goggles({ bands: [{ fromNm: 500, toNm: 600, opticalDensity: 3, en207ScaleNumber: 12 }] }), /EN 207 scale number/, "bands.0.en207ScaleNumber"],
      [goggles({ labId: "not-a-lab" }), /Lab \(labId\)/, "labId"],
    ];
    for (const [body, message, path] of cases) {
      const res = await call("POST", "/api/eyewear", cookies.officer, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      const problem = res.json as unknown as Problem;
      expect(problem.error.message).toMatch(message);
      expect(problem.error.fields.map((f) => f.path)).toContain(path);
    }
    const unknownLab = await call("POST", "/api/eyewear", cookies.officer, goggles({ labId: "00000000-0000-4000-8000-000000000000" }));
    expect(unknownLab.status).toBe(400);
    expect((unknownLab.json as unknown as Problem).error.fields[0].path).toBe("labId");
    for (const raw of ["{", "[]", "null", "\"text\""]) expect((await call("POST", "/api/eyewear", cookies.officer, raw)).status, raw).toBe(400);
    expect((await call("GET", "/api/eyewear/not-a-uuid", cookies.officer)).status).toBe(404);
    expect((await call("PUT", "/api/eyewear/not-a-uuid", cookies.officer, { ...goggles(), version: 1 })).status).toBe(404);
    expect((await call("GET", "/api/eyewear?labId=zzz", cookies.officer)).status).toBe(400);
    expect((await call("GET", "/api/eyewear/coverage?revisionId=zzz", cookies.officer)).status).toBe(400);
  });

  it("taking an item off the shelf is audited with what it was", async () => {
    const extra = await call("POST", "/api/eyewear", cookies.officer, goggles({ name: `Spare ${marker}` }));
    const id = (extra.json as unknown as Item).id;
    const res = await call("DELETE", `/api/eyewear/${id}`, cookies.officer);
    expect(res.status).toBe(200);
    expect((await call("GET", `/api/eyewear/${id}`, cookies.officer)).status).toBe(404);
    const rows = await auditRows(id);
    expect(rows.map((r) => r.action)).toEqual(["eyewear-added", "eyewear-removed"]);
    expect((rows[1].detail.entry as { name: string }).name).toBe(`Spare ${marker}`);
  });
});

describe("the lab's safety standard", () => {
  let labId = "";
  beforeAll(async () => {
    const res = await call("POST", "/api/labs", cookies.admin, { name: `Standard lab ${marker}`, room: "S1" });
    expect(res.status, res.text).toBe(201);
    labId = String((res.json as { id?: string; lab?: { id: string } }).id ?? (res.json as { lab: { id: string } }).lab.id);
  });

  it("an officer or admin picks it, audited; others may not; a wrong value is named", async () => {
    const set = await call("PUT", `/api/eyewear/standards/${labId}`, cookies.officer, { standard: "IEC 60825-1:2014" });
    expect(set.status, set.text).toBe(200);
    const { rows } = await pool.query<{ safety_standard: string }>("select safety_standard from lab where id = $1", [labId]);
    expect(rows[0].safety_standard).toBe("IEC 60825-1:2014");
    expect((await call("PUT", `/api/eyewear/standards/${labId}`, cookies.admin, { standard: "ANSI Z136.1-2014" })).status).toBe(200);
    for (const who of ["researcher", "technician", "auditor", "student"] as const) {
      expect((await call("PUT", `/api/eyewear/standards/${labId}`, cookies[who], { standard: "IEC 60825-1:2014" })).status, who).toBe(403);
    }
    const bad = await call("PUT", `/api/eyewear/standards/${labId}`, cookies.officer, { standard: "ISO 1234" });
    expect(bad.status).toBe(400);
    expect((bad.json as unknown as Problem).error.fields[0].path).toBe("standard");
    expect((bad.json as unknown as Problem).error.message).toMatch(/Standard \(standard\) must be one of: ANSI Z136.1-2014, IEC 60825-1:2014/);
    expect((await call("PUT", `/api/eyewear/standards/00000000-0000-4000-8000-000000000000`, cookies.officer, { standard: "IEC 60825-1:2014" })).status).toBe(404);
    const audit = await pool.query<{ action: string; detail: { from: string; to: string } }>("select action, detail from audit_event where action = 'lab-standard-changed' and detail->>'labId' = $1 order by at", [labId]);
    expect(audit.rows.map((r) => [r.detail.from, r.detail.to])).toEqual([
      ["ANSI Z136.1-2014", "IEC 60825-1:2014"],
      ["IEC 60825-1:2014", "ANSI Z136.1-2014"],
    ]);
  });
});

describe("coverage on the review API and page", () => {
  let revisionId = "";
  let strongId = "";
  let weakId = "";
  const doc: BenchDocument = {
    version: 1,
    title: `Green coverage ${marker}`,
    elements: [
      { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 532, powerMw: 50, beamDiameterMm: 1 },
      { id: "screen-1", kind: "screen", positionMm: 800 },
    ],
  };

  beforeAll(async () => {
    const strong = await call("POST", "/api/eyewear", cookies.officer, goggles({ name: `Strong green ${marker}`, bands: [{ fromNm: 520, toNm: 540, opticalDensity: 7 }] }));
    const weak = await call("POST", "/api/eyewear", cookies.officer, goggles({ name: `Weak green ${marker}`, bands: [{ fromNm: 520, toNm: 540, opticalDensity: 0.5 }] }));
    strongId = (strong.json as unknown as Item).id;
    weakId = (weak.json as unknown as Item).id;
    created.push(strongId, weakId);
    ({ revisionId } = await createDrawnBench(pool, cookies.researcher, imagingLabId, doc));
  });

  it("names, per line, the OD needed and the items that cover it, with the lab's standard", async () => {
    const res = await call("GET", `/api/eyewear/coverage?revisionId=${revisionId}`, cookies.researcher);
    expect(res.status, res.text).toBe(200);
    const body = res.json as unknown as {
      standard: string;
      coverage: { lines: { wavelengthNm: number; opticalDensityRequired: number; status: string; coveredBy: { id: string }[]; shortOf: { id: string }[] }[] };
    };
    expect(body.standard).toBe("ANSI Z136.1-2014");
    const line = body.coverage.lines.find((l) => l.wavelengthNm === 532)!;
    expect(line).toBeDefined();
    // Independent check of the need: 50 mW into a 7 mm aperture at 0.25 s, ANSI Z136.1-2014 Table 5a visible MPE
    // 1.8·t^0.75 mJ/cm² ⇒ 2.546 mW/cm²; E ≤ P/(π·0.35²) = 129.9 mW/cm², so OD ≤ log10(129.9/2.546) ≈ 1.71 and > 0.5.
    expect(line.opticalDensityRequired).toBeGreaterThan(0.5);
    expect(line.opticalDensityRequired).toBeLessThanOrEqual(1.7079 + 1e-3);
    expect(line.status).toBe("covered");
    expect(line.coveredBy.map((i) => i.id)).toContain(strongId);
    expect(line.coveredBy.map((i) => i.id)).not.toContain(weakId);
    expect(line.shortOf.map((i) => i.id)).toContain(weakId);
    // Outside the lab: the revision does not exist.
    expect((await call("GET", `/api/eyewear/coverage?revisionId=${revisionId}`, cookies.student)).status).toBe(404);
  });

  it("the review page shows the covering item by name and names the standard", async () => {
    const page = await call("GET", `/reviews/${revisionId}`, cookies.researcher);
    expect(page.status).toBe(200);
    expect(page.text).toContain(`Strong green ${marker}`);
    expect(page.text).toMatch(/ANSI Z136\.1-2014/);
    expect(page.text).toContain("data-testid=\"eyewear-coverage\"");
  });
});

describe("further lines in the laser register", () => {
  it("an officer records a doubled laser's residual lines; the estimate takes the highest class over all lines; bad lines are named", async () => {
    const base = {
      labId: imagingLabId,
      labelClass: "3B",
      wavelengthsNm: [532],
      maxPowerMw: 4,
      beamDiameterMm: 1,
      divergenceMrad: 1,
      model: `Invented doubled module ${marker}`,
      status: "in-service",
    };
    const res = await call("POST", "/api/lasers", cookies.officer, { ...base, lines: [{ wavelengthNm: 1064, powerMw: 200 }, { wavelengthNm: 808, powerMw: 20 }] });
    expect(res.status, res.text).toBe(201);
    const laser = res.json as { id: string; lines: { wavelengthNm: number; powerMw: number }[]; computed: { hazardClass: string; reasons: string[] } };
    try {
      expect(laser.lines).toEqual([{ wavelengthNm: 1064, powerMw: 200 }, { wavelengthNm: 808, powerMw: 20 }]);
      // 4 mW at 532 nm alone is Class 3R (IEC 60825-1:2014: Class 2 up to 1 mW, 3R up to 5 mW visible CW). 200 mW at
      // 1064 nm is 3B: above 3R (5 × the Class 1 limit 3.9e-4·C4·C7 W with C4 = 5, C7 = 1, ≈ 9.8 mW — from memory)
      // and below the 3B limit of 500 mW (IEC 60825-1:2014 Table 8).
      expect(laser.computed.hazardClass).toBe("3B");
      expect(laser.computed.reasons.join(" ")).toMatch(/Further line 1064 nm at 200 mW: Class 3B/);
      const bad = await call("POST", "/api/lasers", cookies.officer, { ...base, lines: [{ wavelengthNm: 100, powerMw: -1 }] });
      expect(bad.status).toBe(400);
      const fields = (bad.json as unknown as Problem).error.fields.map((f) => f.path);
      expect(fields).toContain("lines.0.wavelengthNm");
      expect(fields).toContain("lines.0.powerMw");
    } finally {
      await pool.query("delete from laser_register where id = $1", [laser.id]);
    }
  });
});
