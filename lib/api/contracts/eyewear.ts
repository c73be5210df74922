// The eyewear contract: the request body of an eyewear item (zod, each message naming its field) and the item as the
// routes answer with it, imported by the route handlers, lib/server/eyewear.ts and the browser's form alike (no
// server-only code here).
import { z } from "zod";
import { eyewearBandsSchema, eyewearNameSchema } from "@/lib/safety/eyewear";
import { safeText } from "@/lib/validation/text";

export const eyewearInput = z.object({
  labId: z.uuid({ error: "Lab (labId): choose the lab that keeps the eyewear" }),
  name: eyewearNameSchema,
  quantity: z
    .number({ error: "Quantity (quantity) must be a whole number" })
    .int("Quantity (quantity) must be a whole number")
    .min(1, "Quantity (quantity) must be at least 1")
    .max(1000, "Quantity (quantity) must be at most 1000")
    .default(1),
  note: safeText({ error: "Note (note) must be text" })
    .trim()
    .max(500, "Note (note) must be at most 500 characters")
    .nullish()
    .transform((v) => (v ? v : null)),
  bands: eyewearBandsSchema,
});
export type EyewearInput = z.infer<typeof eyewearInput>;

export const eyewearUpdateInput = eyewearInput.extend({
  version: z.number({ error: "Version (version): send the version you edited" }).int("Version (version) must be a whole number").min(1, "Version (version) must be at least 1"),
});
export type EyewearUpdateInput = z.infer<typeof eyewearUpdateInput>;

// ── Views ─────────────────────────────────────────────────────────────────────────────────────
export type EyewearBandView = { fromNm: number; toNm: number; opticalDensity: number; en207ScaleNumber: number | null };
export type EyewearView = {
  id: string;
  labId: string;
  labName: string;
  name: string;
  quantity: number;
  note: string | null;
  bands: EyewearBandView[];
  version: number;
  updatedAt: string;
};
