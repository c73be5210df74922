// Demo data, loaded once by `npm start` (skipped when the demo labs already exist). An invented
// scenario: the Department of Applied Optics at Northmere University; no real people or places.
import { createHash, randomUUID } from "node:crypto";
import { hashPassword } from "better-auth/crypto";
import { eq } from "drizzle-orm";
import type { Database } from "@/db";
import { account, auditEvent, bench, benchRevision, buildObservation, buildRecord, eyewearBand, eyewearItem, lab, labMember, photoReading, reviewDecision, upload, user, type ReviewState, type SafetyStandard } from "@/db/schema";
import { endOfDayInZone } from "@/lib/format/date";
import { hazardSummary } from "@/lib/review/hazard";
import { contentHash } from "@/lib/bench/canonical";
import type { AnyBenchDocument, BenchDocument, BenchDocumentV2 } from "@/lib/bench/schema";
import type { RoleName } from "@/lib/auth/permissions";
import { createStorage, type ObjectStore } from "@/lib/storage";
import { comparePhoto, photoSummary } from "@/lib/build/photo-rules";
import { predictionsFor } from "@/lib/build/rules";
import { readScreenPhoto } from "@/lib/optics";
import { OPTICS_ENGINE_VERSION } from "@/lib/optics/version";
import { decodePhoto } from "@/lib/server/photo-decode";
import { DEMO_PHOTOS, demoPhotoBytes } from "./demo-photos";

export const DEMO_PASSWORD = "northmere-demo-2026";

export const DEMO_LABS = [
  { key: "imaging", name: "Wrenfield Imaging Lab", room: "Harbour Building B214" },
  { key: "spectro", name: "Spectroscopy Teaching Lab", room: "Harbour Building C108" },
] as const;

type LabKey = (typeof DEMO_LABS)[number]["key"];

export const DEMO_USERS: { email: string; name: string; roles: RoleName[]; labs: LabKey[] }[] = [
  { email: "researcher@northmere.example.edu", name: "Dr. Alba Quennell", roles: ["researcher"], labs: ["imaging"] },
  { email: "officer@northmere.example.edu", name: "Rafe Dunmore", roles: ["officer"], labs: [] },
  { email: "technician@northmere.example.edu", name: "Kit Varga-Lind", roles: ["technician"], labs: ["imaging"] },
  { email: "auditor@northmere.example.edu", name: "Maren Ashcombe", roles: ["auditor"], labs: [] },
  { email: "admin@northmere.example.edu", name: "Oren Castellane", roles: ["admin"], labs: [] },
  { email: "student@northmere.example.edu", name: "Jonah Pellworth", roles: ["researcher"], labs: ["spectro"] },
];

const heNeZones: BenchDocument = {
  version: 1,
  title: "HeNe through a 2 mm iris, diverging lens",
  elements: [
    { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 },
    { id: "lens-1", kind: "lens", positionMm: 100, focalLengthMm: -25 },
    { id: "iris-1", kind: "aperture", positionMm: 400, diameterMm: 2 },
    { id: "screen-1", kind: "screen", positionMm: 1400 },
  ],
};

const expander: BenchDocument = {
  version: 1,
  title: "5× expander for the interferometer arm",
  elements: [
    { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 532, powerMw: 20, beamDiameterMm: 1.0, m2: 1.1 },
    { id: "nd-1", kind: "filter", positionMm: 60, opticalDensity: 1 },
    { id: "lens-1", kind: "lens", positionMm: 150, focalLengthMm: 25 },
    { id: "lens-2", kind: "lens", positionMm: 275, focalLengthMm: 125 },
    { id: "iris-1", kind: "aperture", positionMm: 500, diameterMm: 4 },
    { id: "screen-1", kind: "screen", positionMm: 1500 },
    { id: "block-1", kind: "beam-block", positionMm: 1550 },
  ],
};

const violetDiode: BenchDocument = {
  version: 1,
  title: "405 nm diode alignment",
  elements: [
    { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 405, powerMw: 4.5, beamDiameterMm: 1.2, m2: 1.3 },
    { id: "iris-1", kind: "aperture", positionMm: 300, diameterMm: 1 },
    { id: "screen-1", kind: "screen", positionMm: 900 },
  ],
};

const teachingBench: BenchDocument = {
  version: 1,
  title: "Fresnel zones teaching bench",
  elements: [
    { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 635, powerMw: 0.9, beamDiameterMm: 1.5 },
    { id: "lens-1", kind: "lens", positionMm: 80, focalLengthMm: -15 },
    { id: "iris-1", kind: "aperture", positionMm: 350, diameterMm: 1.5 },
    { id: "screen-1", kind: "screen", positionMm: 1100 },
  ],
};

/** Holes of a metric table: the first half a pitch in from the front left corner (hole 1, 1). */
const hole = (column: number, pitchMm = 25) => pitchMm / 2 + (column - 1) * pitchMm;

/**
 * A folded 532 nm bench on a metric table: a mirror turns the beam away from the viewer through a 5× expander, a
 * 50/50 splitter sends half to an iris and a screen and half into a block, so every beam ends on the table.
 */
export const foldedTable: BenchDocumentV2 = {
  version: 2,
  title: "Folded green table with a splitter",
  table: { widthMm: 1200, depthMm: 900, holePitchMm: 25 },
  elements: [
    { id: "green", kind: "laser", xMm: hole(4), yMm: hole(6), angleDeg: 0, wavelengthNm: 532, powerMw: 20, beamDiameterMm: 1, m2: 1.1 },
    { id: "M1", kind: "mirror", xMm: hole(16), yMm: hole(6), angleDeg: 135 },
    { id: "L1", kind: "lens", xMm: hole(16), yMm: hole(11), angleDeg: 90, focalLengthMm: 25 },
    { id: "L2", kind: "lens", xMm: hole(16), yMm: hole(17), angleDeg: 90, focalLengthMm: 125 },
    { id: "BS", kind: "beam-splitter", xMm: hole(16), yMm: hole(24), angleDeg: 315, reflectance: 0.5 },
    { id: "iris", kind: "aperture", xMm: hole(32), yMm: hole(24), angleDeg: 180, diameterMm: 4 },
    { id: "screen", kind: "screen", xMm: hole(46), yMm: hole(24), angleDeg: 180 },
    { id: "block", kind: "beam-block", xMm: hole(16), yMm: hole(34), angleDeg: 270 },
  ],
};

/**
 * Two lasers on one imperial breadboard, sent for review: a HeNe through a tilted window (whose weak ghosts leave the
 * table, below the MPE) onto a screen, and a violet diode whose splitter sends half into a block and lets the other
 * half run off the right edge — the open beam above the MPE the officer should send back.
 */
export const twoLaserTable: BenchDocumentV2 = {
  version: 2,
  title: "Two lasers on the imperial breadboard",
  table: { widthMm: 1219.2, depthMm: 914.4, holePitchMm: 25.4 },
  elements: [
    { id: "hene", kind: "laser", xMm: hole(4, 25.4), yMm: hole(4, 25.4), angleDeg: 0, wavelengthNm: 632.8, powerMw: 2, beamDiameterMm: 0.8 },
    { id: "W1", kind: "window", xMm: hole(16, 25.4), yMm: hole(4, 25.4), angleDeg: 170 },
    { id: "red-screen", kind: "screen", xMm: hole(36, 25.4), yMm: hole(4, 25.4), angleDeg: 180 },
    { id: "violet", kind: "laser", xMm: hole(4, 25.4), yMm: hole(20, 25.4), angleDeg: 0, wavelengthNm: 405, powerMw: 5, beamDiameterMm: 1.2, m2: 1.3 },
    { id: "BS2", kind: "beam-splitter", xMm: hole(28, 25.4), yMm: hole(20, 25.4), angleDeg: 135, reflectance: 0.5 },
    { id: "violet-block", kind: "beam-block", xMm: hole(28, 25.4), yMm: hole(32, 25.4), angleDeg: 270 },
  ],
};

const OFFICER_EMAIL = "officer@northmere.example.edu";
const TECHNICIAN_EMAIL = "technician@northmere.example.edu";
const DAY_MS = 86_400_000;

/** What the officer decided on a seeded revision, as the review workflow would have recorded it. */
const SEEDED_DECISIONS: Partial<Record<ReviewState, { outcome: "approved" | "changes-requested"; meaning: string; conditions?: string; reason?: string }>> = {
  approved: {
    outcome: "approved",
    meaning: "Approved for operation as drawn, with the conditions listed.",
    conditions: "Laser eyewear for 633 nm worn by everyone at the table; door sign lit while the laser is on",
  },
  "changes-requested": {
    outcome: "changes-requested",
    meaning: "Not approved: changes are asked for before this bench may be operated.",
    reason: "Put a beam block behind the screen, so nothing passes the end of the rail.",
  },
};

/** Invented eyewear for the demo labs' shelves (no real products): bands in nm with their OD and, where marked, EN 207 scale number. */
const DEMO_EYEWEAR: { lab: LabKey; name: string; quantity: number; note: string; bands: { fromNm: number; toNm: number; opticalDensity: number; en207ScaleNumber?: number }[] }[] = [
  {
    lab: "imaging",
    name: "Amber goggles, shelf A",
    quantity: 4,
    note: "Hook by the door of B214",
    bands: [
      { fromNm: 190, toNm: 400, opticalDensity: 5, en207ScaleNumber: 5 },
      { fromNm: 400, toNm: 420, opticalDensity: 3 },
      { fromNm: 515, toNm: 545, opticalDensity: 4, en207ScaleNumber: 4 },
    ],
  },
  { lab: "imaging", name: "Red-line alignment glasses", quantity: 2, note: "Drawer under table 2", bands: [{ fromNm: 620, toNm: 650, opticalDensity: 2, en207ScaleNumber: 2 }] },
  { lab: "imaging", name: "Near-infrared visor, cupboard 2", quantity: 1, note: "Keep away from the 532 nm bench: no visible protection", bands: [{ fromNm: 780, toNm: 1100, opticalDensity: 7, en207ScaleNumber: 6 }] },
  { lab: "spectro", name: "Teaching-lab red glasses", quantity: 12, note: "Box on the front bench", bands: [{ fromNm: 625, toNm: 645, opticalDensity: 3 }] },
  { lab: "spectro", name: "Violet diode glasses", quantity: 3, note: "", bands: [{ fromNm: 395, toNm: 415, opticalDensity: 4, en207ScaleNumber: 3 }] },
];

/** The demo labs' chosen standards: one lab per standard, so both show on screens. */
const DEMO_STANDARDS: Record<LabKey, SafetyStandard> = { imaging: "ANSI Z136.1-2014", spectro: "IEC 60825-1:2014" };

const DEMO_BENCHES: { lab: LabKey; author: string; doc: AnyBenchDocument; states: ReviewState[]; conditions?: string }[] = [
  { lab: "imaging", author: "researcher@northmere.example.edu", doc: heNeZones, states: ["approved", "draft"] },
  { lab: "imaging", author: "researcher@northmere.example.edu", doc: expander, states: ["submitted"] },
  { lab: "imaging", author: "researcher@northmere.example.edu", doc: violetDiode, states: ["draft"] },
  { lab: "spectro", author: "student@northmere.example.edu", doc: teachingBench, states: ["changes-requested", "draft"] },
  {
    lab: "imaging",
    author: "researcher@northmere.example.edu",
    doc: foldedTable,
    states: ["approved"],
    conditions: "Laser eyewear for 532 nm worn by everyone at the table; the splitter's block in place before the laser is switched on",
  },
  { lab: "imaging", author: "researcher@northmere.example.edu", doc: twoLaserTable, states: ["submitted"] },
];

/** Loads the demo data unless it is already there. Returns true when it loaded something. */
export async function seedDemo(db: Database, store: ObjectStore = createStorage(process.env as Parameters<typeof createStorage>[0])): Promise<boolean> {
  const written: string[] = [];
  const existing = await db.select({ id: lab.id }).from(lab).where(eq(lab.name, DEMO_LABS[0].name));
  if (existing.length > 0) return false;

  await db.transaction(async (tx) => {
    const labIds = new Map<LabKey, string>();
    for (const l of DEMO_LABS) {
      const [row] = await tx.insert(lab).values({ name: l.name, room: l.room, safetyStandard: DEMO_STANDARDS[l.key] }).returning({ id: lab.id });
      labIds.set(l.key, row.id);
    }
    for (const e of DEMO_EYEWEAR) {
      const [item] = await tx.insert(eyewearItem).values({ labId: labIds.get(e.lab)!, name: e.name, quantity: e.quantity, note: e.note || null }).returning({ id: eyewearItem.id });
      await tx.insert(eyewearBand).values(e.bands.map((b, position) => ({ itemId: item.id, position, fromNm: b.fromNm, toNm: b.toNm, opticalDensity: b.opticalDensity, en207ScaleNumber: b.en207ScaleNumber ?? null })));
    }
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    const userIds = new Map<string, string>();
    for (const u of DEMO_USERS) {
      const id = randomUUID();
      userIds.set(u.email, id);
      await tx.insert(user).values({ id, name: u.name, email: u.email, emailVerified: true, role: u.roles.join(",") });
      await tx.insert(account).values({ id: randomUUID(), accountId: id, providerId: "credential", userId: id, password: passwordHash });
      for (const key of u.labs) await tx.insert(labMember).values({ labId: labIds.get(key)!, userId: id });
    }
    let demoBuildOf: DemoBuildOf | null = null;
    for (const b of DEMO_BENCHES) {
      const authorId = userIds.get(b.author)!;
      const [row] = await tx
        .insert(bench)
        .values({ labId: labIds.get(b.lab)!, title: b.doc.title ?? "Untitled bench", authorId })
        .returning({ id: bench.id });
      // Each revision with the trail and decision the workflow would have left, dated in the past, so every
      // role's home, the desk, the builds list and the bench's trail tell the same story.
      const hash = contentHash(b.doc);
      const officerId = userIds.get(OFFICER_EMAIL)!;
      const start = Date.now() - 30 * DAY_MS;
      let number = 1;
      for (const [i, state] of b.states.entries()) {
        const createdAt = new Date(start + i * 10 * DAY_MS);
        const [revision] = await tx
          .insert(benchRevision)
          .values({ benchId: row.id, number, document: b.doc, contentHash: hash, state, createdBy: authorId, createdAt, updatedAt: createdAt })
          .returning({ id: benchRevision.id });
        const audit = (at: Date, actorId: string, actorRole: string, action: string, detail: Record<string, unknown>) =>
          tx.insert(auditEvent).values({ at, actorId, actorRole, action, benchId: row.id, revisionId: revision.id, contentHash: hash, detail });
        await audit(createdAt, authorId, "researcher", number === 1 ? "bench-created" : "draft-revision-started", { number, seeded: true });
        if (state !== "draft") {
          const sentAt = new Date(createdAt.getTime() + DAY_MS);
          await audit(sentAt, authorId, "researcher", "review-submitted", { from: "draft", to: "submitted", number, seeded: true });
          const decided = SEEDED_DECISIONS[state];
          if (decided) {
            const decidedAt = new Date(sentAt.getTime() + 2 * DAY_MS);
            const validUntil = decided.outcome === "approved" ? endOfDayInZone(new Date(decidedAt.getTime() + 365 * DAY_MS).toISOString().slice(0, 10)) : null;
            const [decision] = await tx
              .insert(reviewDecision)
              .values({
                revisionId: revision.id,
                benchId: row.id,
                outcome: decided.outcome,
                signerId: officerId,
                signerName: "Rafe Dunmore",
                signerRole: "Laser safety officer",
                meaning: decided.meaning,
                conditions: (decided.outcome === "approved" ? b.conditions : undefined) ?? decided.conditions ?? null,
                reason: decided.reason ?? null,
                validUntil,
                contentHash: hash,
                hazardSummary: hazardSummary(b.doc, { standard: DEMO_STANDARDS[b.lab] }),
                stepUpVerified: decided.outcome === "approved",
                decidedAt,
              })
              .returning({ id: reviewDecision.id });
            if (decided.outcome === "approved" && b.doc === heNeZones) demoBuildOf = { benchId: row.id, revisionId: revision.id, contentHash: hash, doc: b.doc, authorId, startAt: new Date(decidedAt.getTime() + 2 * DAY_MS) };
            await audit(decidedAt, officerId, "officer", `review-${decided.outcome}`, {
              from: "submitted",
              to: decided.outcome,
              number,
              decisionId: decision.id,
              meaning: decided.meaning,
              conditions: (decided.outcome === "approved" ? b.conditions : undefined) ?? decided.conditions ?? null,
              reason: decided.reason ?? null,
              validUntil: validUntil?.toISOString() ?? null,
              seeded: true,
            });
          }
        }
        number += 1;
      }
    }
    if (demoBuildOf) await seedDemoBuild(tx, store, demoBuildOf, userIds.get(TECHNICIAN_EMAIL)!, written);
  }).catch(async (error: unknown) => {
    for (const key of written) await store.delete(key).catch(() => undefined); // nothing is kept without its row
    throw error;
  });
  return true;
}

type DemoBuildOf = { benchId: string; revisionId: string; contentHash: string; doc: BenchDocument; authorId: string; startAt: Date };
type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];

/**
 * The demo technician's build of the signed-off HeNe bench, in progress, with the generated screen photos
 * (db/demo-photos.ts) kept as uploads; the photo of the screen as drawn is already read (it matches), the others wait
 * for a visitor to press "Read the pattern". No e-mail is queued: nothing in the demo differs from its prediction yet.
 */
async function seedDemoBuild(tx: Tx, store: ObjectStore, of: DemoBuildOf, technicianId: string, written: string[]): Promise<void> {
  const apertureId = "iris-1";
  const aperture = predictionsFor(of.doc).apertures.find((a) => a.apertureId === apertureId);
  if (!aperture || !aperture.screenId || aperture.observationDistanceMm === null) throw new Error(`the demo bench has no screen behind ${apertureId}`);
  const screenAperture = { ...aperture, screenId: aperture.screenId, observationDistanceMm: aperture.observationDistanceMm };
  const at = (hours: number) => new Date(of.startAt.getTime() + hours * 3_600_000);
  const [build] = await tx
    .insert(buildRecord)
    .values({ revisionId: of.revisionId, benchId: of.benchId, contentHash: of.contentHash, technicianId, createdAt: at(0), updatedAt: at(0) })
    .returning({ id: buildRecord.id });
  const audit = (when: Date, action: string, detail: Record<string, unknown>) =>
    tx.insert(auditEvent).values({ at: when, actorId: technicianId, actorRole: "technician", action, benchId: of.benchId, revisionId: of.revisionId, contentHash: of.contentHash, detail: { ...detail, seeded: true } });
  await audit(at(0), "build-started", { buildId: build.id });
  for (const [i, photo] of DEMO_PHOTOS.entries()) {
    const bytes = demoPhotoBytes(of.doc, apertureId, aperture.screenId, photo);
    const id = randomUUID();
    const key = `uploads/${build.id}/${id}.${photo.extension}`;
    const sha256 = createHash("sha256").update(bytes).digest("hex");
    await store.put(key, bytes, photo.contentType);
    written.push(key);
    await tx.insert(upload).values({ id, buildId: build.id, kind: "screen-photo", fileName: photo.fileName, contentType: photo.contentType, sizeBytes: bytes.length, sha256, storageKey: key, uploadedBy: technicianId, createdAt: at(1 + i) });
    await audit(at(1 + i), "build-upload-stored", { buildId: build.id, uploadId: id, kind: "screen-photo", fileName: photo.fileName, contentType: photo.contentType, sizeBytes: bytes.length, sha256 });
    if (!photo.readInSeed) continue;
    const decoded = await decodePhoto(bytes);
    const { result, reasons, prediction } = comparePhoto(of.doc, screenAperture, readScreenPhoto(decoded, { doc: of.doc, apertureId }), decoded);
    const note = photoSummary(photo.fileName, prediction, result);
    const [observation] = await tx
      .insert(buildObservation)
      .values({
        buildId: build.id,
        apertureId,
        centreSeen: result.centre,
        centrePredicted: aperture.centre,
        predictedSpotDiameterMm: aperture.spotDiameterMm,
        predictedScreenPowerMw: aperture.screenPowerMw,
        predictionEngine: OPTICS_ENGINE_VERSION,
        reasons,
        mismatch: reasons.length > 0,
        note,
        recordedBy: technicianId,
        createdAt: at(1.5 + i),
      })
      .returning({ id: buildObservation.id });
    const [reading] = await tx
      .insert(photoReading)
      .values({ buildId: build.id, uploadId: id, apertureId, observationId: observation.id, result, predictionEngine: OPTICS_ENGINE_VERSION, readBy: technicianId, createdAt: at(1.5 + i) })
      .returning({ id: photoReading.id });
    await audit(at(1.5 + i), "build-photo-read", {
      buildId: build.id,
      photoReadingId: reading.id,
      uploadId: id,
      fileName: photo.fileName,
      apertureId,
      refusal: null,
      zoneCount: result.zoneCount,
      predictedZoneCount: result.predictedZoneCount,
      centreSeen: result.centre,
      centrePredicted: result.centrePredicted,
      screenDistanceMm: result.screenDistanceMm,
      drawnDistanceMm: result.drawnDistanceMm,
      quality: result.quality,
    });
    await audit(at(1.5 + i), "build-observation-recorded", { buildId: build.id, observationId: observation.id, photoReadingId: reading.id, uploadId: id, apertureId, centreSeen: result.centre, centrePredicted: aperture.centre, spotDiameterMm: null, screenPowerMw: null, mismatch: reasons.length > 0, reasons });
  }
}
