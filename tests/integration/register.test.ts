// The laser register over HTTP (officers keep it, every lab member reads their labs' lasers, stale
// edits get 409, changes are audited) and checkBenchAgainstRegister against the real database.
import { drizzle } from "drizzle-orm/node-postgres";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as schema from "../../db/schema";
import type { Database } from "../../db";
import type { Actor } from "../../lib/server/authorize";
import { assertRegisterAllowsSubmission, checkBenchAgainstRegister } from "../../lib/server/register";
import type { BenchDocument } from "../../lib/bench/schema";
import { AppError } from "../../lib/errors";
import { call, DEMO, signIn, type DemoKey } from "../support/http";
import { databaseUrl, labIdByName, sampleBench } from "../support/review-fixtures";

const marker = `rg${Date.now().toString(36)}`;
const cookies = {} as Record<DemoKey, string>;
let pool: pg.Pool;
let db: Database;
let imagingLabId = "";
let spectroLabId = "";
const created: string[] = [];

const heNe = () => ({
  labId: imagingLabId,
  labelClass: "2",
  wavelengthsNm: [632.8],
  maxPowerMw: 0.95,
  beamDiameterMm: 0.8,
  divergenceMrad: 1.0,
  model: `Northmere Optics HN-10 ${marker}`,
  serialNumber: `HN-${marker}`,
  location: "Harbour Building B214, table 2",
  status: "in-service",
});

beforeAll(async () => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 2 });
  db = drizzle(pool, { schema }) as unknown as Database;
  for (const key of Object.keys(DEMO) as DemoKey[]) cookies[key] = (await signIn(DEMO[key])).cookie;
  imagingLabId = await labIdByName(cookies.officer, "Wrenfield Imaging Lab");
  spectroLabId = await labIdByName(cookies.officer, "Spectroscopy Teaching Lab");
});

afterAll(async () => {
  // The register is not append-only; the audit rows of these changes stay.
  if (created.length) await pool.query("delete from laser_register where id = any($1::uuid[])", [created]);
  await pool?.end();
});

describe("keeping the register", () => {
  let laserId = "";

  it("an officer registers a laser; the computed class stands beside the label", async () => {
    const res = await call("POST", "/api/lasers", cookies.officer, heNe());
    expect(res.status, res.text).toBe(201);
    const laser = res.json as { id: string; labelClass: string; version: number; computed: { hazardClass: string; matchesLabel: boolean } };
    laserId = laser.id;
    created.push(laserId);
    expect(laser.version).toBe(1);
    expect(laser.labelClass).toBe("2");
    expect(laser.computed).toMatchObject({ hazardClass: "2", matchesLabel: true });
  });

  it("a label that differs from the estimate is kept and flagged, never corrected", async () => {
    const res = await call("POST", "/api/lasers", cookies.officer, { ...heNe(), labelClass: "1", model: `Mislabelled HeNe ${marker}`, serialNumber: null });
    expect(res.status).toBe(201);
    const laser = res.json as { id: string; labelClass: string; computed: { hazardClass: string; matchesLabel: boolean; warning: string } };
    created.push(laser.id);
    expect(laser.labelClass).toBe("1");
    expect(laser.computed.matchesLabel).toBe(false);
    expect(laser.computed.warning).toMatch(/label says Class 1.*estimates Class 2.*has not been changed/);
  });

  it("classifies a multi-line, pulsed laser at its highest class", async () => {
    const res = await call("POST", "/api/lasers", cookies.officer, {
      ...heNe(),
      labelClass: "4",
      wavelengthsNm: [532, 1064],
      maxPowerMw: 2000,
      pulseEnergyMj: 200,
      pulseDurationS: 8e-9,
      pulseRepetitionRateHz: 10,
      beamDiameterMm: 6,
      divergenceMrad: 0.5,
      model: `Nd:YAG ${marker}`,
    });
    expect(res.status, res.text).toBe(201);
    created.push(String(res.json!.id));
    expect(res.json!.computed).toMatchObject({ hazardClass: "4", matchesLabel: true });
  });

  it("refuses nonsense with field-level sentences", async () => {
    const res = await call("POST", "/api/lasers", cookies.officer, { ...heNe(), wavelengthsNm: [], maxPowerMw: -1, pulseRepetitionRateHz: 10 });
    expect(res.status).toBe(400);
    const paths = (res.json!.error as { fields: { path: string }[] }).fields.map((f) => f.path);
    expect(paths).toEqual(expect.arrayContaining(["wavelengthsNm", "maxPowerMw"]));
  });

  it("only officers change the register", async () => {
    for (const who of ["researcher", "technician", "auditor", "admin", "student"] as const) {
      expect((await call("POST", "/api/lasers", cookies[who], heNe())).status, who).toBe(403);
    }
    expect((await call("POST", "/api/lasers", undefined, heNe())).status).toBe(401);
  });

  it("an edit from a stale version gets 409, not a silent overwrite; both changes are audited", async () => {
    const first = await call("PUT", `/api/lasers/${laserId}`, cookies.officer, { ...heNe(), location: "Harbour Building B214, table 3", version: 1 });
    expect(first.status, first.text).toBe(200);
    expect(first.json!.version).toBe(2);
    const stale = await call("PUT", `/api/lasers/${laserId}`, cookies.officer, { ...heNe(), status: "out-of-service", version: 1 });
    expect(stale.status).toBe(409);
    expect(String((stale.json!.error as { message: string }).message)).toMatch(/Someone else changed/);
    const { rows } = await pool.query<{ action: string; detail: { changes?: Record<string, unknown> } }>("select action, detail from audit_event where detail->>'laserId' = $1 order by at", [laserId]);
    expect(rows.map((r) => r.action)).toEqual(["laser-registered", "laser-updated"]);
    expect(rows[1].detail.changes).toHaveProperty("location");
  });

  it("lab members see their labs' lasers; others do not", async () => {
    const mine = await call("GET", "/api/lasers", cookies.researcher);
    expect((mine.json!.lasers as { id: string }[]).some((l) => l.id === laserId)).toBe(true);
    const picker = await call("GET", `/api/lasers?labId=${imagingLabId}&status=in-service`, cookies.researcher);
    expect(picker.status).toBe(200);
    expect((picker.json!.lasers as { id: string }[]).some((l) => l.id === laserId)).toBe(true);
    const student = await call("GET", "/api/lasers", cookies.student);
    expect((student.json!.lasers as { id: string }[]).some((l) => l.id === laserId)).toBe(false);
    expect((await call("GET", `/api/lasers/${laserId}`, cookies.student)).status).toBe(404);
    expect((await call("GET", `/api/lasers?labId=${imagingLabId}`, cookies.student)).status).toBe(403);
    expect((await call("GET", `/api/lasers?labId=${spectroLabId}`, cookies.student)).status).toBe(200);
    for (const who of ["officer", "auditor", "technician"] as const) expect((await call("GET", `/api/lasers/${laserId}`, cookies[who])).status, who).toBe(200);
  });
});

describe("a bench against the register", () => {
  const researcher = (): Actor => ({ userId: "register-test", name: "Register Test", email: "x@northmere.example.edu", roles: ["researcher"], labIds: [imagingLabId], allLabs: false, ipAddress: null });
  let entryId = "";
  const withRegister = (overrides: Record<string, unknown> = {}): BenchDocument => {
    const doc = sampleBench(`Register check ${marker}`, { powerMw: 0.9 });
    doc.elements[0] = { ...(doc.elements[0] as object), registerId: entryId, ...overrides } as BenchDocument["elements"][number];
    return doc;
  };

  beforeAll(async () => {
    const res = await call("POST", "/api/lasers", cookies.officer, { ...heNe(), model: `Bench-check HeNe ${marker}`, maxPowerMw: 1 });
    entryId = String(res.json!.id);
    created.push(entryId);
  });

  it("is quiet when the bench stays within the register entry", async () => {
    const check = await checkBenchAgainstRegister(db, researcher(), withRegister());
    expect(check.warnings).toEqual([]);
    expect(check).toMatchObject({ laserId: entryId, labelClass: "2", computedClass: "2" });
  });

  it("warns on power above the entry, a wavelength it does not emit, a different diameter and a class differing from the label", async () => {
    const check = await checkBenchAgainstRegister(db, researcher(), withRegister({ powerMw: 4, wavelengthNm: 543.5, beamDiameterMm: 0.5 }));
    expect(check.warnings.map((w) => w.code).sort()).toEqual(["class-differs-from-label", "diameter-differs", "power-above-register", "wavelength-not-registered"]);
    expect(check.warnings.every((w) => !w.blocksSubmission)).toBe(true);
  });

  it("an out-of-service laser blocks a new submission", async () => {
    const current = await call("GET", `/api/lasers/${entryId}`, cookies.officer);
    const put = await call("PUT", `/api/lasers/${entryId}`, cookies.officer, { ...heNe(), model: `Bench-check HeNe ${marker}`, maxPowerMw: 1, status: "out-of-service", version: current.json!.version });
    expect(put.status, put.text).toBe(200);
    const check = await checkBenchAgainstRegister(db, researcher(), withRegister());
    expect(check.warnings).toEqual([expect.objectContaining({ code: "laser-not-in-service", blocksSubmission: true })]);
    await expect(assertRegisterAllowsSubmission(db, researcher(), withRegister())).rejects.toSatisfy((e: unknown) => e instanceof AppError && e.status === 409);
  });

  it("an entry the researcher may not see, or that does not exist, is a warning, not a leak", async () => {
    const student: Actor = { ...researcher(), labIds: [spectroLabId] };
    const check = await checkBenchAgainstRegister(db, student, withRegister());
    expect(check.warnings.map((w) => w.code)).toEqual(["register-entry-missing"]);
    const none = await checkBenchAgainstRegister(db, researcher(), sampleBench("No register id"));
    expect(none.warnings).toEqual([]);
  });
});
