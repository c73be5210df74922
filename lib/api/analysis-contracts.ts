// Request bodies of the analysis endpoints (finder, beam safety), shared by the route handlers
// and the browser. The bench document itself is lib/bench/schema.ts.
import { z } from "zod";
import { safeText } from "@/lib/validation/text";
import { benchDocumentSchema, MAX_POSITION_MM } from "@/lib/bench/schema";
import { anyBenchDocumentSchema } from "@/lib/bench/schema-v2";

/** POST /api/analyze: a bench document of either version (1: a rail; 2: a table with paths and open beams). */
export const analyzeRequestSchema = anyBenchDocumentSchema;
export type AnalyzeRequest = z.infer<typeof analyzeRequestSchema>;

const positionMm = (field: string) =>
  z
    .number({ error: `${field} must be a number in millimetres` })
    .refine(Number.isFinite, `${field} must be a finite number`)
    .refine((v) => Math.abs(v) <= MAX_POSITION_MM, `${field} must lie within ±${MAX_POSITION_MM} mm`);

export const finderRequestSchema = z.discriminatedUnion(
  "goal",
  [
    z.object({
      goal: z.literal("screen-positions"),
      document: benchDocumentSchema,
      apertureId: safeText().min(1, "apertureId must name an aperture"),
      fromMm: positionMm("fromMm"),
      toMm: positionMm("toMm"),
      maxResults: z.number().int().min(1, "maxResults must be at least 1").max(50, "maxResults must be at most 50").optional(),
    }),
    z.object({
      goal: z.literal("aperture-diameter"),
      document: benchDocumentSchema,
      apertureId: safeText().min(1, "apertureId must name an aperture"),
      zones: z.number().int("zones must be a whole number").min(1, "zones must be at least 1").max(10_000, "zones must be at most 10 000"),
      screenPositionMm: positionMm("screenPositionMm").optional(),
    }),
    z.object({
      goal: z.literal("aperture-position"),
      document: benchDocumentSchema,
      apertureId: safeText().min(1, "apertureId must name an aperture"),
      zones: z.number().int("zones must be a whole number").min(1, "zones must be at least 1").max(10_000, "zones must be at most 10 000"),
      screenPositionMm: positionMm("screenPositionMm").optional(),
      fromMm: positionMm("fromMm").optional(),
      toMm: positionMm("toMm").optional(),
    }),
  ],
  { error: "goal must be one of: screen-positions, aperture-diameter, aperture-position" },
);

export type FinderRequest = z.infer<typeof finderRequestSchema>;
