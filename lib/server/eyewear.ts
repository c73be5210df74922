// Eyewear on each lab's shelf (officers keep it, the lab reads it), each lab's chosen safety standard, and the
// per-line coverage a bench's hazard figures ask for. Coverage rules: lib/safety/eyewear.ts (OD per band, EN 207 scale numbers).
import "server-only";
import { and, asc, eq, inArray, sql, type SQL } from "drizzle-orm";
import { z } from "zod";
import type { Database, DbOrTx } from "@/db";
import { eyewearBand, eyewearItem, lab, SAFETY_STANDARDS, type SafetyStandard } from "@/db/schema";
import { AppError, notFound } from "@/lib/errors";
import { eyewearCoverage, lineNeeds, type EyewearCoverage, type EyewearItem, type HazardAnswerLines } from "@/lib/safety/eyewear";
import { recordAudit } from "./audit";
import { authorize, type Actor } from "./authorize";
import { labStandard } from "./lab-standard";
import { assessAnyRevision } from "@/lib/review/hazard";
import { inScope, scopeHolds } from "./scope";
import type { EyewearBandView, EyewearInput, EyewearUpdateInput, EyewearView } from "@/lib/api/contracts/eyewear";
import { loadRevision } from "./reviews";

// ── Inputs (the item's form and views: lib/api/contracts/eyewear.ts) ────────────────────────────────────────────────────────────────────────────────────
export const eyewearListQuery = z.object({ labId: z.uuid({ error: "labId must be a lab id" }).optional() });

export const labStandardInput = z.object({
  standard: z.enum(SAFETY_STANDARDS, { error: `Standard (standard) must be one of: ${SAFETY_STANDARDS.join(", ")}` }),
});

async function loadItems(db: DbOrTx, where: SQL | undefined): Promise<EyewearView[]> {
  const rows = await db
    .select({
      id: eyewearItem.id,
      labId: eyewearItem.labId,
      labName: lab.name,
      name: eyewearItem.name,
      quantity: eyewearItem.quantity,
      note: eyewearItem.note,
      version: eyewearItem.version,
      updatedAt: eyewearItem.updatedAt,
    })
    .from(eyewearItem)
    .innerJoin(lab, eq(lab.id, eyewearItem.labId))
    .where(where)
    .orderBy(asc(lab.name), asc(eyewearItem.name), asc(eyewearItem.id));
  if (rows.length === 0) return [];
  const bands = await db
    .select()
    .from(eyewearBand)
    .where(inArray(eyewearBand.itemId, rows.map((r) => r.id)))
    .orderBy(asc(eyewearBand.itemId), asc(eyewearBand.position));
  const byItem = new Map<string, EyewearBandView[]>();
  for (const b of bands) {
    const list = byItem.get(b.itemId) ?? [];
    list.push({ fromNm: b.fromNm, toNm: b.toNm, opticalDensity: b.opticalDensity, en207ScaleNumber: b.en207ScaleNumber });
    byItem.set(b.itemId, list);
  }
  return rows.map((r) => ({ ...r, updatedAt: r.updatedAt.toISOString(), bands: byItem.get(r.id) ?? [] }));
}

// ── Reading ───────────────────────────────────────────────────────────────────────────────────
/** The eyewear of the labs the actor may see (officers and auditors: every lab), by lab and name. */
export async function listEyewear(db: DbOrTx, actor: Actor, filter: z.infer<typeof eyewearListQuery> = {}): Promise<EyewearView[]> {
  authorize(actor, { eyewear: ["read"] });
  if (filter.labId && !scopeHolds(actor, filter.labId)) throw new AppError("forbidden", "You may not see this lab's eyewear: it belongs to a lab you are not a member of.");
  return loadItems(db, and(inScope(actor, eyewearItem.labId), filter.labId ? eq(eyewearItem.labId, filter.labId) : undefined));
}

/** One item; outside the actor's labs it does not exist (404). */
export async function getEyewear(db: DbOrTx, actor: Actor, itemId: string): Promise<EyewearView> {
  authorize(actor, { eyewear: ["read"] });
  if (!z.uuid().safeParse(itemId).success) throw notFound("The eyewear item");
  const [item] = await loadItems(db, eq(eyewearItem.id, itemId));
  if (!item || !scopeHolds(actor, item.labId)) throw notFound("The eyewear item");
  return item;
}

// ── Changing (safety officers) ────────────────────────────────────────────────────────────────
async function audit(tx: DbOrTx, actor: Actor, action: string, detail: Record<string, unknown>) {
  await recordAudit(tx, actor, { action, detail });
}

async function checkLab(tx: DbOrTx, labId: string): Promise<{ id: string; name: string }> {
  const [found] = await tx.select({ id: lab.id, name: lab.name }).from(lab).where(eq(lab.id, labId));
  if (!found) throw new AppError("bad-request", "The chosen lab does not exist.", [{ path: "labId", message: "Lab (labId): unknown lab" }]);
  return found;
}

async function writeBands(tx: DbOrTx, itemId: string, input: EyewearInput) {
  await tx.delete(eyewearBand).where(eq(eyewearBand.itemId, itemId));
  await tx.insert(eyewearBand).values(
    input.bands.map((b, position) => ({ itemId, position, fromNm: b.fromNm, toNm: b.toNm, opticalDensity: b.opticalDensity, en207ScaleNumber: b.en207ScaleNumber ?? null })),
  );
}

const entryOf = (input: EyewearInput) => ({ labId: input.labId, name: input.name, quantity: input.quantity, note: input.note, bands: input.bands });

export async function createEyewear(db: Database, actor: Actor, input: EyewearInput): Promise<EyewearView> {
  authorize(actor, { eyewear: ["manage"] });
  return db.transaction(async (tx) => {
    const l = await checkLab(tx, input.labId);
    const [row] = await tx.insert(eyewearItem).values({ labId: input.labId, name: input.name, quantity: input.quantity, note: input.note }).returning({ id: eyewearItem.id });
    await writeBands(tx, row.id, input);
    await audit(tx, actor, "eyewear-added", { eyewearId: row.id, labId: input.labId, labName: l.name, entry: entryOf(input) });
    return getEyewear(tx, actor, row.id);
  });
}

/** Saves the officer's edit if nobody else saved in between (the version counter), else 409. */
export async function updateEyewear(db: Database, actor: Actor, itemId: string, input: EyewearUpdateInput): Promise<EyewearView> {
  authorize(actor, { eyewear: ["manage"] });
  return db.transaction(async (tx) => {
    const before = await getEyewear(tx, actor, itemId);
    const l = await checkLab(tx, input.labId);
    const [saved] = await tx
      .update(eyewearItem)
      .set({ labId: input.labId, name: input.name, quantity: input.quantity, note: input.note, version: sql`${eyewearItem.version} + 1`, updatedAt: new Date() })
      .where(and(eq(eyewearItem.id, itemId), eq(eyewearItem.version, input.version)))
      .returning({ id: eyewearItem.id });
    if (!saved) {
      throw new AppError(
        "conflict",
        `Someone else changed this eyewear item after you opened it (it is now at version ${before.version}, you edited version ${input.version}). Reload it, then make your change again.`,
      );
    }
    await writeBands(tx, itemId, input);
    const next = entryOf(input);
    const changes: Record<string, { from: unknown; to: unknown }> = {};
    for (const [key, to] of Object.entries(next)) {
      const from = before[key as keyof EyewearView];
      if (JSON.stringify(from) !== JSON.stringify(to)) changes[key] = { from, to };
    }
    await audit(tx, actor, "eyewear-updated", { eyewearId: itemId, labId: input.labId, labName: l.name, fromVersion: input.version, toVersion: input.version + 1, changes });
    return getEyewear(tx, actor, itemId);
  });
}

/** Takes an item off the lab's shelf; the audit row keeps what it was. */
export async function deleteEyewear(db: Database, actor: Actor, itemId: string): Promise<{ deleted: true; id: string }> {
  authorize(actor, { eyewear: ["manage"] });
  return db.transaction(async (tx) => {
    const before = await getEyewear(tx, actor, itemId);
    await tx.delete(eyewearItem).where(eq(eyewearItem.id, itemId));
    await audit(tx, actor, "eyewear-removed", { eyewearId: itemId, labId: before.labId, labName: before.labName, entry: { name: before.name, quantity: before.quantity, note: before.note, bands: before.bands } });
    return { deleted: true, id: itemId };
  });
}

// ── The lab's safety standard ─────────────────────────────────────────────────────────────────
export { DEFAULT_STANDARD, labStandard } from "./lab-standard";

/** An admin or officer picks the standard a lab's hazard figures follow; audited. */
export async function setLabStandard(db: Database, actor: Actor, labId: string, input: z.infer<typeof labStandardInput>): Promise<{ labId: string; standard: SafetyStandard }> {
  authorize(actor, { standard: ["set"] });
  if (!z.uuid().safeParse(labId).success) throw notFound("The lab");
  return db.transaction(async (tx) => {
    const [before] = await tx.select({ id: lab.id, name: lab.name, standard: lab.safetyStandard }).from(lab).where(eq(lab.id, labId));
    if (!before) throw notFound("The lab");
    if (before.standard !== input.standard) {
      await tx.update(lab).set({ safetyStandard: input.standard, updatedAt: new Date() }).where(eq(lab.id, labId));
      await audit(tx, actor, "lab-standard-changed", { labId, labName: before.name, from: before.standard, to: input.standard });
    }
    return { labId, standard: input.standard };
  });
}

// ── A bench's lines against the lab's shelf ───────────────────────────────────────────────────
export type BenchEyewear = {
  labId: string;
  standard: SafetyStandard;
  /** Items the lab keeps (for the "none on the shelf" sentence). */
  itemCount: number;
  coverage: EyewearCoverage;
};

/** Which of the lab's items cover each line of the bench, and the lab's standard. */
export async function benchEyewear(db: DbOrTx, labId: string, safety: HazardAnswerLines | null): Promise<BenchEyewear> {
  const standard = await labStandard(db, labId);
  const items = await loadItems(db, eq(eyewearItem.labId, labId));
  const shelf: EyewearItem[] = items.map((i) => ({ id: i.id, name: i.name, bands: i.bands }));
  const coverage = eyewearCoverage(shelf, safety ? lineNeeds(safety) : []);
  return { labId, standard, itemCount: items.length, coverage };
}

/** The lab standard, the engines' answer and the eyewear coverage of one revision the actor may read (404 outside their labs). */
export async function revisionEyewear(db: DbOrTx, actor: Actor, revisionId: string): Promise<BenchEyewear & { revisionId: string; problem: string | null }> {
  authorize(actor, { bench: ["read"] });
  authorize(actor, { eyewear: ["read"] });
  const r = await loadRevision(db, actor, revisionId);
  const standard = await labStandard(db, r.labId);
  const assessed = assessAnyRevision(r.document, { standard });
  const result = await benchEyewear(db, r.labId, assessed.ok ? assessed.safety : null);
  return { ...result, revisionId: r.id, problem: assessed.ok ? null : assessed.problem };
}

export type LabShelf = { labId: string; labName: string; standard: SafetyStandard; items: EyewearView[] };

/** The eyewear page: every lab the actor may see, with its standard and its eyewear (labs without eyewear included). */
export async function eyewearShelves(db: DbOrTx, actor: Actor): Promise<LabShelf[]> {
  authorize(actor, { eyewear: ["read"] });
  const labs = await db.select({ id: lab.id, name: lab.name, standard: lab.safetyStandard }).from(lab).where(inScope(actor, lab.id)).orderBy(asc(lab.name));
  const items = await loadItems(db, inScope(actor, eyewearItem.labId));
  return labs.map((l) => ({ labId: l.id, labName: l.name, standard: l.standard, items: items.filter((i) => i.labId === l.id) }));
}

/** The editor's copy of one lab's list and standard: names and bands only (the editor works out coverage as the drawing changes). */
export async function labShelf(db: DbOrTx, actor: Actor, labId: string): Promise<{ standard: SafetyStandard; items: EyewearItem[] }> {
  authorize(actor, { eyewear: ["read"] });
  if (!scopeHolds(actor, labId)) return { standard: await labStandard(db, labId), items: [] };
  const items = await loadItems(db, eq(eyewearItem.labId, labId));
  return { standard: await labStandard(db, labId), items: items.map((i) => ({ id: i.id, name: i.name, bands: i.bands })) };
}

/** Every lab's chosen standard, for the page where an admin or officer picks them. */
export async function labStandards(db: DbOrTx, actor: Actor): Promise<Map<string, SafetyStandard>> {
  authorize(actor, { standard: ["set"] });
  const rows = await db.select({ id: lab.id, standard: lab.safetyStandard }).from(lab);
  return new Map(rows.map((r) => [r.id, r.standard]));
}
