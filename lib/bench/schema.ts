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
  /** Continuous-wave output, or the average power of a pulsed laser. */
  powerMw: positive("Power", "mW", 1e9),
  /** 1/e² diameter of the waist, which sits at the laser's position. */
  beamDiameterMm: positive("Beam diameter", "mm", 1000),
  m2: finite("M²").refine((v) => v >= 1, "M² must be at least 1").refine((v) => v <= 1000, "M² must be at most 1000").optional(),
  registerId: safeText().max(64, "Register id must be at most 64 characters").optional(),
  /** Pulsed lasers only: pulse duration (FWHM) in seconds. With it, powerMw is the average power. */
  pulseDurationS: positive("Pulse duration", "s", 10).optional(),
  /** Pulsed lasers only: pulse repetition rate in hertz; absent for a single pulse. */
  pulseRepetitionRateHz: positive("Pulse repetition rate", "Hz", 1e12).optional(),
});

export const lensSchema = z.object({
  id: elementId,
  kind: z.literal("lens"),
  positionMm: position,
  /** Thin lens; negative for a diverging lens. */
  focalLengthMm: finite("Focal length")
    .refine((v) => Math.abs(v) >= 0.1, "Focal length must be at least 0.1 mm in magnitude (a lens cannot have zero focal length)")
    .refine((v) => Math.abs(v) <= 1e6, "Focal length must be at most 1 000 000 mm in magnitude"),
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
  /** Transmits 10^-OD. */
  opticalDensity: finite("Optical density")
    .refine((v) => v >= 0, "Optical density must be 0 or more")
    .refine((v) => v <= 20, "Optical density must be at most 20"),
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

/** Field path + plain sentence, the shape every 400 response lists. */
export type FieldProblem = { path: string; message: string };

export function describeIssues(error: z.ZodError): FieldProblem[] {
  return error.issues.map((issue) => ({
    path: issue.path.map(String).join(".") || "(document)",
    message: issue.message,
  }));
}
