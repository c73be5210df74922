// The build-sheet contract: the request body of the sheet route (zod) and the job it answers with, imported by the
// route handlers, lib/server/build-sheets.ts and the browser's download button alike (no server-only code).
import { z } from "zod";
import type { SheetState } from "@/db/schema";

export const PAPERS = ["A4", "Letter"] as const;
export type Paper = (typeof PAPERS)[number];

export const sheetRequestInput = z.object({
  paper: z.enum(PAPERS, { error: "Paper must be A4 or Letter" }).default("A4"),
});
export type SheetRequestInput = z.infer<typeof sheetRequestInput>;

/** A sheet job as the routes report it: queued, rendering (with progress), ready (with its download link) or failed. */
export type SheetView = {
  id: string;
  revisionId: string;
  contentHash: string;
  paper: Paper;
  state: SheetState;
  progressPercent: number;
  error: string | null;
  sizeBytes: number | null;
  updatedAt: string;
  downloadUrl: string | null;
};
