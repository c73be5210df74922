// The technician's as-built record over HTTP against the running server, the real PostgreSQL and the mail
// catcher: the list (expired/replaced marked, not startable), starting a build, the checklist with the
// tolerance, observations with the mismatch flag and its e-mail, uploads checked by content, sign-off, audit rows.
import { readFileSync } from "node:fs";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { APP_URL, call, DEMO, DEMO_PASSWORD, signIn, waitForMail } from "../support/http";
import { createDrawnBench, databaseUrl, labIdByName, sampleBench } from "../support/review-fixtures";

const run = Date.now().toString(36);
let pool: pg.Pool;
const cookie = {} as Record<"researcher" | "officer" | "technician" | "auditor" | "student", string>;
type Json = Record<string, unknown>;
type Check = { itemKey: string; group: string; done: boolean; withinTolerance: boolean | null; expectedPositionMm: number | null; elementId: string | null };
type Build = { id: string; state: string; checklist: Check[]; observations: Json[]; uploads: Json[]; predictions: { apertures: Json[] }; may: { signOff: boolean; whyNotSignOff: string | null } };
const errorOf = (res: { json: Json | null }) => (res.json?.error ?? {}) as { message: string; fields: { path: string }[] };

async function approvedRevision(title: string) {
  const labId = await labIdByName(cookie.researcher, "Wrenfield Imaging Lab");
  const b = await createDrawnBench(pool, cookie.researcher, labId, sampleBench(title));
  expect((await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, { contentHash: b.contentHash })).status).toBe(200);
  const decided = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "approve", contentHash: b.contentHash, password: DEMO_PASSWORD });
  expect(decided.status, decided.text).toBe(201);
  return b;
}

async function upload(buildId: string, name: string, type: string, bytes: Buffer, kind = "screen-photo", who = cookie.technician) {
  const form = new FormData();
  form.set("file", new Blob([new Uint8Array(bytes)], { type }), name);
  form.set("kind", kind);
  const res = await fetch(`${APP_URL}/api/builds/${buildId}/uploads`, { method: "POST", headers: { cookie: who, origin: APP_URL }, body: form });
  return { status: res.status, json: (await res.json().catch(() => null)) as Json | null };
}

const PNG = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(64, 1)]);

beforeAll(async () => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 2 });
  for (const key of ["researcher", "officer", "technician", "auditor", "student"] as const) {
    const s = await signIn(DEMO[key]);
    expect(s.status, `${key} signs in`).toBe(200);
    cookie[key] = s.cookie;
  }
});

afterAll(async () => {
  await pool?.end();
});

describe("the list of benches to build", () => {
  it("shows valid sign-offs, and marks expired ones, which cannot be started", async () => {
    const valid = await approvedRevision(`Build list valid ${run}`);
    const expired = await approvedRevision(`Build list expired ${run}`);
    await pool.query("update bench_revision set state = 'expired' where id = $1", [expired.revisionId]);
    const list = await call("GET", "/api/builds", cookie.technician);
    expect(list.status).toBe(200);
    const rows = list.json!.revisions as Json[];
    expect(rows.find((r) => r.revisionId === valid.revisionId)).toMatchObject({ status: "valid" });
    const marked = rows.find((r) => r.revisionId === expired.revisionId)!;
    expect(marked.status).toBe("expired");
    expect(String(marked.statusSentence)).toMatch(/expired/);
    const start = await call("POST", "/api/builds", cookie.technician, { revisionId: expired.revisionId });
    expect(start.status).toBe(409);
    expect(errorOf(start).message).toMatch(/expired/);
    // Another lab's technician-less student sees nothing of it; a researcher may not start builds.
    expect((await call("GET", "/api/builds", cookie.student)).status).toBe(403);
    expect((await call("POST", "/api/builds", cookie.researcher, { revisionId: valid.revisionId })).status).toBe(403);
  });
});

describe("one build from start to sign-off", () => {
  let b: Awaited<ReturnType<typeof approvedRevision>>;
  let build: Build;
  const title = `Build record ${run}`;

  it("a technician starts a build; the checklist comes from the bench", async () => {
    b = await approvedRevision(title);
    const res = await call("POST", "/api/builds", cookie.technician, { revisionId: b.revisionId });
    expect(res.status, res.text).toBe(201);
    build = res.json!.build as Build;
    const keys = build.checklist.map((c) => c.itemKey);
    for (const id of ["laser-1", "lens-1", "iris-1", "screen-1"]) expect(keys).toContain(`element:${id}`);
    expect(keys).toContain("eyewear");
    expect(keys.some((k) => k.startsWith("control:"))).toBe(true);
    expect(build.checklist.find((c) => c.itemKey === "element:iris-1")!.expectedPositionMm).toBe(400);
    // Starting again reopens the same build.
    const again = await call("POST", "/api/builds", cookie.technician, { revisionId: b.revisionId });
    expect(again.status).toBe(200);
    expect((again.json!.build as Build).id).toBe(build.id);
    const { rows } = await pool.query("select 1 from audit_event where action = 'build-started' and revision_id = $1", [b.revisionId]);
    expect(rows.length).toBe(1);
  });

  it("a measured position outside ±2 mm is flagged; inside is accepted; both are audited", async () => {
    const off = await call("PATCH", `/api/builds/${build.id}/checks`, cookie.technician, { itemKey: "element:iris-1", measuredPositionMm: 403.5, done: true });
    expect(off.status, off.text).toBe(200);
    let check = (off.json!.build as Build).checklist.find((c) => c.itemKey === "element:iris-1")!;
    expect(check.withinTolerance).toBe(false);
    expect((off.json!.build as Build).may.whyNotSignOff).toBeTruthy();
    const on = await call("PATCH", `/api/builds/${build.id}/checks`, cookie.technician, { itemKey: "element:iris-1", measuredPositionMm: 401.5 });
    check = (on.json!.build as Build).checklist.find((c) => c.itemKey === "element:iris-1")!;
    expect(check.withinTolerance).toBe(true);
    const { rows } = await pool.query("select detail from audit_event where action = 'build-check-recorded' and revision_id = $1 order by at", [b.revisionId]);
    expect(rows.map((r) => r.detail.withinTolerance)).toEqual([false, true]);
    const unknown = await call("PATCH", `/api/builds/${build.id}/checks`, cookie.technician, { itemKey: "element:nope", done: true });
    expect(unknown.status).toBe(400);
    const noPosition = await call("PATCH", `/api/builds/${build.id}/checks`, cookie.technician, { itemKey: "eyewear", measuredPositionMm: 3 });
    expect(noPosition.status).toBe(400);
  });

  it("a matching observation is not flagged and sends no mail", async () => {
    const predicted = build.predictions.apertures.find((a) => a.apertureId === "iris-1")!;
    const res = await call("POST", `/api/builds/${build.id}/observations`, cookie.technician, {
      apertureId: "iris-1",
      spotDiameterMm: Number(predicted.spotDiameterMm),
      screenPowerMw: Number(predicted.screenPowerMw),
    });
    expect(res.status, res.text).toBe(201);
    expect((res.json!.observation as Json).mismatch).toBe(false);
  });

  it("a mismatching observation is flagged, and the bench's author is e-mailed in the same transaction", async () => {
    const predicted = build.predictions.apertures.find((a) => a.apertureId === "iris-1")!;
    const res = await call("POST", `/api/builds/${build.id}/observations`, cookie.technician, {
      apertureId: "iris-1",
      screenPowerMw: Number(predicted.screenPowerMw) * 3,
      note: "Much brighter than the sheet says.",
    });
    expect(res.status, res.text).toBe(201);
    const o = res.json!.observation as Json;
    expect(o.mismatch).toBe(true);
    expect((o.reasons as string[]).join(" ")).toMatch(/Power at the screen: predicted/);
    const mail = await waitForMail(DEMO.researcher, new RegExp(`Observation differs from the prediction: ${title}`));
    expect(mail.text).toContain(b.contentHash);
    expect(mail.text).toContain("Much brighter than the sheet says.");
    expect(mail.text).toContain(`/reviews/${b.revisionId}`);
    const { rows } = await pool.query("select detail from audit_event where action = 'build-observation-recorded' and revision_id = $1", [b.revisionId]);
    expect(rows.length).toBe(2);
  });

  it("an observation keeps the prediction it was compared with, so a later engine never rewrites its reasons", async () => {
    const { rows } = await pool.query(
      "select id, predicted_screen_power_mw, predicted_spot_diameter_mm, prediction_engine, reasons, mismatch from build_observation where build_id = $1 and mismatch order by created_at desc limit 1",
      [build.id],
    );
    const kept = rows[0];
    expect(kept.prediction_engine).toMatch(/^\d{4}-\d{2}-\d{2}/);
    expect(kept.predicted_screen_power_mw).toBeGreaterThan(0);
    expect(kept.reasons.join(" ")).toMatch(/Power at the screen: predicted/);
    // As if the engine had changed since: the record still shows what it was compared with and said then.
    await pool.query("update build_observation set prediction_engine = 'an older engine' where id = $1", [kept.id]);
    const view = await call("GET", `/api/builds/${build.id}`, cookie.technician);
    const shown = ((view.json!.build as Json).observations as Json[]).find((o) => o.id === kept.id)!;
    expect(shown.predictionEngine).toBe("an older engine");
    expect(shown.predictedScreenPowerMw).toBe(kept.predicted_screen_power_mw);
    expect(shown.reasons).toEqual(kept.reasons);
    expect(shown.mismatch).toBe((shown.reasons as string[]).length > 0);
  });

  it("refuses an observation with nothing in it, or about an aperture the bench does not have", async () => {
    const empty = await call("POST", `/api/builds/${build.id}/observations`, cookie.technician, { note: "nothing" });
    expect(empty.status).toBe(400);
    expect(errorOf(empty).message).toMatch(/at least one/);
    const stray = await call("POST", `/api/builds/${build.id}/observations`, cookie.technician, { apertureId: "iris-9", centreSeen: "dark" });
    expect(stray.status).toBe(400);
  });

  it("keeps a PNG with its sha256 and serves it back; refuses a renamed executable and an oversize file in words", async () => {
    const ok = await upload(build.id, "screen.png", "image/png", PNG);
    expect(ok.status, JSON.stringify(ok.json)).toBe(201);
    const kept = ok.json!.upload as Json;
    expect(kept.contentType).toBe("image/png");
    expect(kept.sha256).toMatch(/^[0-9a-f]{64}$/);
    const served = await fetch(`${APP_URL}${kept.url}`, { headers: { cookie: cookie.technician } });
    expect(served.status).toBe(200);
    expect(served.headers.get("content-type")).toBe("image/png");
    expect(Buffer.compare(Buffer.from(await served.arrayBuffer()), PNG)).toBe(0);
    // An auditor may look; a researcher may not.
    expect((await fetch(`${APP_URL}${kept.url}`, { headers: { cookie: cookie.auditor } })).status).toBe(200);
    expect((await fetch(`${APP_URL}${kept.url}`, { headers: { cookie: cookie.researcher } })).status).toBe(403);

    // A real executable (the start of /bin/true, an ELF file) renamed photo.png and declared as image/png.
    const elf = readFileSync("/bin/true").subarray(0, 8192);
    expect(elf.subarray(0, 4).toString("latin1")).toBe("\x7fELF");
    const renamed = await upload(build.id, "photo.png", "image/png", elf);
    expect(renamed.status).toBe(400);
    expect(errorOf(renamed).message).toBe(
      '"photo.png" is not a PNG, JPEG or PDF file (its content says otherwise, whatever its name). Only PNG and JPEG photos and PDF datasheets can be kept.',
    );
    expect(errorOf(renamed).fields.map((f) => f.path)).toEqual(["file"]);
    const text = await upload(build.id, "fake.png", "image/png", Buffer.from("this is only text pretending to be a PNG"));
    expect(text.status).toBe(400);

    // Just over the limit, with real PNG bytes: refused for its size, in a sentence that names the limit.
    const big = Buffer.concat([PNG, Buffer.alloc(10 * 1024 * 1024 + 10 - PNG.length)]);
    const oversize = await upload(build.id, "huge.png", "image/png", big);
    expect(oversize.status).toBe(400);
    expect(errorOf(oversize).message).toMatch(/^The file is 10\.0 MB; files may be at most 10 MB\. /);
    expect(errorOf(oversize).fields.map((f) => f.path)).toEqual(["file"]);
    // Far over: refused from the declared length, before the body is read.
    const huge = await upload(build.id, "huge.png", "image/png", Buffer.concat([PNG, Buffer.alloc(25 * 1024 * 1024)]));
    expect(huge.status).toBe(400);
    expect(errorOf(huge).message).toMatch(/^The file is 25\.0 MB; files may be at most 10 MB\. Take a smaller photo or export a smaller PDF\.$/);

    const { rows } = await pool.query("select detail from audit_event where action = 'build-upload-stored' and revision_id = $1", [b.revisionId]);
    expect(rows.length).toBe(1);
    expect(rows[0].detail.sha256).toBe(kept.sha256);
  }, 60_000);

  it("refuses sign-off until every item is ticked and every element is within tolerance, then signs off", async () => {
    const early = await call("POST", `/api/builds/${build.id}/sign-off`, cookie.technician, {});
    expect(early.status).toBe(409);
    expect(errorOf(early).message).toMatch(/not ticked yet/);
    let current = build;
    for (const c of build.checklist) {
      const body: Json = { itemKey: c.itemKey, done: true };
      if (c.expectedPositionMm !== null) body.measuredPositionMm = c.expectedPositionMm + 0.5;
      const res = await call("PATCH", `/api/builds/${build.id}/checks`, cookie.technician, body);
      expect(res.status, res.text).toBe(200);
      current = res.json!.build as Build;
    }
    expect(current.may.signOff).toBe(true);
    const done = await call("POST", `/api/builds/${build.id}/sign-off`, cookie.technician, {});
    expect(done.status, done.text).toBe(200);
    expect((done.json!.build as Build).state).toBe("completed");
    const later = await call("PATCH", `/api/builds/${build.id}/checks`, cookie.technician, { itemKey: "eyewear", done: false });
    expect(later.status).toBe(409);
    const auditor = await call("GET", `/api/builds/${build.id}`, cookie.auditor);
    expect(auditor.status).toBe(200);
    expect((auditor.json!.build as Build).observations.length).toBe(2);
  }, 120_000);
});
