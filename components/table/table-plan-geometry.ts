// What the table plan draws, worked out without React: the hole grid, each element's outline at true scale, each
// path's beam with its hazard band, and the open beams. Coordinates are table mm; the drawing flips y (away = up).
import { ELEMENT_KIND_RECORDS, kindRecord } from "@/lib/bench/element-kinds";
import type { BenchDocumentV2, TableElement } from "@/lib/bench/schema-v2";
import type { TableAnalysis } from "@/lib/optics/table";
import type { TableSafetyAssessment } from "@/lib/safety/table";

/** above-mpe: some point of the path needs eyewear (OD > 0); below-mpe: lit but within the MPE; unknown: no safety answer. */
export type HazardBand = "above-mpe" | "below-mpe" | "unknown";

export type PlanBeam = {
  pathId: string;
  laserId: string;
  from: { xMm: number; yMm: number };
  to: { xMm: number; yMm: number };
  powerMw: number;
  band: HazardBand;
  /** Highest eyewear OD on the path (0 when unknown). */
  opticalDensityRequired: number;
  open: boolean;
};

export type PlanElement = {
  id: string;
  kind: TableElement["kind"];
  label: string;
  xMm: number;
  yMm: number;
  /** The outline: a rectangle faceMm along the face by depthMm along the normal, turned to angleDeg. */
  corners: { xMm: number; yMm: number }[];
  angleDeg: number;
  reached: boolean;
};

export type PlanOpenBeam = { pathId: string; xMm: number; yMm: number; directionDeg: number; powerMw: number; exceedsMpe: boolean; nohdM: number };

export type TablePlan = {
  widthMm: number;
  depthMm: number;
  holePitchMm: number;
  /** Hole count along x and y (the grid starts half a pitch in from the corner, as on common breadboards). */
  holes: { columns: number; rows: number; offsetMm: number };
  elements: PlanElement[];
  beams: PlanBeam[];
  openBeams: PlanOpenBeam[];
};

const RAD = Math.PI / 180;

function outline(e: TableElement): { xMm: number; yMm: number }[] {
  const symbol = ELEMENT_KIND_RECORDS[e.kind].symbol;
  // a laser's symbol lies along its beam; every other element's along its face
  const along = e.kind === "laser" ? symbol.depthMm : e.kind === "beam-splitter" ? symbol.faceMm : (e.clearApertureMm ?? symbol.faceMm);
  const across = e.kind === "laser" ? symbol.faceMm : symbol.depthMm;
  const a = e.angleDeg * RAD;
  // u: along the normal (or the beam, for a laser); v: along the face
  const u = { x: Math.cos(a), y: Math.sin(a) };
  const v = { x: -u.y, y: u.x };
  const hu = (e.kind === "laser" ? along : across) / 2;
  const hv = (e.kind === "laser" ? across : along) / 2;
  // a laser's box sits behind its exit aperture
  const cu = e.kind === "laser" ? -hu : 0;
  return [
    [-1, -1],
    [1, -1],
    [1, 1],
    [-1, 1],
  ].map(([su, sv]) => ({ xMm: e.xMm + (cu + su * hu) * u.x + sv * hv * v.x, yMm: e.yMm + (cu + su * hu) * u.y + sv * hv * v.y }));
}

export function tablePlan(doc: BenchDocumentV2, analysis: TableAnalysis, safety?: Pick<TableSafetyAssessment, "points" | "openBeams"> | null): TablePlan {
  const reached = new Set(analysis.elements.map((e) => e.id));
  const odByPath = new Map<string, number>();
  for (const p of safety?.points ?? []) {
    if (p.opticalDensityRaw === null) continue;
    odByPath.set(p.pathId, Math.max(odByPath.get(p.pathId) ?? -Infinity, p.opticalDensityRaw));
  }
  const openByPath = new Map((safety?.openBeams ?? []).map((o) => [o.pathId, o]));
  const beams: PlanBeam[] = analysis.paths.map((p) => {
    const open = openByPath.get(p.id);
    let od = odByPath.get(p.id);
    if (open) od = Math.max(od ?? -Infinity, open.exceedsMpe ? Math.max(open.opticalDensityRequired, 1e-9) : -1);
    const band: HazardBand = safety ? (od !== undefined && od > 0 ? "above-mpe" : "below-mpe") : "unknown";
    return {
      pathId: p.id,
      laserId: p.laserId,
      from: p.start,
      to: p.endPoint,
      powerMw: p.powerMw,
      band,
      opticalDensityRequired: od !== undefined && od > 0 ? od : 0,
      open: "edge" in p.end,
    };
  });
  const pitch = doc.table.holePitchMm;
  const offsetMm = pitch / 2;
  return {
    widthMm: doc.table.widthMm,
    depthMm: doc.table.depthMm,
    holePitchMm: pitch,
    holes: {
      columns: Math.max(0, Math.floor((doc.table.widthMm - offsetMm) / pitch) + 1),
      rows: Math.max(0, Math.floor((doc.table.depthMm - offsetMm) / pitch) + 1),
      offsetMm,
    },
    elements: doc.elements.map((e) => ({
      id: e.id,
      kind: e.kind,
      label: kindRecord(e.kind)?.label ?? e.kind,
      xMm: e.xMm,
      yMm: e.yMm,
      corners: outline(e),
      angleDeg: e.angleDeg,
      reached: e.kind === "laser" || reached.has(e.id),
    })),
    beams,
    openBeams: (safety?.openBeams ?? []).map((o) => ({ pathId: o.pathId, xMm: o.xMm, yMm: o.yMm, directionDeg: o.directionDeg, powerMw: o.powerMw, exceedsMpe: o.exceedsMpe, nohdM: o.nohdM })),
  };
}
