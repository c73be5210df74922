// The laser register's contract: the request bodies of the register routes (zod, with messages that name the field)
// and the shapes they answer with, imported by the route handlers, lib/server/register.ts and the browser alike (no
// server-only code here).
import { z } from "zod";
import type { LaserStatus } from "@/db/schema";
import { checkBurst } from "@/lib/bench/schema";
import { HAZARD_CLASSES, type HazardClass } from "@/lib/safety/types";
import { safeText } from "@/lib/validation/text";

/** The register's statuses, as the database keeps them (db/schema LASER_STATUSES; checked both ways below), without importing the schema into the browser. */
const STATUSES = ["in-service", "out-of-service", "disposed"] as const satisfies readonly LaserStatus[];
const everyStatus: Exclude<LaserStatus, (typeof STATUSES)[number]> extends never ? true : never = true;
void everyStatus;

// ── Inputs (the one contract for the routes and the officer's form) ───────────────────────────
const num = (field: string) => z.number({ error: `${field} must be a number` }).refine(Number.isFinite, `${field} must be a finite number`);
const positive = (field: string, unit: string, max: number) =>
  num(field)
    .refine((v) => v > 0, `${field} must be greater than 0 ${unit}`)
    .refine((v) => v <= max, `${field} must be at most ${max} ${unit}`);
const optionalText = (field: string, max: number) =>
  safeText()
    .trim()
    .max(max, `${field} must be at most ${max} characters`)
    .nullish()
    .transform((v) => (v ? v : null));

export const laserInput = z
  .object({
    labId: z.uuid({ error: "Choose the lab the laser belongs to" }),
    labelClass: z.enum(HAZARD_CLASSES, { error: `Label class must be one of: ${HAZARD_CLASSES.join(", ")}` }),
    wavelengthsNm: z
      .array(positive("Wavelength", "nm", 1_000_000).refine((v) => v >= 180, "Wavelength must be at least 180 nm"), { error: "Give the wavelengths as a list of numbers" })
      .min(1, "Give at least one wavelength")
      .max(16, "At most 16 wavelengths"),
    maxPowerMw: positive("Maximum power", "mW", 1e9),
    pulseEnergyMj: positive("Pulse energy", "mJ", 1e6).nullish().transform((v) => v ?? null),
    pulseDurationS: positive("Pulse duration", "s", 10).nullish().transform((v) => v ?? null),
    pulseRepetitionRateHz: positive("Repetition rate", "Hz", 1e12).nullish().transform((v) => v ?? null),
    /** Trains in bursts only: pulses in each burst; pulseRepetitionRateHz stays the average (pulses per burst × bursts per second). */
    pulsesPerBurst: num("Pulses per burst (pulsesPerBurst)")
      .refine(Number.isInteger, "Pulses per burst (pulsesPerBurst) must be a whole number")
      .refine((v) => v >= 2, "Pulses per burst (pulsesPerBurst) must be at least 2")
      .refine((v) => v <= 1e9, "Pulses per burst (pulsesPerBurst) must be at most 1e9")
      .nullish()
      .transform((v) => v ?? null),
    /** Trains in bursts only: the pulse rate inside a burst. */
    burstPulseRateHz: positive("Pulse rate inside a burst (burstPulseRateHz)", "Hz", 1e15).nullish().transform((v) => v ?? null),
    beamDiameterMm: positive("Beam diameter", "mm", 1000),
    divergenceMrad: positive("Divergence", "mrad", 1000),
    lines: z
      .array(
        z.object({
          wavelengthNm: positive("Further line wavelength (wavelengthNm)", "nm", 1_000_000).refine((v) => v >= 180, "Further line wavelength (wavelengthNm) must be at least 180 nm"),
          powerMw: positive("Further line power (powerMw)", "mW", 1e9),
        }),
        { error: "Further lines (lines) must be a list of { wavelengthNm, powerMw }" },
      )
      .max(8, "Further lines (lines): at most 8")
      .nullish()
      .transform((v) => (v && v.length ? v : null)),
    model: safeText({ error: "Give the manufacturer and model" }).trim().min(1, "Give the manufacturer and model").max(200, "The model must be at most 200 characters"),
    serialNumber: optionalText("The serial number", 120),
    location: optionalText("The location", 200),
    status: z.enum(STATUSES, { error: "Status must be in service, out of service or disposed" }).default("in-service"),
    responsibleUserId: safeText().max(64).nullish().transform((v) => v || null),
  })
  .superRefine((v, ctx) => {
    if (v.pulseRepetitionRateHz !== null && v.pulseDurationS === null) {
      ctx.addIssue({ code: "custom", path: ["pulseDurationS"], message: "A repetition rate needs a pulse duration" });
    }
    if (v.pulseEnergyMj !== null && v.pulseDurationS === null) {
      ctx.addIssue({ code: "custom", path: ["pulseDurationS"], message: "A pulse energy needs a pulse duration" });
    }
    if (v.pulseDurationS !== null && v.pulseRepetitionRateHz !== null && v.pulseDurationS * v.pulseRepetitionRateHz >= 1) {
      ctx.addIssue({ code: "custom", path: ["pulseRepetitionRateHz"], message: "Pulse duration × repetition rate must be below 1; enter the laser as continuous-wave" });
    }
    // Bursts: the bench document's own rules (both fields, on a train, no overlapping pulses, bursts apart), same sentences.
    checkBurst(
      {
        pulseDurationS: v.pulseDurationS ?? undefined,
        pulseRepetitionRateHz: v.pulseRepetitionRateHz ?? undefined,
        pulsesPerBurst: v.pulsesPerBurst ?? undefined,
        burstPulseRateHz: v.burstPulseRateHz ?? undefined,
      },
      ctx,
      [],
    );
  });
export type LaserInput = z.infer<typeof laserInput>;

export const laserUpdateInput = z.intersection(laserInput, z.object({ version: z.number({ error: "Send the version you edited" }).int().min(1) }));
export type LaserUpdateInput = z.infer<typeof laserUpdateInput>;


// ── Views ─────────────────────────────────────────────────────────────────────────────────────
export type ComputedClass = {
  /** The highest class over the laser's wavelengths at its maximum power; null when the engine cannot say. */
  hazardClass: HazardClass | null;
  matchesLabel: boolean | null;
  /** Present when label and estimate differ; the label is never changed. */
  warning: string | null;
  reasons: string[];
  /** The class limits' clauses, saying they are not yet checked against the standard's text; null when nothing was classified. */
  source: string | null;
};

export type LaserView = {
  id: string;
  labId: string;
  labName: string;
  labelClass: HazardClass;
  wavelengthsNm: number[];
  maxPowerMw: number;
  pulseEnergyMj: number | null;
  pulseDurationS: number | null;
  pulseRepetitionRateHz: number | null;
  /** Trains in bursts only: pulses in each burst and the pulse rate inside a burst; null otherwise. */
  pulsesPerBurst: number | null;
  burstPulseRateHz: number | null;
  /** Further emission lines with their own power (residual pump, other harmonics); null when none. */
  lines: { wavelengthNm: number; powerMw: number }[] | null;
  beamDiameterMm: number;
  divergenceMrad: number;
  model: string;
  serialNumber: string | null;
  location: string | null;
  status: LaserStatus;
  responsibleUserId: string | null;
  responsibleName: string | null;
  version: number;
  updatedAt: string;
  computed: ComputedClass;
};

export const STATUS_WORDS: Record<LaserStatus, string> = { "in-service": "In service", "out-of-service": "Out of service", disposed: "Disposed of" };
