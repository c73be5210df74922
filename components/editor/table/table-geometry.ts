// The table editor's geometry, without React or the canvas: where the holes are, snapping a dragged element to a hole
// or onto a beam, turning by a handle or a key, moving by a key, and where a new element goes. Table millimetres,
// origin at the left front corner, y away from the viewer, angles counter-clockwise from +x (the bench document contract).
import { ELEMENT_KIND_RECORDS } from "@/lib/bench/element-kinds";
import type { BenchDocumentV2, TableElement, TableElementKind, TableGeometry } from "@/lib/bench/schema-v2";

export type PointMm = { xMm: number; yMm: number };
/** A straight run of light on the plan: from, to, and its direction of travel. */
export type BeamSegment = { pathId: string; from: PointMm; to: PointMm; directionDeg: number };

/** Metric tables have holes every 25 mm, imperial ones every inch (common practice). */
export const HOLE_PITCHES = [
  { value: 25, label: "Metric, 25 mm holes" },
  { value: 25.4, label: "Imperial, 1 inch holes" },
] as const;

/** A new table: a 900 × 600 mm breadboard, a common size (common practice). */
export const NEW_TABLE: TableGeometry = { widthMm: 900, depthMm: 600, holePitchMm: 25 };

/** Turning steps: the handle and R snap to 45°; the fine keys turn by 1° (Shift: 0.1°). */
export const COARSE_STEP_DEG = 45;
export const FINE_STEP_DEG = 1;
export const FINEST_STEP_DEG = 0.1;

/** Positions are kept to the micrometre and angles to a thousandth of a degree, so repeated moves add no float noise. */
export const roundMm = (mm: number): number => Math.round(mm * 1000) / 1000;
export const roundDeg = (deg: number): number => Math.round(deg * 1000) / 1000;

/** An angle in [0, 360). */
export function normalDeg(deg: number): number {
  const n = ((deg % 360) + 360) % 360;
  return roundDeg(Math.abs(n - 360) < 1e-9 ? 0 : n);
}

/** The first hole sits half a pitch in from each edge, as on common breadboards (the same grid the plan draws). */
export const holeOffsetMm = (pitchMm: number): number => pitchMm / 2;

/** The hole nearest to a point, kept on the table. */
export function snapToHole(p: PointMm, table: TableGeometry): PointMm {
  const pitch = table.holePitchMm;
  const off = holeOffsetMm(pitch);
  const one = (v: number, sizeMm: number) => {
    const last = Math.max(0, Math.floor((sizeMm - off) / pitch));
    const k = Math.min(last, Math.max(0, Math.round((v - off) / pitch)));
    return roundMm(off + k * pitch);
  };
  return { xMm: one(p.xMm, table.widthMm), yMm: one(p.yMm, table.depthMm) };
}

/** The hole numbers of a point (column and row, from 1 at the left front corner); null off the grid. */
export function holeOf(p: PointMm, table: TableGeometry): { column: number; row: number } | null {
  const pitch = table.holePitchMm;
  const off = holeOffsetMm(pitch);
  const c = (p.xMm - off) / pitch;
  const r = (p.yMm - off) / pitch;
  if (Math.abs(c - Math.round(c)) > 1e-6 || Math.abs(r - Math.round(r)) > 1e-6 || c < -1e-6 || r < -1e-6) return null;
  return { column: Math.round(c) + 1, row: Math.round(r) + 1 };
}

/** The nearest point of a segment to p, and its distance. */
export function nearestOnSegment(p: PointMm, s: BeamSegment): { point: PointMm; distanceMm: number; t: number } {
  const dx = s.to.xMm - s.from.xMm;
  const dy = s.to.yMm - s.from.yMm;
  const len2 = dx * dx + dy * dy;
  const t = len2 === 0 ? 0 : Math.min(1, Math.max(0, ((p.xMm - s.from.xMm) * dx + (p.yMm - s.from.yMm) * dy) / len2));
  const point = { xMm: s.from.xMm + t * dx, yMm: s.from.yMm + t * dy };
  return { point, distanceMm: Math.hypot(p.xMm - point.xMm, p.yMm - point.yMm), t };
}

/** The beam segment nearest to p within toleranceMm, if any. */
export function nearestBeam(p: PointMm, beams: readonly BeamSegment[], toleranceMm: number): { beam: BeamSegment; point: PointMm; distanceMm: number } | null {
  let best: { beam: BeamSegment; point: PointMm; distanceMm: number } | null = null;
  for (const beam of beams) {
    const near = nearestOnSegment(p, beam);
    if (near.distanceMm <= toleranceMm && (!best || near.distanceMm < best.distanceMm)) best = { beam, point: near.point, distanceMm: near.distanceMm };
  }
  return best;
}

export type SnapMode = "holes" | "free";
export type Snapped = { point: PointMm; onBeam: BeamSegment | null };

/**
 * Where a dragged element lands. Near a beam (within toleranceMm of its axis) it goes onto the axis: a beam along x
 * or y keeps the element on the hole line it runs along, and the other coordinate is snapped to the holes; a slanted
 * beam takes the nearest point of its axis. Elsewhere it snaps to the nearest hole (or, free, to 0.1 mm). Always on the table.
 */
export function snapPlacement(p: PointMm, table: TableGeometry, beams: readonly BeamSegment[], toleranceMm: number, mode: SnapMode = "holes"): Snapped {
  const clampToTable = (q: PointMm): PointMm => ({
    xMm: roundMm(Math.min(table.widthMm, Math.max(0, q.xMm))),
    yMm: roundMm(Math.min(table.depthMm, Math.max(0, q.yMm))),
  });
  const near = nearestBeam(p, beams, toleranceMm);
  if (near) {
    const d = normalDeg(near.beam.directionDeg);
    const alongX = d === 0 || d === 180;
    const alongY = d === 90 || d === 270;
    if (mode === "holes" && (alongX || alongY)) {
      const hole = snapToHole(near.point, table);
      const snapped = alongX ? { xMm: hole.xMm, yMm: near.point.yMm } : { xMm: near.point.xMm, yMm: hole.yMm };
      // the hole may lie just past the segment's end (a run ending on an element): stay on the run
      const back = nearestOnSegment(snapped, near.beam);
      return { point: clampToTable(back.distanceMm < 1e-6 ? snapped : near.point), onBeam: near.beam };
    }
    return { point: clampToTable(near.point), onBeam: near.beam };
  }
  if (mode === "holes") return { point: snapToHole(p, table), onBeam: null };
  return { point: clampToTable({ xMm: Math.round(p.xMm * 10) / 10, yMm: Math.round(p.yMm * 10) / 10 }), onBeam: null };
}

/** An element placed on a beam faces it: its normal points back along the beam (how the rail's elements stand). */
export const facingBeamDeg = (beam: BeamSegment): number => normalDeg(beam.directionDeg + 180);

/** Whether a kind is turned to face a beam it is dropped onto (lenses, irises, filters, blocks, screens; not lasers or turning optics). */
export const facesBeamWhenDropped = (kind: TableElementKind): boolean => {
  const action = ELEMENT_KIND_RECORDS[kind].action;
  return action === "transmit" || action === "stop";
};

/** The angle the rotate handle gives for a pointer at p around centre c: whole 45° steps, or (fine) to 0.1°. */
export function handleAngle(c: PointMm, p: PointMm, fine: boolean): number {
  const raw = (Math.atan2(p.yMm - c.yMm, p.xMm - c.xMm) * 180) / Math.PI;
  if (fine) return normalDeg(Math.round(raw / FINEST_STEP_DEG) * FINEST_STEP_DEG);
  return normalDeg(Math.round(raw / COARSE_STEP_DEG) * COARSE_STEP_DEG);
}

/**
 * Turning by a key: a coarse step goes to the next multiple of 45° in that direction (so an element at 30° goes to 45°,
 * not 75°); a fine step adds its size. +1 is counter-clockwise.
 */
export function turnBy(angleDeg: number, sign: 1 | -1, step: "coarse" | "fine" | "finest"): number {
  if (step === "coarse") {
    const k = angleDeg / COARSE_STEP_DEG;
    const next = sign > 0 ? Math.floor(k + 1e-9) + 1 : Math.ceil(k - 1e-9) - 1;
    return normalDeg(next * COARSE_STEP_DEG);
  }
  return normalDeg(angleDeg + sign * (step === "fine" ? FINE_STEP_DEG : FINEST_STEP_DEG));
}

/** Moving by an arrow key: one hole pitch, or (fine) 1 mm. Screen up is table +y. */
export function arrowDelta(key: string, pitchMm: number, fine: boolean): PointMm | null {
  const step = fine ? 1 : pitchMm;
  switch (key) {
    case "ArrowLeft":
      return { xMm: -step, yMm: 0 };
    case "ArrowRight":
      return { xMm: step, yMm: 0 };
    case "ArrowUp":
      return { xMm: 0, yMm: step };
    case "ArrowDown":
      return { xMm: 0, yMm: -step };
    default:
      return null;
  }
}

/** Moves elements by a delta and keeps each on the table; returns the new positions by id. */
export function movedBy(elements: readonly TableElement[], ids: readonly string[], delta: PointMm, table: TableGeometry): Record<string, PointMm> {
  const out: Record<string, PointMm> = {};
  for (const e of elements) {
    if (!ids.includes(e.id)) continue;
    out[e.id] = {
      xMm: roundMm(Math.min(table.widthMm, Math.max(0, e.xMm + delta.xMm))),
      yMm: roundMm(Math.min(table.depthMm, Math.max(0, e.yMm + delta.yMm))),
    };
  }
  return out;
}

/** Element centres closer than this are taken as one spot by the placement of new elements. */
const TAKEN_MM = 1;

/**
 * Where a new element goes when it is clicked in the palette: a laser at the left, a row above the others, aiming +x;
 * anything else on the last beam's axis one hole pitch (at least 50 mm) past the last element it reaches, or, with
 * no beam, at the first free hole near the middle. Always a free spot on the table.
 */
export function placementFor(kind: TableElementKind, doc: BenchDocumentV2, beams: readonly BeamSegment[]): { xMm: number; yMm: number; angleDeg: number } {
  const { table } = doc;
  const taken = (p: PointMm) => doc.elements.some((e) => Math.hypot(e.xMm - p.xMm, e.yMm - p.yMm) < TAKEN_MM);
  const freeHoleNear = (p: PointMm): PointMm => {
    const start = snapToHole(p, table);
    if (!taken(start)) return start;
    const pitch = table.holePitchMm;
    for (let ring = 1; ring < 200; ring++) {
      for (let dx = -ring; dx <= ring; dx++) {
        for (let dy = -ring; dy <= ring; dy++) {
          if (Math.max(Math.abs(dx), Math.abs(dy)) !== ring) continue;
          const q = { xMm: start.xMm + dx * pitch, yMm: start.yMm + dy * pitch };
          if (q.xMm < 0 || q.yMm < 0 || q.xMm > table.widthMm || q.yMm > table.depthMm) continue;
          const s = snapToHole(q, table);
          if (!taken(s)) return s;
        }
      }
    }
    return start;
  };
  if (kind === "laser") {
    const lasers = doc.elements.filter((e) => e.kind === "laser").length;
    const at = freeHoleNear({ xMm: Math.min(table.widthMm * 0.1 + 50, table.widthMm / 2), yMm: table.depthMm / 2 - lasers * 4 * table.holePitchMm });
    return { ...at, angleDeg: 0 };
  }
  // the last beam that leaves the table or ends: go onto it, short of its end
  const open = [...beams].reverse().find((b) => Math.hypot(b.to.xMm - b.from.xMm, b.to.yMm - b.from.yMm) > 2 * table.holePitchMm);
  if (open) {
    const len = Math.hypot(open.to.xMm - open.from.xMm, open.to.yMm - open.from.yMm);
    const stepMm = Math.max(2 * table.holePitchMm, 50);
    const t = Math.min(1, stepMm / len);
    const raw = { xMm: open.from.xMm + t * (open.to.xMm - open.from.xMm), yMm: open.from.yMm + t * (open.to.yMm - open.from.yMm) };
    const snapped = snapPlacement(raw, table, [open], 1, "holes").point;
    if (!taken(snapped)) {
      const angleDeg = facesBeamWhenDropped(kind) ? facingBeamDeg(open) : kind === "mirror" || kind === "beam-splitter" ? normalDeg(open.directionDeg + 135) : facingBeamDeg(open);
      return { ...snapped, angleDeg };
    }
  }
  return { ...freeHoleNear({ xMm: table.widthMm / 2, yMm: table.depthMm / 2 }), angleDeg: 180 };
}

/** A version 1 bench laid on a table: the rail along +x on the middle hole row, 100 mm in from the left, on a table big enough. */
export function railOnTable(elements: readonly { positionMm: number }[], pitchMm = 25): { table: TableGeometry; xOffsetMm: number; yMm: number } {
  const xs = elements.map((e) => e.positionMm);
  const minX = xs.length ? Math.min(...xs) : 0;
  const maxX = xs.length ? Math.max(...xs) : 0;
  const marginMm = 100;
  const widthMm = Math.max(NEW_TABLE.widthMm, Math.ceil((maxX - minX + 2 * marginMm) / 300) * 300);
  const depthMm = NEW_TABLE.depthMm;
  const off = holeOffsetMm(pitchMm);
  const yMm = roundMm(off + Math.round((depthMm / 2 - off) / pitchMm) * pitchMm);
  return { table: { widthMm, depthMm, holePitchMm: pitchMm }, xOffsetMm: marginMm - minX, yMm };
}

/** Angle of a laser's beam or an element's normal as a unit vector. */
export const unit = (deg: number): PointMm => ({ xMm: Math.cos((deg * Math.PI) / 180), yMm: Math.sin((deg * Math.PI) / 180) });
