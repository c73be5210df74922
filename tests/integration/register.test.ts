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
import { laserValuesFrom, type RegisterEntry } from "../../components/editor/register-check";
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

describe("a laser in bursts in the register", () => {
  // An invented burst-mode fibre laser: 10 µJ, 10 ns pulses; 10 pulses per burst at 1 MHz inside a burst; 1 000 bursts
  // per second, so 10 kHz on average and 10 µJ × 10 kHz = 100 mW average.
  const burstLaser = () => ({
    ...heNe(),
    labelClass: "3B",
    wavelengthsNm: [1064],
    maxPowerMw: 100,
    pulseEnergyMj: 0.01,
    pulseDurationS: 1e-8,
    pulseRepetitionRateHz: 1e4,
    pulsesPerBurst: 10,
    burstPulseRateHz: 1e6,
    beamDiameterMm: 2,
    divergenceMrad: 1,
    model: `Northmere Photonics BF-2 ${marker}`,
    serialNumber: `BF-${marker}`,
  });
  const refusal = async (body: Record<string, unknown>, method: "POST" | "PUT" = "POST", path = "/api/lasers") => {
    const res = await call(method, path, cookies.officer, body);
    expect(res.status, res.text).toBe(400);
    return (res.json!.error as { fields: { path: string; message: string }[] }).fields;
  };
  let burstId = "";

  it("an officer registers it with its bursts; reading it back gives them, and the class is estimated as bursts", async () => {
    const res = await call("POST", "/api/lasers", cookies.officer, burstLaser());
    expect(res.status, res.text).toBe(201);
    burstId = String(res.json!.id);
    created.push(burstId);
    expect(res.json).toMatchObject({ pulsesPerBurst: 10, burstPulseRateHz: 1e6, pulseRepetitionRateHz: 1e4, pulseEnergyMj: 0.01 });
    const again = await call("GET", `/api/lasers/${burstId}`, cookies.researcher);
    expect(again.json).toMatchObject({ pulsesPerBurst: 10, burstPulseRateHz: 1e6 });
    // 100 mW average and 10 µJ per pulse at 1064 nm: Class 3B (below 0.5 W and 0.15 J per pulse, IEC 60825-1:2014 Table 8,
    // from memory), whether read as bursts or as an even train; the reasons say the pulses come in bursts.
    const computed = again.json!.computed as { hazardClass: string; matchesLabel: boolean; reasons: string[] };
    expect(computed).toMatchObject({ hazardClass: "3B", matchesLabel: true });
    expect(computed.reasons.join(" ")).toMatch(/Pulses in bursts \(10 at 1000000 Hz inside a burst, 1000 bursts per second\)/);
    // The register's own rows: the new columns hold the figures.
    const { rows } = await pool.query("select pulses_per_burst, burst_pulse_rate_hz from laser_register where id = $1", [burstId]);
    expect(rows[0]).toEqual({ pulses_per_burst: 10, burst_pulse_rate_hz: 1e6 });
  });

  it("an edit changes or removes the bursts, and the audit row names the change", async () => {
    const put = await call("PUT", `/api/lasers/${burstId}`, cookies.officer, { ...burstLaser(), pulsesPerBurst: 5, burstPulseRateHz: 2e6, version: 1 });
    expect(put.status, put.text).toBe(200);
    expect(put.json).toMatchObject({ pulsesPerBurst: 5, burstPulseRateHz: 2e6, version: 2 });
    const cleared = await call("PUT", `/api/lasers/${burstId}`, cookies.officer, { ...burstLaser(), pulsesPerBurst: null, burstPulseRateHz: null, version: 2 });
    expect(cleared.status, cleared.text).toBe(200);
    expect(cleared.json).toMatchObject({ pulsesPerBurst: null, burstPulseRateHz: null, version: 3 });
    const { rows } = await pool.query<{ detail: { changes: Record<string, { from: unknown; to: unknown }> } }>(
      "select detail from audit_event where action = 'laser-updated' and detail->>'laserId' = $1 order by at",
      [burstId],
    );
    expect(rows[0].detail.changes.pulsesPerBurst).toEqual({ from: 10, to: 5 });
    expect(rows[1].detail.changes.burstPulseRateHz).toEqual({ from: 2e6, to: null });
    const back = await call("PUT", `/api/lasers/${burstId}`, cookies.officer, { ...burstLaser(), version: 3 });
    expect(back.status, back.text).toBe(200);
  });

  it("refuses burst figures that cannot be, naming the field, never a 500", async () => {
    expect(await refusal({ ...burstLaser(), burstPulseRateHz: null })).toEqual([
      { path: "burstPulseRateHz", message: "Bursts need both the pulses per burst (pulsesPerBurst) and the pulse rate inside a burst (burstPulseRateHz)" },
    ]);
    expect(await refusal({ ...burstLaser(), pulsesPerBurst: 2.5 })).toEqual([{ path: "pulsesPerBurst", message: "Pulses per burst (pulsesPerBurst) must be a whole number" }]);
    expect(await refusal({ ...burstLaser(), pulsesPerBurst: 1 })).toEqual([{ path: "pulsesPerBurst", message: "Pulses per burst (pulsesPerBurst) must be at least 2" }]);
    expect(await refusal({ ...burstLaser(), burstPulseRateHz: "fast" })).toEqual([{ path: "burstPulseRateHz", message: "Pulse rate inside a burst (burstPulseRateHz) must be a number" }]);
    expect((await refusal({ ...burstLaser(), burstPulseRateHz: -5 }))[0]).toEqual({ path: "burstPulseRateHz", message: "Pulse rate inside a burst (burstPulseRateHz) must be greater than 0 Hz" });
    // Pulses overlapping inside a burst: 10 ns × 2×10⁸ Hz = 2.
    expect(await refusal({ ...burstLaser(), burstPulseRateHz: 2e8 })).toEqual([
      { path: "burstPulseRateHz", message: "Pulse duration × the rate inside a burst must be below 1: the pulses in a burst would overlap" },
    ]);
    // The rate inside a burst at or below the average rate is no burst.
    expect((await refusal({ ...burstLaser(), burstPulseRateHz: 5e3 }))[0]).toMatchObject({ path: "burstPulseRateHz", message: expect.stringMatching(/must be above the average pulse repetition rate/) });
    // Bursts without a train.
    expect(await refusal({ ...burstLaser(), pulseRepetitionRateHz: null })).toEqual([
      { path: "pulseRepetitionRateHz", message: "Bursts need a pulse duration and the average pulse repetition rate (pulses per burst × bursts per second)" },
    ]);
    // An edit is checked the same way.
    expect((await refusal({ ...burstLaser(), burstPulseRateHz: 2e8, version: 4 }, "PUT", `/api/lasers/${burstId}`))[0].path).toBe("burstPulseRateHz");
  });

  it("picked for a bench, the laser keeps its bursts: the document is valid, quiet against the register, and assessed as bursts", async () => {
    const entry = (await call("GET", `/api/lasers?labId=${imagingLabId}&status=in-service`, cookies.researcher)).json!.lasers as RegisterEntry[];
    const picked = entry.find((l) => l.id === burstId)!;
    const doc: BenchDocument = {
      version: 1,
      title: `Burst bench ${marker}`,
      elements: [{ id: "laser-1", kind: "laser", positionMm: 0, ...laserValuesFrom(picked) } as BenchDocument["elements"][number], { id: "block-1", kind: "beam-block", positionMm: 300 }],
    };
    expect(doc.elements[0]).toMatchObject({ registerId: burstId, powerMw: 100, pulseEnergyJ: 1e-5, pulseDurationS: 1e-8, pulseRepetitionRateHz: 1e4, pulsesPerBurst: 10, burstPulseRateHz: 1e6 });
    const researcher: Actor = { userId: "register-test", name: "Register Test", email: "x@northmere.example.edu", roles: ["researcher"], labIds: [imagingLabId], allLabs: false, ipAddress: null };
    const check = await checkBenchAgainstRegister(db, researcher, doc);
    expect(check.warnings).toEqual([]);
    expect(check.computedClass).toBe("3B");
    const analysed = await call("POST", "/api/analyze", cookies.researcher, doc);
    expect(analysed.status, analysed.text).toBe(200);
    const safety = analysed.json!.safety as { laser: { pulsedMpe: { rules: { rule: string }[] } } };
    expect(safety.laser.pulsedMpe.rules.map((r) => r.rule)).toContain("burst");
  });
});
