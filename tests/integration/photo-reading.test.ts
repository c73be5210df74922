// Reading a screen photo of a build over HTTP, against the running server, the real PostgreSQL and the mail catcher.
// The photos are rendered by the tests' own Lommel-series renderer (tests/unit/photo/render.ts), independent of the
// profile engine the reader fits with. A photo of the screen as drawn matches; a photo of a screen standing 150 mm
// further records a mismatch observation, audit rows and the author's e-mail; a blank photo is kept refused with its
// sentence; files that are not photos, too large or damaged are refused with a sentence naming the field, never a 500.
import pg from "pg";
import { PNG } from "pngjs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { APP_URL, call, DEMO, DEMO_PASSWORD, signIn, waitForMail } from "../support/http";
import { createDrawnBench, databaseUrl, labIdByName } from "../support/review-fixtures";
import { benchDocument, defaultPhoto, renderPhoto, truePattern, type SyntheticBench } from "../unit/photo/render";

const run = Date.now().toString(36);
const title = `Photo bench ${run}`;
let pool: pg.Pool;
const cookie = {} as Record<"researcher" | "officer" | "technician" | "auditor", string>;
type Json = Record<string, unknown>;
type Reading = { id: string; refusal: string | null; mismatch: boolean | null; reasons: string[]; observationId: string | null; result: Json | null };
const errorOf = (res: { json: Json | null }) => (res.json?.error ?? {}) as { message: string; fields: { path: string; message: string }[] };

// A collimated HeNe on a 2 mm iris, the screen drawn 500 mm behind it: N = R²/(λb) ≈ 3.16 (Born & Wolf §8.2).
const DRAWN_MM = 500;
const bench = (screenDistanceMm: number): SyntheticBench => ({ wavelengthNm: 632.8, beamDiameterMm: 3, lenses: [], aperturePositionMm: 300, apertureDiameterMm: 2, screenDistanceMm });
let buildId = "";
let revisionId = "";

function png(image: { widthPx: number; heightPx: number; data: Uint8Array | Uint8ClampedArray }): Buffer {
  const out = new PNG({ width: image.widthPx, height: image.heightPx });
  out.data = Buffer.from(image.data.buffer, image.data.byteOffset, image.data.length);
  return PNG.sync.write(out);
}

/** A photo of the screen standing `screenDistanceMm` behind the iris, with blur, noise, room light and a shifted centre. */
function screenPhoto(screenDistanceMm: number, centrePx: { x: number; y: number }, seed: number): Buffer {
  const b = bench(screenDistanceMm);
  const shadowPx = 170;
  return png(renderPhoto(b, defaultPhoto({ widthPx: 720, heightPx: 540, centrePx, mmPerPixel: truePattern(b).shadowRadiusMm / shadowPx, blurPx: 1.5, noiseLevels: 2.5, seed })));
}

async function upload(name: string, type: string, bytes: Buffer, kind = "screen-photo") {
  const form = new FormData();
  form.set("file", new Blob([new Uint8Array(bytes)], { type }), name);
  form.set("kind", kind);
  const res = await fetch(`${APP_URL}/api/builds/${buildId}/uploads`, { method: "POST", headers: { cookie: cookie.technician, origin: APP_URL }, body: form });
  const json = (await res.json().catch(() => null)) as Json | null;
  return { status: res.status, json, id: ((json?.upload as Json | undefined)?.id as string | undefined) ?? "" };
}

const read = (body: unknown, who = cookie.technician) => call("POST", `/api/builds/${buildId}/photo-reading`, who, body);

beforeAll(async () => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 2 });
  for (const key of ["researcher", "officer", "technician", "auditor"] as const) {
    const s = await signIn(DEMO[key]);
    expect(s.status, `${key} signs in`).toBe(200);
    cookie[key] = s.cookie;
  }
  const labId = await labIdByName(cookie.researcher, "Wrenfield Imaging Lab");
  const b = await createDrawnBench(pool, cookie.researcher, labId, { ...benchDocument(bench(DRAWN_MM), DRAWN_MM), title });
  expect((await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, { contentHash: b.contentHash })).status).toBe(200);
  const decided = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "approve", contentHash: b.contentHash, password: DEMO_PASSWORD });
  expect(decided.status, decided.text).toBe(201);
  revisionId = b.revisionId;
  const started = await call("POST", "/api/builds", cookie.technician, { revisionId });
  expect(started.status, started.text).toBe(201);
  buildId = (started.json!.build as Json).id as string;
});

afterAll(async () => {
  await pool?.end();
});

describe("reading a screen photo against the prediction", () => {
  it("a photo of the screen as drawn matches: zone count, distance and centre fitted, an observation recorded", async () => {
    const up = await upload("as-drawn.png", "image/png", screenPhoto(DRAWN_MM, { x: 401.3, y: 252.6 }, 3));
    expect(up.status, JSON.stringify(up.json)).toBe(201);
    const res = await read({ uploadId: up.id, apertureId: "iris" });
    expect(res.status, res.text).toBe(201);
    const reading = res.json!.reading as Reading;
    expect(reading.refusal).toBeNull();
    const r = reading.result as { zoneCount: number; predictedZoneCount: number; screenDistanceMm: number; drawnDistanceMm: number; centrePx: { x: number; y: number }; ringRadiiMm: number[]; quality: number; profile: { radiusMm: number[]; measured: number[]; predicted: number[] } };
    const n = truePattern(bench(DRAWN_MM)).fresnelNumber;
    // The reader's stated accuracy (lib/optics/photo.ts): |N − N_true| ≤ 0.1 + 1 % of N; distance within 3 %.
    expect(Math.abs(r.zoneCount - n)).toBeLessThanOrEqual(0.1 + 0.01 * n);
    expect(Math.abs(r.predictedZoneCount - n)).toBeLessThan(0.02);
    expect(Math.abs(r.screenDistanceMm - DRAWN_MM)).toBeLessThanOrEqual(0.03 * DRAWN_MM);
    expect(r.drawnDistanceMm).toBe(DRAWN_MM);
    expect(Math.hypot(r.centrePx.x - 401.3, r.centrePx.y - 252.6)).toBeLessThan(2);
    expect(r.ringRadiiMm.length).toBeGreaterThan(0);
    expect(r.quality).toBeGreaterThan(0.5);
    expect(r.profile.radiusMm.length).toBe(r.profile.measured.length);
    expect(r.profile.predicted.length).toBe(r.profile.measured.length);
    expect(reading.mismatch).toBe(false);
    expect(reading.reasons).toEqual([]);
    const build = res.json!.build as { observations: Json[]; photoReadings: Reading[] };
    const observation = build.observations.find((o) => o.id === reading.observationId)!;
    expect(observation).toMatchObject({ apertureId: "iris", mismatch: false });
    expect(observation.note).toMatch(/^Read from the screen photo "as-drawn\.png": /);
    expect(build.photoReadings.map((p) => p.id)).toContain(reading.id);

    // Read again: the same reading, not a second one.
    const again = await read({ uploadId: up.id, apertureId: "iris" });
    expect(again.status).toBe(200);
    expect((again.json!.reading as Reading).id).toBe(reading.id);
  });

  it("a photo of a screen standing 150 mm further is a mismatch: flagged, audited and e-mailed to the author", async () => {
    const up = await upload("moved.png", "image/png", screenPhoto(DRAWN_MM + 150, { x: 288.8, y: 301.1 }, 5));
    expect(up.status).toBe(201);
    const res = await read({ uploadId: up.id, apertureId: "iris" });
    expect(res.status, res.text).toBe(201);
    const reading = res.json!.reading as Reading;
    const r = reading.result as { screenDistanceMm: number; zoneCount: number };
    expect(Math.abs(r.screenDistanceMm - (DRAWN_MM + 150))).toBeLessThanOrEqual(0.03 * (DRAWN_MM + 150));
    expect(reading.mismatch).toBe(true);
    expect(reading.reasons.join(" ")).toMatch(/^Screen distance: drawn 500 mm behind iris, the photo's pattern fits 6\d\d mm \(1\d\d mm further; allowed ±\d+ mm\)/);
    const mail = await waitForMail(DEMO.researcher, new RegExp(`Observation differs from the prediction: ${title}`));
    expect(mail.text).toContain("Screen distance: drawn 500 mm behind iris");
    expect(mail.text).toContain('Read from the screen photo "moved.png"');
    const { rows } = await pool.query("select action, detail from audit_event where revision_id = $1 and action in ('build-photo-read', 'build-observation-recorded') order by at", [revisionId]);
    const forThis = rows.filter((row) => row.detail.uploadId === up.id);
    expect(forThis.map((row) => row.action).sort()).toEqual(["build-observation-recorded", "build-photo-read"]);
    expect(forThis.find((row) => row.action === "build-observation-recorded")!.detail).toMatchObject({ mismatch: true, photoReadingId: reading.id });

    // The auditor's trail shows the reading and the mismatch.
    const benchId = (await pool.query("select bench_id from bench_revision where id = $1", [revisionId])).rows[0].bench_id as string;
    const trail = await call("GET", `/api/desk/benches/${benchId}/trail`, cookie.auditor);
    expect(trail.status, trail.text).toBe(200);
    expect(trail.text).toContain("build-photo-read");

    // The sign-off desk flags the signed revision: one observation differs, read from a screen photo.
    const desk = await call("GET", `/api/desk/approvals?q=${encodeURIComponent(title)}&builds=mismatch`, cookie.auditor);
    expect(desk.status, desk.text).toBe(200);
    const deskRows = (desk.json as { rows: { revisionId: string; builds: number; mismatches: number; photoMismatches: number }[] }).rows;
    expect(deskRows.map((row) => row.revisionId)).toEqual([revisionId]);
    expect(deskRows[0]).toMatchObject({ builds: 1, mismatches: 1, photoMismatches: 1 });
  });

  it("a blank photo is kept refused, with the sentence saying why, and records no observation", async () => {
    const blank = png({ widthPx: 200, heightPx: 150, data: new Uint8Array(200 * 150 * 4).fill(90) });
    const up = await upload("cap-on.png", "image/png", blank);
    const res = await read({ uploadId: up.id, apertureId: "iris" });
    expect(res.status, res.text).toBe(201);
    const reading = res.json!.reading as Reading;
    expect(reading.refusal).toMatch(/almost uniform/);
    expect(reading.result).toBeNull();
    expect(reading.observationId).toBeNull();
    expect(reading.mismatch).toBeNull();
  });
});

describe("a table's build: the photo is read against the path to the screen it shows", () => {
  // A HeNe on a 3 mm iris 300 mm from the laser; a 50/50 splitter 200 mm further sends half up to screen-A (600 mm
  // from the iris along the beam) and half on to screen-B (700 mm). Unfolded, each is the straight bench the renderer draws.
  const tableBench = (screenDistanceMm: number): SyntheticBench => ({ wavelengthNm: 632.8, beamDiameterMm: 4, lenses: [], aperturePositionMm: 300, apertureDiameterMm: 3, screenDistanceMm });
  const tableDoc = {
    version: 2,
    title: `Photo table ${run}`,
    table: { widthMm: 1200, depthMm: 900, holePitchMm: 25 },
    elements: [
      { id: "hene", kind: "laser", xMm: 100, yMm: 100, angleDeg: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 4 },
      { id: "iris", kind: "aperture", xMm: 400, yMm: 100, angleDeg: 180, diameterMm: 3 },
      { id: "BS", kind: "beam-splitter", xMm: 600, yMm: 100, angleDeg: 135, reflectance: 0.5 },
      { id: "screen-A", kind: "screen", xMm: 600, yMm: 500, angleDeg: 270 },
      { id: "screen-B", kind: "screen", xMm: 1100, yMm: 100, angleDeg: 180 },
    ],
  };
  let tableBuildId = "";
  const tablePhoto = (screenDistanceMm: number, seed: number) => {
    const b = tableBench(screenDistanceMm);
    return png(renderPhoto(b, defaultPhoto({ widthPx: 720, heightPx: 540, centrePx: { x: 350.4, y: 280.2 }, mmPerPixel: truePattern(b).shadowRadiusMm / 160, blurPx: 1.2, noiseLevels: 2, seed })));
  };
  const uploadTo = async (name: string, bytes: Buffer) => {
    const saved = buildId;
    buildId = tableBuildId;
    try {
      return await upload(name, "image/png", bytes);
    } finally {
      buildId = saved;
    }
  };
  const readTable = (body: unknown) => call("POST", `/api/builds/${tableBuildId}/photo-reading`, cookie.technician, body);

  beforeAll(async () => {
    const labId = await labIdByName(cookie.researcher, "Wrenfield Imaging Lab");
    const b = await createDrawnBench(pool, cookie.researcher, labId, tableDoc as unknown as Parameters<typeof createDrawnBench>[3]);
    expect((await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, { contentHash: b.contentHash })).status).toBe(200);
    const decided = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "approve", contentHash: b.contentHash, password: DEMO_PASSWORD });
    expect(decided.status, decided.text).toBe(201);
    const started = await call("POST", "/api/builds", cookie.technician, { revisionId: b.revisionId });
    expect(started.status, started.text).toBe(201);
    tableBuildId = (started.json!.build as Json).id as string;
    // The workspace is offered both screens behind the iris.
    const { apertures } = (started.json!.build as Json).predictions as { apertures: { apertureId: string; screenIds?: string[] }[] };
    expect(apertures.find((a) => a.apertureId === "iris")?.screenIds).toEqual(["screen-A", "screen-B"]);
  });

  it("asks which screen the photo shows when the light reaches two, naming both, and refuses a screen it does not reach", async () => {
    const up = await uploadTo("which.png", tablePhoto(600, 11));
    expect(up.status).toBe(201);
    const res = await readTable({ uploadId: up.id, apertureId: "iris" });
    expect(res.status, res.text).toBe(400);
    expect(errorOf(res).message).toBe("The light through iris reaches 2 screens (screen-A, screen-B); say which one the photo shows.");
    expect(errorOf(res).fields[0].path).toBe("screenId");
    const wrong = await readTable({ uploadId: up.id, apertureId: "iris", screenId: "screen-Z" });
    expect(wrong.status).toBe(400);
    expect(errorOf(wrong).message).toMatch(/^The light through iris reaches screen-A and screen-B, not "screen-Z"/);
    expect(errorOf(wrong).fields[0].path).toBe("screenId");
  });

  it("reads a photo of screen-A against that path's prediction: a match, recorded under the table's own names", async () => {
    const up = await uploadTo("screen-a.png", tablePhoto(600, 12));
    const res = await readTable({ uploadId: up.id, apertureId: "iris", screenId: "screen-A" });
    expect(res.status, res.text).toBe(201);
    const reading = res.json!.reading as Reading;
    expect(reading.refusal).toBeNull();
    const r = reading.result as { zoneCount: number; screenDistanceMm: number; drawnDistanceMm: number; screenId: string; pathId: string };
    const n = truePattern(tableBench(600)).fresnelNumber;
    expect(Math.abs(r.zoneCount - n)).toBeLessThanOrEqual(0.1 + 0.01 * n);
    expect(r.drawnDistanceMm).toBe(600);
    expect(Math.abs(r.screenDistanceMm - 600)).toBeLessThanOrEqual(0.03 * 600);
    expect(r).toMatchObject({ screenId: "screen-A", pathId: "p1" });
    expect(reading.mismatch).toBe(false);
    const build = res.json!.build as { observations: Json[] };
    const observation = build.observations.find((o) => o.id === reading.observationId)!;
    expect(observation).toMatchObject({ apertureId: "iris", mismatch: false });
    expect(String(observation.note)).toMatch(/behind iris \(drawn 600 mm\)/);
    expect(String(observation.note)).not.toContain("⟨");
  });

  it("a photo of screen-B read as screen-A is a mismatch in the table's words: 700 mm against 600 drawn", async () => {
    const up = await uploadTo("screen-b.png", tablePhoto(700, 13));
    const res = await readTable({ uploadId: up.id, apertureId: "iris", screenId: "screen-A" });
    expect(res.status, res.text).toBe(201);
    const reading = res.json!.reading as Reading;
    expect(reading.mismatch).toBe(true);
    // 5.1 zones against 5.9: the centre turns from dark to bright as well.
    expect(reading.reasons).toContain("Centre: predicted dark, the photo shows bright.");
    expect(reading.reasons.join(" ")).toMatch(/Screen distance: drawn 600 mm behind iris, the photo's pattern fits (6[89]\d|7[01]\d) mm \([\d.]+ mm further; allowed ±\d+ mm\)/);
    const again = await uploadTo("screen-b-again.png", tablePhoto(700, 14));
    const asB = await readTable({ uploadId: again.id, apertureId: "iris", screenId: "screen-B" });
    expect(asB.status, asB.text).toBe(201);
    expect((asB.json!.reading as Reading).mismatch).toBe(false);
    expect(((asB.json!.reading as Reading).result as { drawnDistanceMm: number }).drawnDistanceMm).toBe(700);
  });
});

describe("bad uploads and requests are refused with a sentence, never a 500", () => {
  it("a text file named .png is not kept at all", async () => {
    const up = await upload("fake.png", "image/png", Buffer.from("only text, not a picture"));
    expect(up.status).toBe(400);
    expect(errorOf(up).message).toMatch(/is not a PNG, JPEG or PDF file/);
  });

  it("a file over 10 MB is refused at the upload", async () => {
    const big = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(10 * 1024 * 1024 + 10, 7)]);
    const up = await upload("huge.png", "image/png", big);
    expect([400, 413]).toContain(up.status);
    expect(errorOf(up).message).toMatch(/files may be at most 10 MB/);
  });

  it("a PDF kept as a screen photo, or a datasheet, cannot be read as a photo", async () => {
    const pdf = Buffer.from("%PDF-1.4\n% not really a photo\n");
    const asPhoto = await upload("screen.pdf", "application/pdf", pdf);
    expect(asPhoto.status).toBe(201);
    const res = await read({ uploadId: asPhoto.id, apertureId: "iris" });
    expect(res.status).toBe(400);
    expect(errorOf(res).message).toMatch(/"screen\.pdf" cannot be read: The file is not a PNG or JPEG picture/);
    expect(errorOf(res).fields[0].path).toBe("uploadId");
    const sheet = await upload("laser.pdf", "application/pdf", pdf, "datasheet");
    const res2 = await read({ uploadId: sheet.id, apertureId: "iris" });
    expect(res2.status).toBe(400);
    expect(errorOf(res2).message).toMatch(/uploaded as a datasheet, not a photo of the screen/);
  });

  it("a PNG that claims 9000 × 9000 pixels is refused before decoding; a damaged one says it is damaged", async () => {
    const header = png({ widthPx: 40, heightPx: 40, data: new Uint8Array(40 * 40 * 4).fill(200) });
    const huge = Buffer.from(header);
    huge.writeUInt32BE(9000, 16);
    huge.writeUInt32BE(9000, 20);
    const up = await upload("claims-huge.png", "image/png", huge);
    const res = await read({ uploadId: up.id, apertureId: "iris" });
    expect(res.status).toBe(400);
    expect(errorOf(res).message).toMatch(/9000 × 9000 pixels \(81\.0 megapixels\); at most 25 megapixels/);
    const damaged = Buffer.concat([header.subarray(0, 33), Buffer.alloc(200, 0x55)]);
    const up2 = await upload("damaged.png", "image/png", damaged);
    const res2 = await read({ uploadId: up2.id, apertureId: "iris" });
    expect(res2.status).toBe(400);
    expect(errorOf(res2).message).toMatch(/damaged/);
  });

  it("the request names its fields: no upload, an unknown aperture, another build's file, a non-technician", async () => {
    const empty = await read({});
    expect(empty.status).toBe(400);
    expect(errorOf(empty).fields.map((f) => f.path)).toEqual(expect.arrayContaining(["uploadId", "apertureId"]));
    const up = await upload("for-fields.png", "image/png", screenPhoto(DRAWN_MM, { x: 360, y: 270 }, 9));
    const noAperture = await read({ uploadId: up.id, apertureId: "iris-9" });
    expect(noAperture.status).toBe(400);
    expect(errorOf(noAperture).fields[0].path).toBe("apertureId");
    const missing = await read({ uploadId: "00000000-0000-4000-8000-000000000000", apertureId: "iris" });
    expect(missing.status).toBe(404);
    expect((await read({ uploadId: up.id, apertureId: "iris" }, cookie.researcher)).status).toBe(403);
    expect((await read({ uploadId: up.id, apertureId: "iris" }, cookie.auditor)).status).toBe(403);
  });
});
