// The same pure engines the server runs for POST /api/analyze, run in the browser for live predictions while a table
// is changed: the full analysis (optics and safety) in a worker, and the tracer alone (well under a frame) for the beams
// drawn during a drag. The server's answer replaces the browser's as soon as it arrives for the same drawing.
import { benchDocumentV2Schema, type BenchDocumentV2 } from "@/lib/bench/schema-v2";
import { laserBeamPowerMw } from "@/lib/bench/laser-power";
import { analyzeBench, traceTable, type TableAnalysis } from "@/lib/optics";
import { assessBench, type TableSafetyAssessment } from "@/lib/safety";
import type { BeamSegment } from "./table-geometry";

/** What the editor shows for a table: the analysis and, when it could be assessed, the safety (its fixed limitations left out, as the server does). */
export type TablePredictions = { analysis: TableAnalysis; safety?: Omit<TableSafetyAssessment, "limitations"> };

/** Optics and safety of a table, exactly as POST /api/analyze computes them. Throws the schema's sentence for a bad document. */
export function predictTable(input: unknown): TablePredictions {
  const parsed = benchDocumentV2Schema.safeParse(input);
  if (!parsed.success) throw new Error(parsed.error.issues[0]?.message ?? "The table is not complete.");
  const doc = parsed.data;
  const analysis = analyzeBench(doc);
  try {
    const { limitations: _limitations, ...safety } = assessBench(doc, analysis);
    return { analysis, safety };
  } catch {
    return { analysis };
  }
}

/** A beam run as the drag draws it: its segment and the power it starts with. */
export type LiveBeam = BeamSegment & { laserId: string; powerMw: number; open: boolean };

/**
 * Every straight run of light on the table from the tracer alone: geometry and power at the start of each run (from the
 * branch shares and filters). Needs no valid document beyond placed elements; lasers without a usable power count as 0.
 */
export function traceBeams(doc: BenchDocumentV2): LiveBeam[] {
  if (!doc.elements.some((e) => e.kind === "laser")) return [];
  let trace;
  try {
    trace = traceTable(doc);
  } catch {
    return [];
  }
  const powerOf = new Map<string, number>();
  for (const e of doc.elements) {
    if (e.kind !== "laser") continue;
    let p = 0;
    try {
      p = laserBeamPowerMw(e);
    } catch {
      p = 0;
    }
    powerOf.set(e.id, Number.isFinite(p) ? p : 0);
  }
  return trace.paths.map((p) => ({
    pathId: p.id,
    laserId: p.laserId,
    from: p.start,
    to: p.endPoint,
    directionDeg: p.directionDeg,
    powerMw: (powerOf.get(p.laserId) ?? 0) * p.shareOfLaser,
    open: "edge" in p.end,
  }));
}
