// The bench document, version 1: the one contract the editor, the analysis API and the export share.
// Units are in the field names; the beam travels toward increasing positionMm from the single laser.
import { z } from "zod";
import { safeText } from "@/lib/validation/text";

export const MAX_ELEMENTS = 200;
export const MIN_WAVELENGTH_NM = 180;
export const MAX_WAVELENGTH_NM = 1_000_000; // 1 mm, the upper end of ANSI Z136.1's optical range
export const MAX_POSITION_MM = 100_000; // 100 m: longer than any optical table or corridor run

const finite = (field: string) =>
  z.number({ error: `${field} must be a number` }).refine(Number.isFinite, `${field} must be a finite number`);

const positive = (field: string, unit: string, max: number) =>
  finite(field)
    .refine((v) => v > 0, `${field} must be greater than 0 ${unit}`)
    .refine((v) => v <= max, `${field} must be at most ${max} ${unit}`);

const position = finite("Position").refine(
  (v) => Math.abs(v) <= MAX_POSITION_MM,
  `Position must lie within ±${MAX_POSITION_MM} mm`,
);

const elementId = safeText({ error: "Element id must be text" })
  .min(1, "Element id must not be empty")
  .max(64, "Element id must be at most 64 characters");

export const laserSchema = z.object({
  id: elementId,
  kind: z.literal("laser"),
  positionMm: position,
  wavelengthNm: finite("Wavelength").refine(
    (v) => v >= MIN_WAVELENGTH_NM && v <= MAX_WAVELENGTH_NM,
    `Wavelength must be between ${MIN_WAVELENGTH_NM} nm and 1 mm (${MAX_WAVELENGTH_NM} nm)`,
  ),
  /**
   * Continuous-wave output, or the average power of a pulse train. Omitted for a single pulse given by its energy
   * (pulseEnergyJ); required otherwise (checked by checkLaserFields, which the document schemas call).
   */
  powerMw: positive("Power", "mW", 1e9).optional(),
  /** 1/e² diameter of the waist, which sits at the laser's position. */
  beamDiameterMm: positive("Beam diameter", "mm", 1000),
  m2: finite("M²").refine((v) => v >= 1, "M² must be at least 1").refine((v) => v <= 1000, "M² must be at most 1000").optional(),
  registerId: safeText().max(64, "Register id must be at most 64 characters").optional(),
  /** Pulsed lasers only: pulse duration (FWHM) in seconds. With it, powerMw is the average power. */
  pulseDurationS: positive("Pulse duration", "s", 10).optional(),
  /** Pulsed lasers only: pulse repetition rate in hertz; absent for a single pulse. */
  pulseRepetitionRateHz: positive("Pulse repetition rate", "Hz", 1e12).optional(),
  /** Pulsed lasers only: energy of one pulse in joules. Peak power (energy ÷ duration) has no upper cap. */
  pulseEnergyJ: positive("Pulse energy", "J", 1e6).optional(),
  /**
   * Trains in bursts only: pulses in each burst (a whole number ≥ 2), with burstPulseRateHz. pulseRepetitionRateHz
   * stays the average number of pulses per second (pulses per burst × bursts per second).
   */
  pulsesPerBurst: finite("Pulses per burst (pulsesPerBurst)")
    .refine(Number.isInteger, "Pulses per burst (pulsesPerBurst) must be a whole number")
    .refine((v) => v >= 2, "Pulses per burst (pulsesPerBurst) must be at least 2")
    .refine((v) => v <= 1e9, "Pulses per burst (pulsesPerBurst) must be at most 1e9")
    .optional(),
  /** Trains in bursts only: the pulse rate inside a burst, in hertz. */
  burstPulseRateHz: positive("Pulse rate inside a burst (burstPulseRateHz)", "Hz", 1e15).optional(),
  /** Further emission lines leaving with the main beam (residual pump, other harmonics); powerMw as for the main line. */
  lines: z
    .array(
      z.object({
        wavelengthNm: finite("Line wavelength").refine(
          (v) => v >= MIN_WAVELENGTH_NM && v <= MAX_WAVELENGTH_NM,
          `Line wavelength must be between ${MIN_WAVELENGTH_NM} nm and 1 mm (${MAX_WAVELENGTH_NM} nm)`,
        ),
        powerMw: positive("Line power", "mW", 1e9),
      }),
      { error: "lines must be a list" },
    )
    .max(16, "A laser may list at most 16 further lines")
    .optional(),
});

export const lensSchema = z.object({
  id: elementId,
  kind: z.literal("lens"),
  positionMm: position,
  /** Thin lens; negative for a diverging lens. */
  focalLengthMm: finite("Focal length")
    .refine((v) => Math.abs(v) >= 0.1, "Focal length must be at least 0.1 mm in magnitude (a lens cannot have zero focal length)")
    .refine((v) => Math.abs(v) <= 1e6, "Focal length must be at most 1 000 000 mm in magnitude"),
  /** Mount size: the beam is cut off outside this diameter. Optional; absent means unlimited in version 1. */
  clearApertureMm: positive("Clear aperture", "mm", 1000).optional(),
});

export const apertureSchema = z.object({
  id: elementId,
  kind: z.literal("aperture"),
  positionMm: position,
  /** Circular, opaque outside. */
  diameterMm: positive("Aperture diameter", "mm", 1000),
});

export const filterSchema = z.object({
  id: elementId,
  kind: z.literal("filter"),
  positionMm: position,
  /** Transmits 10^-OD (outside the bands below, if any are given). */
  opticalDensity: finite("Optical density")
    .refine((v) => v >= 0, "Optical density must be 0 or more")
    .refine((v) => v <= 20, "Optical density must be at most 20"),
  /** Mount size: the beam is cut off outside this diameter. Optional; absent means unlimited in version 1. */
  clearApertureMm: positive("Clear aperture", "mm", 1000).optional(),
  /** Optional OD per wavelength band; bands must not overlap (checked by checkFilterBands). */
  opticalDensityBands: z
    .array(
      z.object({
        fromNm: finite("Band start").refine((v) => v >= MIN_WAVELENGTH_NM && v <= MAX_WAVELENGTH_NM, `Band start must be between ${MIN_WAVELENGTH_NM} nm and ${MAX_WAVELENGTH_NM} nm`),
        toNm: finite("Band end").refine((v) => v >= MIN_WAVELENGTH_NM && v <= MAX_WAVELENGTH_NM, `Band end must be between ${MIN_WAVELENGTH_NM} nm and ${MAX_WAVELENGTH_NM} nm`),
        opticalDensity: finite("Band optical density")
          .refine((v) => v >= 0, "Band optical density must be 0 or more")
          .refine((v) => v <= 10, "Band optical density must be at most 10"),
      }),
      { error: "opticalDensityBands must be a list" },
    )
    .max(32, "A filter may list at most 32 bands")
    .optional(),
});

export const beamBlockSchema = z.object({ id: elementId, kind: z.literal("beam-block"), positionMm: position });
export const screenSchema = z.object({ id: elementId, kind: z.literal("screen"), positionMm: position });

export const ELEMENT_KINDS = ["laser", "lens", "aperture", "filter", "beam-block", "screen"] as const;
export type ElementKind = (typeof ELEMENT_KINDS)[number];

export const benchElementSchema = z.discriminatedUnion(
  "kind",
  [laserSchema, lensSchema, apertureSchema, filterSchema, beamBlockSchema, screenSchema],
  { error: `Element kind must be one of: ${ELEMENT_KINDS.join(", ")}` },
);

export const benchDocumentSchema = z
  .object({
    version: z.literal(1, { error: "version must be 1" }),
    title: safeText().max(200, "Title must be at most 200 characters").optional(),
    elements: z
      .array(benchElementSchema, { error: "elements must be a list" })
      .max(MAX_ELEMENTS, `A bench may hold at most ${MAX_ELEMENTS} elements`),
  })
  .superRefine((doc, ctx) => {
    const lasers = doc.elements.filter((e) => e.kind === "laser");
    if (lasers.length === 0) {
      ctx.addIssue({ code: "custom", path: ["elements"], message: "The bench needs exactly one laser; it has none" });
    } else if (lasers.length > 1) {
      ctx.addIssue({
        code: "custom",
        path: ["elements"],
        message: `The bench needs exactly one laser; it has ${lasers.length}`,
      });
    }
    doc.elements.forEach((e, i) => {
      if (e.kind === "laser") checkLaserFields(e, ctx, ["elements", i]);
      if (e.kind === "filter") checkFilterBands(e, ctx, ["elements", i]);
    });
    const seen = new Map<string, number>();
    doc.elements.forEach((e, i) => {
      const first = seen.get(e.id);
      if (first !== undefined) {
        ctx.addIssue({
          code: "custom",
          path: ["elements", i, "id"],
          message: `Element id "${e.id}" is used twice (also by element ${first + 1})`,
        });
      } else seen.set(e.id, i);
    });
  });

export type BenchDocument = z.infer<typeof benchDocumentSchema>;
export type BenchElement = z.infer<typeof benchElementSchema>;
export type LaserElement = z.infer<typeof laserSchema>;
export type LensElement = z.infer<typeof lensSchema>;
export type ApertureElement = z.infer<typeof apertureSchema>;
export type FilterElement = z.infer<typeof filterSchema>;

type IssueSink = { addIssue: (issue: { code: "custom"; path: (string | number)[]; message: string }) => void };

/**
 * Cross-field rules of a laser (kept out of laserSchema so it stays a plain object that can be picked or omitted):
 * power is needed unless a pulse energy is given; energy needs a duration; powerMw, pulseEnergyJ and
 * pulseRepetitionRateHz given together must agree within 1 %; pulses may not overlap (duration × rate < 1).
 */
export function checkLaserFields(
  laser: Pick<LaserElement, "powerMw" | "pulseEnergyJ" | "pulseDurationS" | "pulseRepetitionRateHz"> & Partial<Pick<LaserElement, "pulsesPerBurst" | "burstPulseRateHz">>,
  ctx: IssueSink,
  basePath: (string | number)[] = [],
): void {
  const { powerMw, pulseEnergyJ, pulseDurationS: τ, pulseRepetitionRateHz: f } = laser;
  checkBurst(laser, ctx, basePath);
  if (powerMw === undefined && pulseEnergyJ === undefined) {
    ctx.addIssue({ code: "custom", path: [...basePath, "powerMw"], message: "Power (powerMw) is required unless a single pulse is given by its energy (pulseEnergyJ)" });
  }
  if (pulseEnergyJ !== undefined && τ === undefined) {
    ctx.addIssue({ code: "custom", path: [...basePath, "pulseDurationS"], message: "A pulse energy needs a pulse duration" });
  }
  if (f !== undefined && τ === undefined) {
    ctx.addIssue({ code: "custom", path: [...basePath, "pulseDurationS"], message: "A pulse repetition rate needs a pulse duration" });
  }
  if (powerMw !== undefined && pulseEnergyJ !== undefined) {
    if (f === undefined) {
      ctx.addIssue({
        code: "custom",
        path: [...basePath, "powerMw"],
        message: "A single pulse has no average power: leave powerMw out, or give the pulse repetition rate of the train",
      });
    } else {
      const fromEnergyMw = pulseEnergyJ * f * 1000;
      const mismatch = Math.abs(powerMw - fromEnergyMw) / Math.max(powerMw, fromEnergyMw);
      if (mismatch > 0.01) {
        ctx.addIssue({
          code: "custom",
          path: [...basePath, "powerMw"],
          message: `Average power powerMw ${fmtNumber(powerMw)} mW disagrees with pulse energy × repetition rate (${fmtNumber(fromEnergyMw)} mW) by ${fmtNumber(mismatch * 100)} %; they must agree within 1 %`,
        });
      }
    }
  }
  if (τ !== undefined && f !== undefined && τ * f >= 1) {
    ctx.addIssue({
      code: "custom",
      path: [...basePath, "pulseRepetitionRateHz"],
      message: "Pulse duration × repetition rate must be below 1: at this rate the pulses would overlap. Enter the laser as continuous-wave instead",
    });
  }
}

/**
 * Bursts: both burst fields or neither, on a train (duration and rate); the pulses inside a burst may not overlap
 * (duration × rate inside < 1), the rate inside a burst is above the average rate, and one burst (n − 1 pulse gaps plus a
 * pulse) is shorter than the time from one burst to the next (n ÷ average rate). The laser register's form applies the same
 * rules to its entries (lib/server/register.ts).
 */
export function checkBurst(laser: Partial<Pick<LaserElement, "pulseDurationS" | "pulseRepetitionRateHz" | "pulsesPerBurst" | "burstPulseRateHz">>, ctx: IssueSink, basePath: (string | number)[]): void {
  const { pulsesPerBurst: n, burstPulseRateHz: fb, pulseDurationS: τ, pulseRepetitionRateHz: f } = laser;
  if (n === undefined && fb === undefined) return;
  if (n === undefined || fb === undefined) {
    const missing = n === undefined ? "pulsesPerBurst" : "burstPulseRateHz";
    ctx.addIssue({ code: "custom", path: [...basePath, missing], message: "Bursts need both the pulses per burst (pulsesPerBurst) and the pulse rate inside a burst (burstPulseRateHz)" });
    return;
  }
  if (τ === undefined || f === undefined) {
    ctx.addIssue({ code: "custom", path: [...basePath, "pulseRepetitionRateHz"], message: "Bursts need a pulse duration and the average pulse repetition rate (pulses per burst × bursts per second)" });
    return;
  }
  if (τ * fb >= 1) {
    ctx.addIssue({ code: "custom", path: [...basePath, "burstPulseRateHz"], message: "Pulse duration × the rate inside a burst must be below 1: the pulses in a burst would overlap" });
  }
  if (fb <= f) {
    ctx.addIssue({ code: "custom", path: [...basePath, "burstPulseRateHz"], message: "The pulse rate inside a burst (burstPulseRateHz) must be above the average pulse repetition rate" });
  } else if ((n - 1) / fb + τ >= n / f) {
    ctx.addIssue({
      code: "custom",
      path: [...basePath, "pulsesPerBurst"],
      message: `One burst (${fmtNumber(n)} pulses at ${fmtNumber(fb)} Hz) lasts as long as the time between bursts (${fmtNumber(n)} ÷ ${fmtNumber(f)} Hz): the bursts would run into each other`,
    });
  }
}

/** Bands of a filter: from < to, no two bands overlapping. */
export function checkFilterBands(filter: Pick<FilterElement, "opticalDensityBands">, ctx: IssueSink, basePath: (string | number)[] = []): void {
  const bands = filter.opticalDensityBands ?? [];
  bands.forEach((b, i) => {
    if (!(b.fromNm < b.toNm)) {
      ctx.addIssue({ code: "custom", path: [...basePath, "opticalDensityBands", i, "toNm"], message: "A band's end must be above its start" });
    }
  });
  const order = bands.map((b, i) => ({ ...b, i })).sort((a, b) => a.fromNm - b.fromNm);
  for (let k = 1; k < order.length; k++) {
    if (order[k].fromNm < order[k - 1].toNm) {
      ctx.addIssue({
        code: "custom",
        path: [...basePath, "opticalDensityBands", order[k].i, "fromNm"],
        message: `Band ${order[k].fromNm}–${order[k].toNm} nm overlaps band ${order[k - 1].fromNm}–${order[k - 1].toNm} nm`,
      });
    }
  }
}

function fmtNumber(x: number): string {
  return Number(x.toPrecision(4)).toString();
}

/** Field path + plain sentence, the shape every 400 response lists. */
export type FieldProblem = { path: string; message: string };

export function describeIssues(error: z.ZodError): FieldProblem[] {
  return error.issues.map((issue) => ({
    path: issue.path.map(String).join(".") || "(document)",
    message: issue.message,
  }));
}

// Version 2 (the optical table) lives in ./schema-v2 (it builds on the schemas above); its types are re-exported here.
export type { AnyBenchDocument, BenchDocumentV2, TableElement } from "./schema-v2";
