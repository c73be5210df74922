// Build sheets: the PDF of a signed-off revision, made as a job (queued → rendering → ready | failed) by
// printing the app's own print route in the shared chromium (lib/pdf), kept by the storage module and
// reused while the revision's content hash is unchanged. Also the sheet's content (parts, build order, predictions).
import "server-only";
import { and, eq, lt, notInArray, or } from "drizzle-orm";
import QRCode from "qrcode";
import { z } from "zod";
import type { Database } from "@/db";
import { getDb } from "@/db";
import { buildSheet, laserRegister, type SafetyStandard } from "@/db/schema";
import { rolesAllow } from "@/lib/auth/permissions";
import type { BenchDocument, BenchDocumentV2, LaserElement } from "@/lib/bench/schema";
import { env } from "@/lib/env";
import { AppError, notFound } from "@/lib/errors";
import { screenProfile } from "@/lib/optics";
import { renderPdf, PdfRenderError, PdfTimeoutError, type Paper } from "@/lib/pdf";
import { storage } from "@/lib/storage";
import { recordAudit } from "./audit";
import { authorize, type Actor } from "./authorize";
import { loadSignedRevision, type SignedRevision } from "./builds";
import { labStandard } from "./lab-standard";
import { buildSteps, PROFILE_POINTS, ringPngFor, type RegisterEntry, type SheetAperture, type SheetContent, type TableSheetContent } from "@/lib/build/sheet";
import { checklistFor, elementSettings, POSITION_TOLERANCE_MM, predictionsFor, signOffSentence, signOffStatus, type SignOffStatus } from "@/lib/build/rules";
import { kindTitle } from "@/lib/bench/kinds";
import { assessRevision, assessTableRevision } from "@/lib/review/hazard";
import { beamEnds, buildOrderV2, pathRows } from "@/lib/review/table-paths";
import { notFoundAs } from "./scope";
import type { SheetRequestInput, SheetView } from "@/lib/api/contracts/sheets";

export const SHEET_TIMEOUT_MS = 90_000;
/** Sheets rendered at once in this process; the browser pool bounds pages as well. */
const PARALLEL_JOBS = 1;


function sheetView(row: typeof buildSheet.$inferSelect): SheetView {
  return {
    id: row.id,
    revisionId: row.revisionId,
    contentHash: row.contentHash,
    paper: row.paper,
    state: row.state,
    progressPercent: row.progressPercent,
    error: row.error,
    sizeBytes: row.sizeBytes,
    updatedAt: row.updatedAt.toISOString(),
    downloadUrl: row.state === "ready" ? `/api/sheets/${row.id}/download` : null,
  };
}


export function verifyUrl(hash: string): string {
  return `${env().APP_URL.replace(/\/$/, "")}/verify?hash=${hash}`;
}

function printUrl(revisionId: string, paper: Paper): string {
  return `${env().APP_URL.replace(/\/$/, "")}/print/sheets/${revisionId}?paper=${paper}`;
}

// ── The job queue (one per server process; kept on globalThis across hot reloads) ─────────────
type Job = { sheetId: string; revisionId: string; paper: Paper; cookie: string; headerText: string; storageKey: string };
// Which server renders a sheet is decided in the database (requestSheet); this queue only paces the
// jobs this process took.
type Queue = { pending: Job[]; active: number };
const globalForSheets = globalThis as unknown as { benchwardenSheetQueue?: Queue };
const queue: Queue = (globalForSheets.benchwardenSheetQueue ??= { pending: [], active: 0 });

function enqueue(job: Job): void {
  queue.pending.push(job);
  pump();
}

function pump(): void {
  while (queue.active < PARALLEL_JOBS && queue.pending.length) {
    const job = queue.pending.shift()!;
    queue.active += 1;
    void run(job).finally(() => {
      queue.active -= 1;
      pump();
    });
  }
}

function failureSentence(error: unknown): string {
  if (error instanceof PdfTimeoutError) return `The build sheet could not be made: the page took longer than ${Math.round(error.deadlineMs / 1000)} seconds to print. Try again in a minute; if it keeps failing, tell your administrator.`;
  if (error instanceof PdfRenderError) return "The build sheet could not be made: the print page could not be opened with your session. Sign in again and ask for the sheet again.";
  if (error instanceof Error && /Failed to launch|ENOENT|spawn/.test(error.message)) return "The build sheet could not be made: the PDF printer (chromium) could not be started on the server. Tell your administrator.";
  return "The build sheet could not be made because of a problem on the server. Try again; if it keeps failing, tell your administrator.";
}

async function run(job: Job): Promise<void> {
  const db = getDb();
  const progress = async (percent: number) => {
    // Only while rendering: a late progress report never overwrites the final state.
    await db
      .update(buildSheet)
      .set({ progressPercent: percent, updatedAt: new Date() })
      .where(and(eq(buildSheet.id, job.sheetId), eq(buildSheet.state, "rendering")))
      .catch(() => undefined);
  };
  try {
    await db.update(buildSheet).set({ state: "rendering", progressPercent: 10, error: null, updatedAt: new Date() }).where(eq(buildSheet.id, job.sheetId));
    const pdf = await renderPdf(printUrl(job.revisionId, job.paper), {
      cookie: job.cookie,
      paper: job.paper,
      timeoutMs: SHEET_TIMEOUT_MS,
      headerText: job.headerText,
      onProgress: (percent) => void progress(percent),
    });
    await progress(95);
    await storage().put(job.storageKey, pdf, "application/pdf");
    await db
      .update(buildSheet)
      .set({ state: "ready", progressPercent: 100, storageKey: job.storageKey, sizeBytes: pdf.length, error: null, updatedAt: new Date() })
      .where(eq(buildSheet.id, job.sheetId));
  } catch (error) {
    console.error("[benchwarden] build sheet failed", job.sheetId, error);
    await db
      .update(buildSheet)
      .set({ state: "failed", error: failureSentence(error), updatedAt: new Date() })
      .where(eq(buildSheet.id, job.sheetId))
      .catch(() => undefined);
  }
}

/** The stored PDF of a revision on one paper, under the lab's standard (a sheet made under the other standard is not reused). */
function storageKeyFor(r: SignedRevision, paper: Paper, standard: SafetyStandard): string {
  return `sheets/${r.id}/${r.contentHash}-${paper}-${standard.startsWith("IEC") ? "iec" : "ansi"}.pdf`;
}

/** Whether this actor may have a sheet of the revision now: only while its sign-off holds (auditors may export the record later too). */
function assertSheetAllowed(actor: Actor, r: SignedRevision, status: SignOffStatus): void {
  if (status === "valid") return;
  if (status !== "not-signed-off" && rolesAllow(actor.roles, { audit: ["read"] })) return;
  throw new AppError("conflict", `No build sheet: ${signOffSentence(r, status)}`);
}

/** Asks for the sheet of a revision on the given paper: the ready one when its content hash still matches, else a new job. */
export async function requestSheet(db: Database, actor: Actor, revisionId: string, input: SheetRequestInput, cookie: string): Promise<{ sheet: SheetView; reused: boolean }> {
  authorize(actor, { bench: ["read"] });
  const r = await loadSignedRevision(db, actor, revisionId);
  assertSheetAllowed(actor, r, signOffStatus(r));
  const paper = input.paper;
  const headerText = `${r.benchTitle} — revision ${r.number} — ${paper}`;
  const storageKey = storageKeyFor(r, paper, await labStandard(db, r.labId));
  const [existing] = await db.select().from(buildSheet).where(and(eq(buildSheet.revisionId, r.id), eq(buildSheet.paper, paper)));
  let row = existing;
  let reused = false;
  if (row && row.state === "ready" && row.contentHash === r.contentHash && row.storageKey === storageKey && (await storage().exists(row.storageKey))) {
    reused = true;
  } else if (row) {
    // Take the job over only if no server has it on its way: the row is not queued or rendering, or
    // it has not moved for longer than a render may take (its server died). One UPDATE decides, so
    // two servers asked at once never render the same sheet twice.
    const staleBefore = new Date(Date.now() - SHEET_TIMEOUT_MS - 30_000);
    const [taken] = await db
      .update(buildSheet)
      .set({ state: "queued", progressPercent: 0, error: null, storageKey: null, sizeBytes: null, contentHash: r.contentHash, requestedBy: actor.userId, updatedAt: new Date() })
      .where(and(eq(buildSheet.id, row.id), or(notInArray(buildSheet.state, ["queued", "rendering"]), lt(buildSheet.updatedAt, staleBefore))))
      .returning();
    if (taken) {
      row = taken;
      enqueue({ sheetId: row.id, revisionId: r.id, paper, cookie, headerText, storageKey });
    }
  } else {
    const [inserted] = await db
      .insert(buildSheet)
      .values({ revisionId: r.id, contentHash: r.contentHash, paper, requestedBy: actor.userId })
      .onConflictDoNothing({ target: [buildSheet.revisionId, buildSheet.paper] })
      .returning();
    if (inserted) {
      row = inserted;
      enqueue({ sheetId: row.id, revisionId: r.id, paper, cookie, headerText, storageKey });
    } else {
      // someone asked at the same moment: theirs is the job
      [row] = await db.select().from(buildSheet).where(and(eq(buildSheet.revisionId, r.id), eq(buildSheet.paper, paper)));
    }
  }
  await recordAudit(db, actor, {
    action: "build-sheet-requested",
    benchId: r.benchId,
    revisionId: r.id,
    contentHash: r.contentHash,
    detail: { sheetId: row.id, paper, reused },
  });
  return { sheet: sheetView(row), reused };
}

/** The sheet job of a revision on the given paper, or null when none was asked for. */
export async function getSheetStatus(db: Database, actor: Actor, revisionId: string, paper: Paper): Promise<SheetView | null> {
  authorize(actor, { bench: ["read"] });
  const r = await loadSignedRevision(db, actor, revisionId);
  const [row] = await db.select().from(buildSheet).where(and(eq(buildSheet.revisionId, r.id), eq(buildSheet.paper, paper)));
  return row ? sheetView(row) : null;
}

function slug(text: string): string {
  return text.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 40) || "bench";
}

/** The PDF bytes of a ready sheet; the export is audited. */
export async function downloadSheet(db: Database, actor: Actor, sheetId: string): Promise<{ bytes: Buffer; fileName: string }> {
  authorize(actor, { bench: ["read"] });
  if (!z.uuid().safeParse(sheetId).success) throw notFound("The build sheet");
  const [row] = await db.select().from(buildSheet).where(eq(buildSheet.id, sheetId));
  if (!row) throw notFound("The build sheet");
  const r = await notFoundAs("The build sheet", loadSignedRevision(db, actor, row.revisionId));
  assertSheetAllowed(actor, r, signOffStatus(r));
  if (row.state !== "ready" || !row.storageKey) {
    throw new AppError("conflict", row.state === "failed" ? (row.error ?? "The build sheet could not be made; ask for it again.") : `The build sheet is not ready yet (${row.progressPercent} %).`);
  }
  if (row.contentHash !== r.contentHash) throw new AppError("conflict", "This sheet was made for a different version of the drawing; ask for the sheet again.");
  if (row.storageKey !== storageKeyFor(r, row.paper, await labStandard(db, r.labId))) {
    throw new AppError("conflict", "This sheet was made under the other safety standard, before the lab changed its choice; ask for the sheet again.");
  }
  const bytes = await storage().get(row.storageKey);
  if (!bytes) throw new AppError("conflict", "The stored PDF is missing; ask for the build sheet again and it will be made anew.");
  await recordAudit(db, actor, {
    action: "build-sheet-exported",
    benchId: r.benchId,
    revisionId: r.id,
    contentHash: r.contentHash,
    detail: { sheetId: row.id, paper: row.paper, sizeBytes: bytes.length },
  });
  return { bytes, fileName: `build-sheet-${slug(r.benchTitle)}-rev${r.number}-${r.contentHash.slice(0, 8)}-${row.paper}.pdf` };
}

// ── The sheet's content, for the print route (its pure parts: lib/build/sheet.ts) ──────────────
async function registerEntry(db: Database, registerId: string): Promise<RegisterEntry | null> {
  if (!z.uuid().safeParse(registerId).success) return null;
  const [row] = await db.select().from(laserRegister).where(eq(laserRegister.id, registerId));
  if (!row) return null;
  return {
    id: row.id,
    model: row.model,
    serialNumber: row.serialNumber,
    labelClass: row.labelClass,
    wavelengthsNm: row.wavelengthsNm,
    maxPowerMw: row.maxPowerMw,
    beamDiameterMm: row.beamDiameterMm,
    divergenceMrad: row.divergenceMrad,
    location: row.location,
    status: row.status,
  };
}

// What the sheet shows that follows from the drawing alone (the assessment, parts, build order, the predictions
// with their ring images, the QR code of the verify link) is computed once per content hash and kept in this
// process: the hash names the document, so a later print of the same revision (or of a copy with the same
// content) reuses it. Who may see it, the sign-off's status and the register entry are read on every request.
type DrawingContent = Pick<SheetContent, "laser" | "parts" | "checklist" | "steps" | "analysis" | "safety" | "problem" | "apertures" | "screen" | "verifyUrl" | "qrSvg">;
const DRAWING_CACHE_SIZE = 32;
const drawingCache = new Map<string, Promise<DrawingContent>>();

function drawingContent(doc: BenchDocument, contentHash: string, standard: SafetyStandard): Promise<DrawingContent> {
  const url = verifyUrl(contentHash);
  const key = `${contentHash}\n${url}\n${standard}`;
  const hit = drawingCache.get(key);
  if (hit) {
    drawingCache.delete(key); // most recently used last
    drawingCache.set(key, hit);
    return hit;
  }
  const made = computeDrawingContent(doc, url, standard);
  drawingCache.set(key, made);
  made.catch(() => drawingCache.delete(key));
  while (drawingCache.size > DRAWING_CACHE_SIZE) drawingCache.delete(drawingCache.keys().next().value!);
  return made;
}

async function computeDrawingContent(doc: BenchDocument, url: string, standard: SafetyStandard): Promise<DrawingContent> {
  // every hazard figure on the sheet follows the lab's chosen standard
  const assessed = assessRevision(doc, { standard });
  const safety = assessed.ok ? assessed.safety : null;
  const analysis = assessed.ok ? assessed.analysis : null;
  const laser = doc.elements.find((e): e is LaserElement => e.kind === "laser") ?? null;
  const origin = laser?.positionMm ?? 0;
  const parts = [...doc.elements]
    .sort((a, b) => a.positionMm - b.positionMm || a.id.localeCompare(b.id))
    .map((e) => ({ id: e.id, kind: e.kind, kindWord: kindTitle(e.kind), positionMm: e.positionMm, fromLaserMm: e.positionMm - origin, settings: elementSettings(e) }));
  const predictions = predictionsFor(doc);
  const apertures: SheetAperture[] = (analysis?.apertures ?? []).map((a) => {
    const p = predictions.apertures.find((x) => x.apertureId === a.id);
    let profile: SheetAperture["profile"] = null;
    let ringMaxRadiusMm: number | null = null;
    if (a.screenId) {
      try {
        const s = screenProfile(doc, a.id, { points: PROFILE_POINTS });
        profile = { radiusMm: s.radiusMm, relativeIntensity: s.relativeIntensity, shadowRadiusMm: s.shadowRadiusMm };
        ringMaxRadiusMm = s.radiusMm[s.radiusMm.length - 1];
      } catch {
        profile = null;
      }
    }
    return {
      ...a,
      spotDiameterMm: p?.spotDiameterMm ?? null,
      screenPowerMw: p?.screenPowerMw ?? null,
      profile,
      ringPng: ringMaxRadiusMm ? ringPngFor(doc, a.id, ringMaxRadiusMm) : null,
      ringMaxRadiusMm,
    };
  });
  const qrSvg = await QRCode.toString(url, { type: "svg", margin: 1, errorCorrectionLevel: "M" });
  return {
    laser,
    parts,
    checklist: checklistFor(doc, safety),
    steps: buildSteps(doc, safety),
    analysis,
    safety,
    problem: assessed.ok ? null : assessed.problem,
    apertures,
    screen: predictions.screen,
    verifyUrl: url,
    qrSvg,
  };
}

/** What a table's sheet shows that follows from the drawing alone (not cached: a table is traced in milliseconds). */
async function tableSheetContent(r: SignedRevision & { document: BenchDocumentV2 }, status: SignOffStatus, db: Database): Promise<TableSheetContent> {
  const doc = r.document;
  const url = verifyUrl(r.contentHash);
  // every hazard figure on the sheet follows the lab's chosen standard, as on a rail's sheet
  const assessed = assessTableRevision(doc, { standard: await labStandard(db, r.labId) });
  const analysis = assessed.ok ? assessed.analysis : null;
  const safety = assessed.ok ? assessed.safety : null;
  const rows = analysis ? pathRows(doc, analysis, safety) : [];
  const lasers = doc.elements.filter((e) => e.kind === "laser" && e.registerId) as { id: string; registerId?: string }[];
  const registers = await Promise.all(lasers.map(async (l) => ({ laserId: l.id, registerId: l.registerId as string, entry: await registerEntry(db, l.registerId as string) })));
  return {
    kind: "table",
    document: doc,
    analysis,
    safety,
    rows,
    ends: beamEnds(rows),
    steps: analysis ? buildOrderV2(doc, analysis) : [],
    registers,
    checklist: checklistFor(doc, safety, r.decision?.conditions),
    problem: assessed.ok ? null : assessed.problem,
    revision: { id: r.id, number: r.number, contentHash: r.contentHash, benchTitle: r.benchTitle, labName: r.labName, authorName: r.authorName, status, statusSentence: signOffSentence(r, status) },
    decision: r.decision,
    toleranceMm: POSITION_TOLERANCE_MM,
    verifyUrl: url,
    qrSvg: await QRCode.toString(url, { type: "svg", margin: 1, errorCorrectionLevel: "M" }),
  };
}

/** Everything the printed sheet shows, for a revision that was signed off: a rail's sheet, or a table's. */
export async function sheetContent(db: Database, actor: Actor, revisionId: string): Promise<SheetContent | TableSheetContent> {
  authorize(actor, { bench: ["read"] });
  const r = await loadSignedRevision(db, actor, revisionId);
  const status = signOffStatus(r);
  if (status === "not-signed-off") throw new AppError("conflict", signOffSentence(r, status));
  if (r.document.version === 2) return tableSheetContent({ ...r, document: r.document }, status, db);
  const doc = r.document;
  const laser = doc.elements.find((e): e is LaserElement => e.kind === "laser") ?? null;
  const [drawing, entry] = await Promise.all([drawingContent(doc, r.contentHash, await labStandard(db, r.labId)), laser?.registerId ? registerEntry(db, laser.registerId) : null]);
  return {
    ...drawing,
    // the officer's conditions are lines to tick too; they belong to the sign-off, not to the drawing
    checklist: checklistFor(doc, drawing.safety, r.decision?.conditions),
    revision: { id: r.id, number: r.number, contentHash: r.contentHash, benchTitle: r.benchTitle, labName: r.labName, authorName: r.authorName, status, statusSentence: signOffSentence(r, status) },
    decision: r.decision,
    document: doc,
    register: laser?.registerId ? { registerId: laser.registerId, entry } : null,
    toleranceMm: POSITION_TOLERANCE_MM,
  };
}
