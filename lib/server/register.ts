// The laser register: the institution's inventory of lasers, kept by the safety officers and read by
// everyone in the labs. Computed classes come from lib/safety (IEC 60825-1:2014 class limits); labels are never changed.
import { laserAveragePowerMw } from "@/lib/bench/laser-power";
import "server-only";
import { and, asc, eq, sql } from "drizzle-orm";
import { z } from "zod";
import type { Database, DbOrTx } from "@/db";
import { lab, laserRegister, LASER_STATUSES, user } from "@/db/schema";
import type { AnyBenchDocument, BenchDocument, LaserElement } from "@/lib/bench/schema";
import { AppError, notFound } from "@/lib/errors";
import { classifyBeam, compareLabel, HAZARD_CLASSES, type HazardClass } from "@/lib/safety";
import { recordAudit } from "./audit";
import { authorize, authorizeLab, type Actor } from "./authorize";
import { inScope, scopeHolds } from "./scope";
import { STATUS_WORDS, type ComputedClass, type LaserInput, type LaserUpdateInput, type LaserView } from "@/lib/api/contracts/register";

// ── Inputs and views: lib/api/contracts/register.ts ──────────────────────────────────────────
export const laserListQuery = z.object({
  labId: z.uuid({ error: "labId must be a lab id" }).optional(),
  status: z.enum(LASER_STATUSES).optional(),
});


type LaserFacts = Pick<LaserView, "labelClass" | "wavelengthsNm" | "maxPowerMw" | "pulseDurationS" | "pulseRepetitionRateHz" | "beamDiameterMm" | "divergenceMrad"> & {
  lines?: LaserView["lines"];
  pulseEnergyMj?: number | null;
  pulsesPerBurst?: number | null;
  burstPulseRateHz?: number | null;
};

/**
 * Classifies the laser at each wavelength and keeps the highest class: at its maximum power (a train's average power),
 * and, where the entry gives a pulse energy and duration, also from that energy per pulse (with the rate, its average
 * energy × rate). Maximum power and energy need not agree in a register (they may be rated at different rates), so the
 * higher class of the two readings is kept: the cautious answer.
 */
export function computeClass(facts: LaserFacts): ComputedClass {
  let worst: HazardClass | null = null;
  let source: string | null = null;
  const reasons: string[] = [];
  const raise = (c: HazardClass) => {
    if (worst === null || HAZARD_CLASSES.indexOf(c) > HAZARD_CLASSES.indexOf(worst)) worst = c;
  };
  const energyMj = facts.pulseEnergyMj ?? null;
  const timing = {
    ...(facts.pulseDurationS !== null ? { pulseDurationS: facts.pulseDurationS } : {}),
    ...(facts.pulseDurationS !== null && facts.pulseRepetitionRateHz !== null ? { pulseRepetitionRateHz: facts.pulseRepetitionRateHz } : {}),
    ...(facts.pulseDurationS !== null && facts.pulseRepetitionRateHz !== null && facts.pulsesPerBurst != null && facts.burstPulseRateHz != null
      ? { pulsesPerBurst: facts.pulsesPerBurst, burstPulseRateHz: facts.burstPulseRateHz }
      : {}),
  };
  try {
    for (const wavelengthNm of facts.wavelengthsNm) {
      const beam = { wavelengthNm, beamDiameterMm: facts.beamDiameterMm, divergenceMrad: facts.divergenceMrad, ...timing };
      const c = classifyBeam({ ...beam, powerMw: facts.maxPowerMw });
      source ??= c.source;
      reasons.push(`${wavelengthNm} nm: Class ${c.hazardClass}. ${c.reasons.join(" ")}`);
      raise(c.hazardClass);
      if (energyMj !== null && facts.pulseDurationS !== null) {
        const e = classifyBeam({ ...beam, pulseEnergyJ: energyMj / 1e3 });
        reasons.push(`${wavelengthNm} nm from the pulse energy ${energyMj} mJ: Class ${e.hazardClass}. ${e.reasons.join(" ")}`);
        raise(e.hazardClass);
      }
    }
    if (energyMj !== null && facts.pulseDurationS === null) {
      reasons.push("The pulse energy is not used: the entry gives no pulse duration. Add the duration so the estimate can take it into account.");
    }
    // Further lines, each at its own power, as continuous beams (a residual pump or harmonic); the class is the highest over all.
    for (const line of facts.lines ?? []) {
      const c = classifyBeam({ wavelengthNm: line.wavelengthNm, powerMw: line.powerMw, beamDiameterMm: facts.beamDiameterMm, divergenceMrad: facts.divergenceMrad });
      reasons.push(`Further line ${line.wavelengthNm} nm at ${line.powerMw} mW: Class ${c.hazardClass}. ${c.reasons.join(" ")}`);
      raise(c.hazardClass);
    }
  } catch (error) {
    return { hazardClass: null, matchesLabel: null, warning: `The class could not be estimated: ${error instanceof Error ? error.message : "unknown problem"}.`, reasons, source };
  }
  if (worst === null) return { hazardClass: null, matchesLabel: null, warning: null, reasons, source };
  const check = compareLabel(facts.labelClass, worst);
  return { hazardClass: worst, matchesLabel: check.matches, warning: check.warning, reasons, source };
}

const columns = {
  id: laserRegister.id,
  labId: laserRegister.labId,
  labName: lab.name,
  labelClass: laserRegister.labelClass,
  wavelengthsNm: laserRegister.wavelengthsNm,
  maxPowerMw: laserRegister.maxPowerMw,
  pulseEnergyMj: laserRegister.pulseEnergyMj,
  pulseDurationS: laserRegister.pulseDurationS,
  pulseRepetitionRateHz: laserRegister.pulseRepetitionRateHz,
  pulsesPerBurst: laserRegister.pulsesPerBurst,
  burstPulseRateHz: laserRegister.burstPulseRateHz,
  lines: laserRegister.lines,
  beamDiameterMm: laserRegister.beamDiameterMm,
  divergenceMrad: laserRegister.divergenceMrad,
  model: laserRegister.model,
  serialNumber: laserRegister.serialNumber,
  location: laserRegister.location,
  status: laserRegister.status,
  responsibleUserId: laserRegister.responsibleUserId,
  responsibleName: user.name,
  version: laserRegister.version,
  updatedAt: laserRegister.updatedAt,
};

type LaserRow = Awaited<ReturnType<typeof baseQuery>>[number];

function view(row: LaserRow): LaserView {
  const facts = { ...row, labelClass: row.labelClass as HazardClass };
  return { ...facts, updatedAt: row.updatedAt.toISOString(), computed: computeClass(facts) };
}

function baseQuery(db: DbOrTx) {
  return db.select(columns).from(laserRegister).innerJoin(lab, eq(lab.id, laserRegister.labId)).leftJoin(user, eq(user.id, laserRegister.responsibleUserId));
}

// ── Reading ───────────────────────────────────────────────────────────────────────────────────
/** The lasers of the labs the actor may see (officers and auditors: all), by lab and model. */
export async function listLasers(db: DbOrTx, actor: Actor, filter: z.infer<typeof laserListQuery> = {}): Promise<LaserView[]> {
  authorize(actor, { register: ["read"] });
  if (filter.labId) authorizeLab(actor, filter.labId);
  const conditions = [inScope(actor, laserRegister.labId), filter.labId ? eq(laserRegister.labId, filter.labId) : undefined, filter.status ? eq(laserRegister.status, filter.status) : undefined];
  const rows = await baseQuery(db)
    .where(and(...conditions))
    .orderBy(asc(lab.name), asc(laserRegister.model), asc(laserRegister.id));
  return rows.map(view);
}

/** One laser; outside the actor's labs it does not exist (404). */
export async function getLaser(db: DbOrTx, actor: Actor, laserId: string): Promise<LaserView> {
  authorize(actor, { register: ["read"] });
  if (!z.uuid().safeParse(laserId).success) throw notFound("The laser");
  const [row] = await baseQuery(db).where(eq(laserRegister.id, laserId));
  if (!row) throw notFound("The laser");
  if (!scopeHolds(actor, row.labId)) throw notFound("The laser");
  return view(row);
}

/** People an officer may name as responsible for a laser: active accounts, names only. */
export async function listResponsibleCandidates(db: DbOrTx, actor: Actor): Promise<{ id: string; name: string }[]> {
  authorize(actor, { register: ["manage"] });
  return db
    .select({ id: user.id, name: user.name })
    .from(user)
    .where(sql`coalesce(${user.banned}, false) = false`)
    .orderBy(asc(user.name));
}

// ── Changing (safety officers) ────────────────────────────────────────────────────────────────
async function checkReferences(tx: DbOrTx, input: LaserInput) {
  const [foundLab] = await tx.select({ id: lab.id }).from(lab).where(eq(lab.id, input.labId));
  if (!foundLab) throw new AppError("bad-request", "The chosen lab does not exist.", [{ path: "labId", message: "Unknown lab" }]);
  if (input.responsibleUserId) {
    const [person] = await tx.select({ id: user.id }).from(user).where(eq(user.id, input.responsibleUserId));
    if (!person) throw new AppError("bad-request", "The responsible person does not have an account.", [{ path: "responsibleUserId", message: "Unknown person" }]);
  }
}

function values(input: LaserInput) {
  return {
    labId: input.labId,
    labelClass: input.labelClass,
    wavelengthsNm: input.wavelengthsNm,
    maxPowerMw: input.maxPowerMw,
    pulseEnergyMj: input.pulseEnergyMj,
    pulseDurationS: input.pulseDurationS,
    pulseRepetitionRateHz: input.pulseRepetitionRateHz,
    pulsesPerBurst: input.pulsesPerBurst,
    burstPulseRateHz: input.burstPulseRateHz,
    lines: input.lines,
    beamDiameterMm: input.beamDiameterMm,
    divergenceMrad: input.divergenceMrad,
    model: input.model,
    serialNumber: input.serialNumber,
    location: input.location,
    status: input.status,
    responsibleUserId: input.responsibleUserId,
  };
}

export async function createLaser(db: Database, actor: Actor, input: LaserInput): Promise<LaserView> {
  authorize(actor, { register: ["manage"] });
  return db.transaction(async (tx) => {
    await checkReferences(tx, input);
    const [row] = await tx.insert(laserRegister).values(values(input)).returning({ id: laserRegister.id });
    const created = await getLaser(tx, actor, row.id);
    await recordAudit(tx, actor, {
      action: "laser-registered",
      detail: { laserId: row.id, labId: input.labId, entry: values(input), computedClass: created.computed.hazardClass },
    });
    return created;
  });
}

/** Saves the officer's edit if nobody else saved in between (the version counter), else 409. */
export async function updateLaser(db: Database, actor: Actor, laserId: string, input: LaserUpdateInput): Promise<LaserView> {
  authorize(actor, { register: ["manage"] });
  return db.transaction(async (tx) => {
    const before = await getLaser(tx, actor, laserId);
    await checkReferences(tx, input);
    const next = values(input);
    const [saved] = await tx
      .update(laserRegister)
      .set({ ...next, version: sql`${laserRegister.version} + 1`, updatedAt: new Date() })
      .where(and(eq(laserRegister.id, laserId), eq(laserRegister.version, input.version)))
      .returning({ id: laserRegister.id });
    if (!saved) {
      throw new AppError(
        "conflict",
        `Someone else changed this laser's entry after you opened it (it is now at version ${before.version}, you edited version ${input.version}). Reload it, then make your change again.`,
      );
    }
    const changes: Record<string, { from: unknown; to: unknown }> = {};
    for (const [key, to] of Object.entries(next)) {
      const from = before[key as keyof LaserView];
      if (JSON.stringify(from) !== JSON.stringify(to)) changes[key] = { from, to };
    }
    await recordAudit(tx, actor, {
      action: before.status !== input.status ? "laser-status-changed" : "laser-updated",
      detail: { laserId, labId: input.labId, fromVersion: input.version, toVersion: input.version + 1, changes },
    });
    return getLaser(tx, actor, laserId);
  });
}

// ── A bench against the register ──────────────────────────────────────────────────────────────
export type RegisterWarning = {
  code: "register-entry-missing" | "power-above-register" | "wavelength-not-registered" | "diameter-differs" | "class-differs-from-label" | "laser-not-in-service";
  elementId: string;
  message: string;
  /** True when a new submission must be refused (the laser is out of service or disposed of). */
  blocksSubmission: boolean;
};
export type RegisterCheck = { laserId: string | null; labelClass: HazardClass | null; computedClass: HazardClass | null; warnings: RegisterWarning[] };

const WAVELENGTH_TOLERANCE_NM = 0.5;
const DIAMETER_TOLERANCE = 0.1;
const fmt = (x: number) => Number(x.toPrecision(4)).toString();

/**
 * Compares the bench's laser with the register entry it names (registerId): power above the entry's
 * maximum, a wavelength the laser does not emit, a beam diameter differing by more than 10 %, a
 * computed class that differs from the label, and a laser that is not in service.
 */
export async function checkBenchAgainstRegister(db: DbOrTx, actor: Actor, document: BenchDocument): Promise<RegisterCheck> {
  authorize(actor, { register: ["read"] });
  const laser = document.elements.find((e): e is LaserElement => e.kind === "laser");
  if (!laser?.registerId) return { laserId: null, labelClass: null, computedClass: null, warnings: [] };
  const id = laser.id;
  const missing: RegisterCheck = {
    laserId: laser.registerId,
    labelClass: null,
    computedClass: null,
    warnings: [{ code: "register-entry-missing", elementId: id, message: `The laser refers to a register entry (${laser.registerId}) that does not exist or that you may not see; pick the laser from the register again.`, blocksSubmission: false }],
  };
  if (!z.uuid().safeParse(laser.registerId).success) return missing;
  const [row] = await baseQuery(db).where(eq(laserRegister.id, laser.registerId));
  if (!row || !scopeHolds(actor, row.labId)) return missing;
  const entry = view(row);
  const name = `${entry.model}${entry.serialNumber ? ` (serial ${entry.serialNumber})` : ""}`;
  const warnings: RegisterWarning[] = [];

  if (entry.status !== "in-service") {
    warnings.push({
      code: "laser-not-in-service",
      elementId: id,
      message: `The register lists ${name} as ${STATUS_WORDS[entry.status].toLowerCase()}; it cannot be used in a new submission. Ask the laser safety officer.`,
      blocksSubmission: true,
    });
  }
  const averageMw = laserAveragePowerMw(laser);
  if (averageMw !== null && averageMw > entry.maxPowerMw * (1 + 1e-9)) {
    warnings.push({ code: "power-above-register", elementId: id, message: `The bench sets ${fmt(averageMw)} mW, above the register's maximum of ${fmt(entry.maxPowerMw)} mW for ${name}.`, blocksSubmission: false });
  }
  if (!entry.wavelengthsNm.some((w) => Math.abs(w - laser.wavelengthNm) <= WAVELENGTH_TOLERANCE_NM)) {
    warnings.push({
      code: "wavelength-not-registered",
      elementId: id,
      message: `The bench uses ${fmt(laser.wavelengthNm)} nm, which is not among the register's wavelengths for ${name} (${entry.wavelengthsNm.map(fmt).join(", ")} nm).`,
      blocksSubmission: false,
    });
  }
  const ratio = laser.beamDiameterMm / entry.beamDiameterMm;
  if (Math.abs(ratio - 1) > DIAMETER_TOLERANCE) {
    const how = ratio < 1 ? "narrower (a more concentrated beam)" : "wider";
    warnings.push({
      code: "diameter-differs",
      elementId: id,
      message: `The bench's beam diameter ${fmt(laser.beamDiameterMm)} mm is ${how} than the register's ${fmt(entry.beamDiameterMm)} mm (1/e²) for ${name}.`,
      blocksSubmission: false,
    });
  }
  // The class the bench's own settings give, with the register's divergence (the document has none).
  let computedClass: HazardClass | null = null;
  try {
    computedClass = classifyBeam({
      wavelengthNm: laser.wavelengthNm,
      powerMw: laser.powerMw,
      pulseEnergyJ: laser.pulseEnergyJ,
      beamDiameterMm: laser.beamDiameterMm,
      divergenceMrad: entry.divergenceMrad,
      ...(laser.pulseDurationS !== undefined
        ? { pulseDurationS: laser.pulseDurationS, pulseRepetitionRateHz: laser.pulseRepetitionRateHz, pulsesPerBurst: laser.pulsesPerBurst, burstPulseRateHz: laser.burstPulseRateHz }
        : {}),
    }).hazardClass;
  } catch {
    computedClass = null;
  }
  if (computedClass && computedClass !== entry.labelClass) {
    warnings.push({ code: "class-differs-from-label", elementId: id, message: compareLabel(entry.labelClass, computedClass).warning ?? "", blocksSubmission: false });
  }
  return { laserId: entry.id, labelClass: entry.labelClass, computedClass, warnings };
}

/**
 * For the submit path: refuses (409) a submission whose laser the register lists as out of service or disposed of.
 * On a table (version 2) every laser is checked; the first laser's check is returned.
 */
export async function assertRegisterAllowsSubmission(db: DbOrTx, actor: Actor, document: AnyBenchDocument): Promise<RegisterCheck> {
  const rails: BenchDocument[] =
    document.version === 1
      ? [document]
      : document.elements.flatMap((e) => {
          if (e.kind !== "laser") return [];
          const { xMm: _x, yMm: _y, angleDeg: _a, ...laser } = e;
          return [{ version: 1 as const, elements: [{ ...laser, positionMm: 0 }] }];
        });
  const checks: RegisterCheck[] = [];
  for (const rail of rails) {
    const check = await checkBenchAgainstRegister(db, actor, rail);
    const blocking = check.warnings.find((w) => w.blocksSubmission);
    if (blocking) throw new AppError("conflict", blocking.message, [{ path: "registerId", message: blocking.message }]);
    checks.push(check);
  }
  return checks[0] ?? { laserId: null, labelClass: null, computedClass: null, warnings: [] };
}
