// The ray tracer of the optical table: every straight run of light from every laser, where it turns, splits and ends.
// Geometry: a ray meets a flat face where (o + t·d − c)·n = 0; a flat mirror reflects d' = d − 2(d·n)n (Hecht, Optics, 5th ed., §4.3); shares per lib/bench/element-kinds.ts.
//
// Each run leaves an element (the laser, or the mirror, splitter or window that turned it) and meets, in order of
// distance, every element whose face its axis crosses within half the clear aperture, until one stops or turns it
// or it leaves the table. The start element itself is never met again on the same run (a flat face cannot be).
// Breadth-first, so generation n is finished before n + 1; bounded by MAX_GENERATIONS, MAX_PATHS and the power floor.
import type { BenchDocumentV2, LaserV2Element, TableElement } from "@/lib/bench/schema-v2";
import { branchesOf, clearApertureOf, kindRecord, kindWord, type Branch } from "@/lib/bench/element-kinds";

/** Runs weaker than this share of their laser's power are not followed (the bench document contract). */
export const MIN_SHARE_OF_LASER = 1e-6;
/** A run turned more often than this is not followed (the bench document contract): a ring of mirrors must stop. */
export const MAX_GENERATIONS = 64;
/** At most this many straight runs on one table (bad input beyond it: the trace stops with a warning). */
export const MAX_PATHS = 2000;
/** Hits closer than this to the run's start are the start itself (floating-point noise), mm. */
const MIN_HIT_DISTANCE_MM = 1e-6;
/** A lens or aperture met further than this from its centre is treated as centred, with a warning, mm. */
export const OFF_CENTRE_WARNING_MM = 1;

export type TablePoint = { xMm: number; yMm: number };

export type TablePathEnd = { elementId: string } | { edge: TablePoint } | { continuesAs: string[] };

export type PathRole = "emitted" | Branch["role"];

/** Where a run's axis meets an element's face. */
export type TableHit = {
  elementId: string;
  /** Distance along this run from its start, mm. */
  distanceMm: number;
  /** Where the axis crosses the face. */
  point: TablePoint;
  /** Signed distance of that point from the element's centre, along the face, mm. */
  offsetMm: number;
};

export type TracedPath = {
  id: string;
  laserId: string;
  parentPathId: string | null;
  /** The laser, mirror, splitter or window it leaves. */
  startElementId: string;
  role: PathRole;
  /** 0 for a laser's own run; each turn or split adds one. */
  generation: number;
  /** The share of the power arriving at the start element that this run takes (1 for a laser's own run). */
  branchShare: number;
  /** Share of the laser's power at the start, from branch shares and filters (apertures not counted: they clip by beam size). */
  shareOfLaser: number;
  start: TablePoint;
  /** Direction of travel, counter-clockwise from +x, in [0, 360). */
  directionDeg: number;
  /** Unfolded length from the laser to this run's start, mm. */
  startLengthMm: number;
  /** Length of this run, from its start to its end point, mm. */
  lengthMm: number;
  endPoint: TablePoint;
  /** Elements reached in order, leaving out the start element and including the element the run ends on. */
  elementIds: string[];
  hits: TableHit[];
  end: TablePathEnd;
  /** Set when some of the runs this one would send on were not followed, and why. */
  cut?: "power" | "generations" | "path-limit";
};

export type TableWarning = { code: string; elementId?: string; pathId?: string; message: string };

export type TableTrace = {
  paths: TracedPath[];
  warnings: TableWarning[];
  /** Elements no run reaches (lasers excepted). */
  unreachedIds: string[];
};

type Run = {
  id: string;
  laser: LaserV2Element;
  parentPathId: string | null;
  start: TableElement;
  role: PathRole;
  generation: number;
  branchShare: number;
  shareOfLaser: number;
  ox: number;
  oy: number;
  dx: number;
  dy: number;
  startLengthMm: number;
};

const RAD = Math.PI / 180;
const clean = (v: number) => (Math.abs(v) < 1e-15 ? 0 : v);
/** Points on the table to the picometre, so 500 − 6e-14 reads 500 (far below any mount's tolerance). */
const snap = (v: number) => Math.round(v * 1e9) / 1e9;
const directionOf = (deg: number) => ({ x: clean(Math.cos(deg * RAD)), y: clean(Math.sin(deg * RAD)) });
const degreesOf = (dx: number, dy: number) => {
  const deg = Math.atan2(dy, dx) / RAD;
  const n = ((deg % 360) + 360) % 360;
  return Math.abs(n - 360) < 1e-9 ? 0 : Number(n.toFixed(9));
};
const fmt = (v: number) => String(Number(v.toPrecision(4)));
const named = (e: { id: string; kind: string }) => `${kindWord(e.kind)} "${e.id}"`;

/** Distance along the ray to the table edge and the point there. */
function edgeOf(ox: number, oy: number, dx: number, dy: number, widthMm: number, depthMm: number): { t: number; point: TablePoint } {
  let t = Infinity;
  if (dx > 0) t = Math.min(t, (widthMm - ox) / dx);
  else if (dx < 0) t = Math.min(t, -ox / dx);
  if (dy > 0) t = Math.min(t, (depthMm - oy) / dy);
  else if (dy < 0) t = Math.min(t, -oy / dy);
  if (!Number.isFinite(t) || t < 0) t = 0;
  const x = snap(Math.min(widthMm, Math.max(0, ox + t * dx)));
  const y = snap(Math.min(depthMm, Math.max(0, oy + t * dy)));
  return { t, point: { xMm: x, yMm: y } };
}

/** The filter's OD at a wavelength: the band that holds it, else the plain OD (the rule of the rail safety engine). */
function filterOdAt(filter: { opticalDensity: number; opticalDensityBands?: { fromNm: number; toNm: number; opticalDensity: number }[] }, wavelengthNm: number): number {
  for (const b of filter.opticalDensityBands ?? []) if (wavelengthNm >= b.fromNm && wavelengthNm <= b.toNm) return b.opticalDensity;
  return filter.opticalDensity;
}

type Face = { e: TableElement; cx: number; cy: number; nx: number; ny: number; halfMm: number };

/** Trace every laser on the table. Pure; bounded by MAX_PATHS runs of at most one pass over the elements each. */
export function traceTable(doc: BenchDocumentV2): TableTrace {
  const { widthMm, depthMm } = doc.table;
  const faces: Face[] = doc.elements
    .filter((e) => e.kind !== "laser")
    .map((e) => {
      const n = directionOf(e.angleDeg);
      return { e, cx: e.xMm, cy: e.yMm, nx: n.x, ny: n.y, halfMm: clearApertureOf(e) / 2 };
    });
  const lasers = doc.elements.filter((e): e is LaserV2Element => e.kind === "laser").sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const warnings: TableWarning[] = [];
  const paths: TracedPath[] = [];
  const queue: Run[] = [];
  let nextId = 1;
  let pathLimitHit = false;
  const cutsByLaser = new Map<string, { power: Set<string>; generations: Set<string> }>();
  const cutsOf = (laserId: string) => {
    let c = cutsByLaser.get(laserId);
    if (!c) cutsByLaser.set(laserId, (c = { power: new Set(), generations: new Set() }));
    return c;
  };
  const reached = new Set<string>();

  for (const laser of lasers) {
    const d = directionOf(laser.angleDeg);
    queue.push({
      id: `p${nextId++}`,
      laser,
      parentPathId: null,
      start: laser,
      role: "emitted",
      generation: 0,
      branchShare: 1,
      shareOfLaser: 1,
      ox: laser.xMm,
      oy: laser.yMm,
      dx: d.x,
      dy: d.y,
      startLengthMm: 0,
    });
  }

  for (let qi = 0; qi < queue.length; qi++) {
    const run = queue[qi];
    const edge = edgeOf(run.ox, run.oy, run.dx, run.dy, widthMm, depthMm);
    const hits: (TableHit & { face: Face })[] = [];
    for (const f of faces) {
      if (f.e === run.start) continue;
      const dn = run.dx * f.nx + run.dy * f.ny;
      if (Math.abs(dn) < 1e-12) continue; // the axis runs along the face: it grazes, it does not meet it
      const t = ((f.cx - run.ox) * f.nx + (f.cy - run.oy) * f.ny) / dn;
      if (!(t > MIN_HIT_DISTANCE_MM) || t > edge.t + MIN_HIT_DISTANCE_MM) continue;
      const px = snap(run.ox + t * run.dx);
      const py = snap(run.oy + t * run.dy);
      // along the face: the tangent is the normal turned by +90°
      const offset = (px - f.cx) * -f.ny + (py - f.cy) * f.nx;
      if (Math.abs(offset) > f.halfMm) continue;
      hits.push({ elementId: f.e.id, distanceMm: t, point: { xMm: px, yMm: py }, offsetMm: offset, face: f });
    }
    hits.sort((a, b) => a.distanceMm - b.distanceMm || (a.elementId < b.elementId ? -1 : a.elementId > b.elementId ? 1 : 0));

    const elementIds: string[] = [];
    const kept: TableHit[] = [];
    let share = run.shareOfLaser;
    let end: TablePathEnd | null = null;
    let endPoint = edge.point;
    let lengthMm = edge.t;
    let cut: TracedPath["cut"];
    for (const hit of hits) {
      const e = hit.face.e;
      elementIds.push(e.id);
      kept.push({ elementId: hit.elementId, distanceMm: hit.distanceMm, point: hit.point, offsetMm: hit.offsetMm });
      reached.add(e.id);
      const action = kindRecord(e.kind)?.action ?? "stop";
      if ((e.kind === "lens" || e.kind === "aperture") && Math.abs(hit.offsetMm) > OFF_CENTRE_WARNING_MM) {
        warnings.push({
          code: "beam-off-centre",
          elementId: e.id,
          pathId: run.id,
          message: `The beam meets the ${named(e)} ${fmt(Math.abs(hit.offsetMm))} mm from its centre; it is analysed as if centred on the beam (a real ${kindWord(e.kind)} met off-centre ${e.kind === "lens" ? "also steers the beam" : "clips it differently"}). Align it with the beam.`,
        });
      }
      if (action === "transmit") {
        if (e.kind === "filter") share *= Math.pow(10, -filterOdAt(e, run.laser.wavelengthNm));
        continue;
      }
      endPoint = hit.point;
      lengthMm = hit.distanceMm;
      if (action !== "turn") {
        end = { elementId: e.id };
        break;
      }
      const continuesAs: string[] = [];
      for (const branch of branchesOf(e)) {
        const childShare = share * branch.share;
        if (run.generation + 1 > MAX_GENERATIONS) {
          cutsOf(run.laser.id).generations.add(e.id);
          cut = "generations";
          continue;
        }
        if (childShare < MIN_SHARE_OF_LASER) {
          cutsOf(run.laser.id).power.add(e.id);
          cut = cut ?? "power";
          continue;
        }
        if (nextId > MAX_PATHS) {
          pathLimitHit = true;
          cut = "path-limit";
          continue;
        }
        let dx = run.dx;
        let dy = run.dy;
        if (branch.direction === "reflected") {
          const f = hit.face;
          const dn = dx * f.nx + dy * f.ny;
          dx = clean(dx - 2 * dn * f.nx);
          dy = clean(dy - 2 * dn * f.ny);
        }
        const id = `p${nextId++}`;
        continuesAs.push(id);
        queue.push({
          id,
          laser: run.laser,
          parentPathId: run.id,
          start: e,
          role: branch.role,
          generation: run.generation + 1,
          branchShare: branch.share,
          shareOfLaser: childShare,
          ox: hit.point.xMm,
          oy: hit.point.yMm,
          dx,
          dy,
          startLengthMm: run.startLengthMm + hit.distanceMm,
        });
      }
      end = { continuesAs };
      break;
    }
    if (end === null) end = { edge: edge.point };
    paths.push({
      id: run.id,
      laserId: run.laser.id,
      parentPathId: run.parentPathId,
      startElementId: run.start.id,
      role: run.role,
      generation: run.generation,
      branchShare: run.branchShare,
      shareOfLaser: run.shareOfLaser,
      start: { xMm: run.ox, yMm: run.oy },
      directionDeg: degreesOf(run.dx, run.dy),
      startLengthMm: run.startLengthMm,
      lengthMm,
      endPoint,
      elementIds,
      hits: kept,
      end,
      ...(cut === undefined ? {} : { cut }),
    });
    if (run.parentPathId === null && elementIds.length === 0) {
      warnings.push({
        code: "laser-aimed-off-table",
        elementId: run.laser.id,
        pathId: run.id,
        message: `The ${named(run.laser)} is aimed off the table: its beam meets nothing and leaves the edge at (${fmt(edge.point.xMm)}, ${fmt(edge.point.yMm)}) mm. Turn it or put a beam block in front of it.`,
      });
    }
  }

  for (const [laserId, cuts] of cutsByLaser) {
    if (cuts.generations.size > 0) {
      const ids = [...cuts.generations];
      warnings.push({
        code: "trace-generation-limit",
        elementId: ids[0],
        message: `The light of laser "${laserId}" was still being turned after ${MAX_GENERATIONS} reflections (last at ${ids.slice(0, 3).map((id) => `"${id}"`).join(", ")}): a ring of mirrors or a cavity keeps it on the table, and tracing stopped there. Check that this is intended and that every beam ends on a block.`,
      });
    }
    if (cuts.power.size > 0) {
      const ids = [...cuts.power];
      warnings.push({
        code: "trace-power-limit",
        elementId: ids[0],
        message: `Beams of laser "${laserId}" weaker than ${MIN_SHARE_OF_LASER} of its power were not followed (at ${ids.slice(0, 5).map((id) => `"${id}"`).join(", ")}${ids.length > 5 ? ", …" : ""}).`,
      });
    }
  }
  if (pathLimitHit) {
    warnings.push({
      code: "trace-path-limit",
      message: `The table makes more than ${MAX_PATHS} beam segments; tracing stopped there, so the analysis is incomplete. Simplify the table or block beams earlier.`,
    });
  }
  const unreachedIds = doc.elements.filter((e) => e.kind !== "laser" && !reached.has(e.id)).map((e) => e.id);
  for (const id of unreachedIds) {
    const e = doc.elements.find((x) => x.id === id) as TableElement;
    warnings.push({ code: "element-not-reached", elementId: id, message: `No beam reaches the ${named(e)}: check its place, angle and clear aperture.` });
  }
  return { paths, warnings, unreachedIds };
}
