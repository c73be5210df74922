// A table's beams in words for the review screen, the build sheet and the technician's checklist: each path with its
// power, hazard band and eyewear OD, where every beam ends, the build order following the light, hole positions.
// Pure; the figures are the engines' (lib/optics analyzeBench, lib/safety assessBench), nothing is computed anew here.
import { ELEMENT_KIND_RECORDS } from "@/lib/bench/element-kinds";
import type { BenchDocumentV2, TableElement } from "@/lib/bench/schema-v2";
import type { TableAnalysis, TablePath } from "@/lib/optics/table";
import type { OpenBeam, TableSafetyAssessment } from "@/lib/safety/table";
import { formatNumber } from "@/lib/format";

const n = (v: number, digits = 3) => formatNumber(v, { digits });
const mm = (v: number) => String(Number(v.toFixed(1)));

export const kindNoun = (kind: string): string => ELEMENT_KIND_RECORDS[kind as TableElement["kind"]]?.noun ?? kind;
export const kindLabel = (kind: string): string => ELEMENT_KIND_RECORDS[kind as TableElement["kind"]]?.label ?? kind;

/** Angle folded into 0–360°. */
export const normalDeg = (deg: number): number => ((deg % 360) + 360) % 360;

const HEADINGS = ["to the right (+x)", "right and away", "away from the viewer (+y)", "left and away", "to the left (−x)", "left and toward the viewer", "toward the viewer (−y)", "right and toward the viewer"];

/** Which way a beam runs, seen from the front of the table: the nearest of eight headings and the exact angle. */
export function directionWords(deg: number): string {
  const a = normalDeg(deg);
  return `${HEADINGS[Math.round(a / 45) % 8]}, ${n(a, 4)}°`;
}

/** Which edge of the table a point on its border lies on. */
export function edgeWords(doc: BenchDocumentV2, point: { xMm: number; yMm: number }): string {
  const { widthMm, depthMm } = doc.table;
  const eps = 1e-6 * Math.max(widthMm, depthMm);
  if (point.yMm <= eps) return "front edge";
  if (point.yMm >= depthMm - eps) return "back edge";
  if (point.xMm <= eps) return "left edge";
  if (point.xMm >= widthMm - eps) return "right edge";
  return "edge";
}

/**
 * The hole nearest an element on the table's grid (holes half a pitch in from the front left corner, numbered from 1)
 * and how far the element stands off it. Common practice for breadboards; the table's own maker may count otherwise.
 */
export function holeOf(doc: BenchDocumentV2, point: { xMm: number; yMm: number }) {
  const pitch = doc.table.holePitchMm;
  const offset = pitch / 2;
  const column = Math.max(1, Math.round((point.xMm - offset) / pitch) + 1);
  const row = Math.max(1, Math.round((point.yMm - offset) / pitch) + 1);
  const dxMm = point.xMm - (offset + (column - 1) * pitch);
  const dyMm = point.yMm - (offset + (row - 1) * pitch);
  return { column, row, dxMm, dyMm, onHole: Math.abs(dxMm) < 0.05 && Math.abs(dyMm) < 0.05 };
}

/** "hole 5, 3" or "hole 5, 3 + (2.5, −1) mm". */
export function holeWords(doc: BenchDocumentV2, point: { xMm: number; yMm: number }): string {
  const h = holeOf(doc, point);
  const off = h.onHole ? "" : ` + (${mm(h.dxMm)}, ${mm(h.dyMm)}) mm`;
  return `hole ${h.column}, ${h.row}${off}`;
}

export type PathBand = "above-mpe" | "within-mpe" | "not-assessed";

export type PathRow = {
  id: string;
  laserId: string;
  parentPathId: string | null;
  startElementId: string;
  startKind: string;
  role: string;
  powerMw: number;
  directionDeg: number;
  lengthMm: number;
  band: PathBand;
  /** The highest eyewear OD the engine asks for anywhere on the path (floored at 0); null when not assessed. */
  opticalDensityRequired: number | null;
  /** The elements it meets, in order (the last may be where it ends). */
  elementIds: string[];
  end: BeamEnd;
};

export type BeamEnd =
  | { kind: "stop"; elementId: string; elementKind: string; words: string }
  | { kind: "edge"; xMm: number; yMm: number; open: OpenBeam | null; words: string }
  | { kind: "continues"; into: string[]; elementId: string; elementKind: string; words: string }
  | { kind: "cut"; reason: string; words: string };

const CUT_WORDS: Record<NonNullable<TablePath["cut"]>, string> = {
  power: "followed no further: below a millionth of the laser's power",
  generations: "followed no further: 64 turns and splits deep",
  "path-limit": "followed no further: the table holds more than 2 000 beam segments",
};

function endOf(doc: BenchDocumentV2, byId: Map<string, TableElement>, p: TablePath, open: OpenBeam | null): BeamEnd {
  const end = p.end;
  if ("elementId" in end) {
    const kind = byId.get(end.elementId)?.kind ?? "element";
    return { kind: "stop", elementId: end.elementId, elementKind: kind, words: `ends on ${kindNoun(kind)} ${end.elementId}` };
  }
  if ("edge" in end) {
    const words = `leaves the table at the ${edgeWords(doc, end.edge)}, (${mm(end.edge.xMm)}, ${mm(end.edge.yMm)}) mm, heading ${directionWords(p.directionDeg)}`;
    return { kind: "edge", xMm: end.edge.xMm, yMm: end.edge.yMm, open, words: open?.exceedsMpe ? `OPEN BEAM above the MPE: ${words}` : `open beam within the MPE: ${words}` };
  }
  const last = p.elementIds[p.elementIds.length - 1] ?? p.startElementId;
  const kind = byId.get(last)?.kind ?? "element";
  if (end.continuesAs.length === 0) return { kind: "cut", reason: p.cut ?? "power", words: `at ${kindNoun(kind)} ${last}: ${CUT_WORDS[p.cut ?? "power"]}` };
  const verb = kind === "mirror" ? "turned by" : kind === "beam-splitter" ? "split by" : kind === "window" ? "passes and is reflected by" : "continues at";
  return { kind: "continues", into: end.continuesAs, elementId: last, elementKind: kind, words: `${verb} ${kindNoun(kind)} ${last} into ${end.continuesAs.join(", ")}` };
}

/** Every path as a row: power, band, OD and end. */
export function pathRows(doc: BenchDocumentV2, analysis: TableAnalysis, safety: Pick<TableSafetyAssessment, "points" | "openBeams"> | null): PathRow[] {
  const byId = new Map(doc.elements.map((e) => [e.id, e]));
  const od = new Map<string, number>();
  for (const p of safety?.points ?? []) {
    if (p.opticalDensityRaw === null) continue;
    od.set(p.pathId, Math.max(od.get(p.pathId) ?? 0, p.opticalDensityRequired));
  }
  const openByPath = new Map((safety?.openBeams ?? []).map((o) => [o.pathId, o]));
  return analysis.paths.map((p) => {
    const open = openByPath.get(p.id) ?? null;
    let required: number | null = safety ? (od.get(p.id) ?? 0) : null;
    if (required !== null && open) required = Math.max(required, open.opticalDensityRequired);
    const band: PathBand = required === null ? "not-assessed" : required > 0 || open?.exceedsMpe ? "above-mpe" : "within-mpe";
    return {
      id: p.id,
      laserId: p.laserId,
      parentPathId: p.parentPathId,
      startElementId: p.startElementId,
      startKind: byId.get(p.startElementId)?.kind ?? "element",
      role: p.role,
      powerMw: p.powerMw,
      directionDeg: p.directionDeg,
      lengthMm: p.lengthMm,
      band,
      opticalDensityRequired: required,
      elementIds: p.elementIds,
      end: endOf(doc, byId, p, open),
    };
  });
}

/** "Every beam ends here": the paths that end (on a stop, at the table edge, or cut), one line each, open beams first. */
export function beamEnds(rows: readonly PathRow[]): PathRow[] {
  const rank = (r: PathRow) => (r.end.kind === "edge" ? (r.end.open?.exceedsMpe ? 0 : 1) : r.end.kind === "cut" ? 2 : 3);
  return rows.filter((r) => r.end.kind !== "continues").sort((a, b) => rank(a) - rank(b) || a.laserId.localeCompare(b.laserId) || a.id.localeCompare(b.id, undefined, { numeric: true }));
}

export type BuildStepV2 = {
  order: number;
  element: TableElement;
  /** The path that first reaches it (null for a laser, or for an element no beam reaches). */
  pathId: string | null;
  hole: string;
  angleDeg: number;
  /** Power arriving there, mW (null for a laser or an element no beam reaches). */
  powerMw: number | null;
  reached: boolean;
};

/**
 * The order to set a table up in, following the light: each laser, then every element in the order its beams reach
 * it (a split's arms one after the other, the reflected arm first as the trace numbers it), then what no beam reaches.
 */
export function buildOrderV2(doc: BenchDocumentV2, analysis: TableAnalysis): BuildStepV2[] {
  const byId = new Map(doc.elements.map((e) => [e.id, e]));
  const arriving = new Map<string, number>();
  for (const e of analysis.elements) if (!arriving.has(`${e.pathId}|${e.id}`)) arriving.set(`${e.pathId}|${e.id}`, e.incident.powerMw);
  const childrenOf = new Map<string | null, TablePath[]>();
  for (const p of analysis.paths) childrenOf.set(p.parentPathId, [...(childrenOf.get(p.parentPathId) ?? []), p]);
  const seen = new Set<string>();
  const steps: BuildStepV2[] = [];
  const push = (e: TableElement, pathId: string | null, powerMw: number | null, reached: boolean) => {
    if (seen.has(e.id)) return;
    seen.add(e.id);
    steps.push({ order: steps.length + 1, element: e, pathId, hole: holeWords(doc, e), angleDeg: normalDeg(e.angleDeg), powerMw, reached });
  };
  const walk = (p: TablePath) => {
    for (const id of p.elementIds) {
      const e = byId.get(id);
      if (e) push(e, p.id, arriving.get(`${p.id}|${id}`) ?? null, true);
    }
    for (const child of childrenOf.get(p.id) ?? []) walk(child);
  };
  for (const laser of doc.elements.filter((e) => e.kind === "laser")) {
    push(laser, null, null, true);
    for (const root of (childrenOf.get(null) ?? []).filter((p) => p.laserId === laser.id)) walk(root);
  }
  for (const e of doc.elements) push(e, null, null, false);
  return steps;
}

/** The settings of a table element in a few words (its kind's own fields), for lists and the checklist. */
export function tableElementSettings(e: TableElement): string {
  const fields = ELEMENT_KIND_RECORDS[e.kind].fields;
  const values = e as unknown as Record<string, unknown>;
  const parts = fields.flatMap((f) => (typeof values[f.key] === "number" ? [`${f.label.toLowerCase()} ${n(values[f.key] as number, 4)}${f.unit ? ` ${f.unit}` : ""}`] : []));
  if (typeof values.clearApertureMm === "number") parts.push(`clear aperture ${n(values.clearApertureMm as number, 4)} mm`);
  return parts.join(", ");
}
