// The bench document, version 2: an optical table seen from above, with mirrors, beam splitters, windows and several lasers.
// Contract: the bench document contract "The table in two dimensions"; coordinates in mm from the table's left front corner, angles counter-clockwise from +x.
import { z } from "zod";
import { safeText } from "@/lib/validation/text";
import {
  apertureSchema,
  beamBlockSchema,
  checkFilterBands,
  checkLaserFields,
  filterSchema,
  laserSchema,
  lensSchema,
  MAX_POSITION_MM,
  screenSchema,
  benchDocumentSchema,
  type BenchDocument,
} from "./schema";

const benchDocumentSchemaV1 = () => benchDocumentSchema;

export const MAX_TABLE_ELEMENTS = 500;
/** Largest table side: 20 m covers any optical table or breadboard (and a corridor run). */
export const MAX_TABLE_SIDE_MM = 20_000;
/** Two element centres closer than this are "on the same spot": no two mounts fit there. */
export const SAME_SPOT_MM = 1;
/** Clear aperture of an optical element when the document gives none: one inch (common practice). */
export const DEFAULT_CLEAR_APERTURE_MM = 25.4;

const finite = (field: string) =>
  z.number({ error: `${field} must be a number` }).refine(Number.isFinite, `${field} must be a finite number`);

const positive = (field: string, unit: string, max: number) =>
  finite(field)
    .refine((v) => v > 0, `${field} must be greater than 0 ${unit}`)
    .refine((v) => v <= max, `${field} must be at most ${max} ${unit}`);

const coordinate = (field: string) =>
  finite(field).refine((v) => Math.abs(v) <= MAX_POSITION_MM, `${field} must lie within ±${MAX_POSITION_MM} mm`);

/** Where an element stands and which way it faces: every version 2 element has these. */
const placement = {
  xMm: coordinate("x"),
  yMm: coordinate("y"),
  /** Laser: the direction it emits. Every other element: the direction of its face normal. Counter-clockwise from +x. */
  angleDeg: finite("Angle").refine((v) => Math.abs(v) <= 3600, "Angle must lie within ±3600°"),
};

const clearAperture = {
  /** Length of the element's face in the table plane; a beam whose axis misses it passes the element by. Default 25.4 mm. */
  clearApertureMm: positive("Clear aperture", "mm", 1000).optional(),
};

export const tableSchema = z.object(
  {
    widthMm: positive("Table width", "mm", MAX_TABLE_SIDE_MM),
    depthMm: positive("Table depth", "mm", MAX_TABLE_SIDE_MM),
    /** Distance between mounting holes: 25 mm on metric tables, 25.4 mm on imperial ones. */
    holePitchMm: positive("Hole pitch", "mm", 1000),
  },
  { error: "table must give widthMm, depthMm and holePitchMm" },
);

/** The version 1 laser (with its further `lines`) less positionMm, placed on the table. */
export const laserV2Schema = laserSchema.omit({ positionMm: true }).extend(placement);
export const lensV2Schema = lensSchema.omit({ positionMm: true }).extend({ ...placement, ...clearAperture });
export const apertureV2Schema = apertureSchema.omit({ positionMm: true }).extend({ ...placement, ...clearAperture });
export const filterV2Schema = filterSchema.omit({ positionMm: true }).extend({ ...placement, ...clearAperture });
export const beamBlockV2Schema = beamBlockSchema.omit({ positionMm: true }).extend({ ...placement, ...clearAperture });
export const screenV2Schema = screenSchema.omit({ positionMm: true }).extend({ ...placement, ...clearAperture });

const elementId = safeText({ error: "Element id must be text" })
  .min(1, "Element id must not be empty")
  .max(64, "Element id must be at most 64 characters");

// Ranges of the shares are checked in the document's superRefine so the message can name the element.
export const mirrorSchema = z.object({
  id: elementId,
  kind: z.literal("mirror"),
  ...placement,
  ...clearAperture,
  /** Flat mirror; reflected share, default 0.99; the rest is absorbed. */
  reflectance: finite("Reflectance").optional(),
});
export const beamSplitterSchema = z.object({
  id: elementId,
  kind: z.literal("beam-splitter"),
  ...placement,
  ...clearAperture,
  /** Reflected share (0–1); the rest goes straight on. */
  reflectance: finite("Reflectance"),
});
export const windowSchema = z.object({
  id: elementId,
  kind: z.literal("window"),
  ...placement,
  ...clearAperture,
  /** Reflectance of each surface, default 0.04 (uncoated glass near normal incidence, common practice). */
  reflectancePerSurface: finite("Reflectance per surface").optional(),
});

export const TABLE_ELEMENT_KINDS = ["laser", "lens", "aperture", "filter", "beam-block", "screen", "mirror", "beam-splitter", "window"] as const;
export type TableElementKind = (typeof TABLE_ELEMENT_KINDS)[number];

export const tableElementSchema = z.discriminatedUnion(
  "kind",
  [laserV2Schema, lensV2Schema, apertureV2Schema, filterV2Schema, beamBlockV2Schema, screenV2Schema, mirrorSchema, beamSplitterSchema, windowSchema],
  { error: `Element kind must be one of: ${TABLE_ELEMENT_KINDS.join(", ")}` },
);

const KIND_WORDS: Record<TableElementKind, string> = {
  laser: "Laser",
  lens: "Lens",
  aperture: "Aperture",
  filter: "Filter",
  "beam-block": "Beam block",
  screen: "Screen",
  mirror: "Mirror",
  "beam-splitter": "Beam splitter",
  window: "Window",
};
const fmt = (v: number) => String(Number(v.toPrecision(6)));

export const benchDocumentV2Schema = z
  .object({
    version: z.literal(2, { error: "version must be 2" }),
    title: safeText().max(200, "Title must be at most 200 characters").optional(),
    table: tableSchema,
    elements: z
      .array(tableElementSchema, { error: "elements must be a list" })
      .max(MAX_TABLE_ELEMENTS, `A table may hold at most ${MAX_TABLE_ELEMENTS} elements`),
  })
  .superRefine((doc, ctx) => {
    const lasers = doc.elements.filter((e) => e.kind === "laser");
    if (lasers.length === 0) ctx.addIssue({ code: "custom", path: ["elements"], message: "The table needs at least one laser; it has none" });
    const seen = new Map<string, number>();
    const { widthMm, depthMm } = doc.table;
    doc.elements.forEach((e, i) => {
      const name = `${KIND_WORDS[e.kind]} "${e.id}"`;
      const first = seen.get(e.id);
      if (first !== undefined) {
        ctx.addIssue({ code: "custom", path: ["elements", i, "id"], message: `Element id "${e.id}" is used twice (also by element ${first + 1})` });
      } else seen.set(e.id, i);
      if (e.xMm < 0 || e.xMm > widthMm || e.yMm < 0 || e.yMm > depthMm) {
        ctx.addIssue({
          code: "custom",
          path: ["elements", i, e.xMm < 0 || e.xMm > widthMm ? "xMm" : "yMm"],
          message: `${name} at (${fmt(e.xMm)}, ${fmt(e.yMm)}) mm is off the table, which spans 0–${fmt(widthMm)} mm in x and 0–${fmt(depthMm)} mm in y`,
        });
      }
      // The pulse and band rules of version 1 (contract revision 2) hold for version 2 too.
      if (e.kind === "laser") checkLaserFields(e, ctx, ["elements", i]);
      if (e.kind === "filter") checkFilterBands(e, ctx, ["elements", i]);
      if (e.kind === "beam-splitter" && !(e.reflectance >= 0 && e.reflectance <= 1)) {
        ctx.addIssue({ code: "custom", path: ["elements", i, "reflectance"], message: `${name}: reflectance must be between 0 and 1 (it is ${fmt(e.reflectance)})` });
      }
      if (e.kind === "mirror" && e.reflectance !== undefined && !(e.reflectance >= 0 && e.reflectance <= 1)) {
        ctx.addIssue({ code: "custom", path: ["elements", i, "reflectance"], message: `${name}: reflectance must be between 0 and 1 (it is ${fmt(e.reflectance)})` });
      }
      if (e.kind === "window" && e.reflectancePerSurface !== undefined && !(e.reflectancePerSurface >= 0 && e.reflectancePerSurface <= 1)) {
        ctx.addIssue({
          code: "custom",
          path: ["elements", i, "reflectancePerSurface"],
          message: `${name}: reflectance per surface must be between 0 and 1 (it is ${fmt(e.reflectancePerSurface)})`,
        });
      }
    });
    // Two mounts on the same spot: sort by x so only near neighbours are compared (500 elements stay cheap).
    const order = doc.elements.map((e, i) => i).sort((a, b) => doc.elements[a].xMm - doc.elements[b].xMm);
    for (let a = 0; a < order.length; a++) {
      const ea = doc.elements[order[a]];
      for (let b = a + 1; b < order.length; b++) {
        const eb = doc.elements[order[b]];
        if (eb.xMm - ea.xMm >= SAME_SPOT_MM) break;
        if (Math.hypot(eb.xMm - ea.xMm, eb.yMm - ea.yMm) < SAME_SPOT_MM) {
          const later = Math.max(order[a], order[b]);
          const other = doc.elements[later === order[a] ? order[b] : order[a]];
          const self = doc.elements[later];
          ctx.addIssue({
            code: "custom",
            path: ["elements", later, "xMm"],
            message: `${KIND_WORDS[self.kind]} "${self.id}" and ${KIND_WORDS[other.kind].toLowerCase()} "${other.id}" stand on the same spot (${fmt(self.xMm)}, ${fmt(self.yMm)}) mm; move one of them`,
          });
        }
      }
    }
  });

export type BenchDocumentV2 = z.infer<typeof benchDocumentV2Schema>;
export type TableElement = z.infer<typeof tableElementSchema>;
export type LaserV2Element = z.infer<typeof laserV2Schema>;
export type MirrorElement = z.infer<typeof mirrorSchema>;
export type BeamSplitterElement = z.infer<typeof beamSplitterSchema>;
export type WindowElement = z.infer<typeof windowSchema>;
export type TableGeometry = z.infer<typeof tableSchema>;

/** A version 1 bench as a version 2 table: the rail along +x at y = 0 (positions kept as x), every element facing +x. */
export function tableFromRail(doc: BenchDocument, options: { yMm?: number } = {}): BenchDocumentV2 {
  const yMm = options.yMm ?? 0;
  const xs = doc.elements.map((e) => e.positionMm);
  const minX = Math.min(0, ...xs);
  const maxX = Math.max(1, ...xs);
  const elements = doc.elements.map((e): TableElement => {
    const { positionMm, ...rest } = e;
    return { ...rest, xMm: positionMm - minX, yMm, angleDeg: 0 } as TableElement;
  });
  return {
    version: 2,
    ...(doc.title === undefined ? {} : { title: doc.title }),
    table: { widthMm: maxX - minX, depthMm: Math.max(2 * yMm, 1), holePitchMm: 25 },
    elements,
  };
}

/** Either version of the bench document, chosen by `version`: what POST /api/analyze accepts. */
export const anyBenchDocumentSchema = z.discriminatedUnion("version", [benchDocumentSchemaV1(), benchDocumentV2Schema], {
  error: "version must be 1 (a straight rail) or 2 (an optical table)",
});
export type AnyBenchDocument = z.infer<typeof anyBenchDocumentSchema>;

export const isTableDocument = (doc: { version: number }): doc is BenchDocumentV2 => doc.version === 2;
