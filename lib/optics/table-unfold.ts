// Unfolding: one traced path of the table, with its ancestors, as a straight version 1 bench that the rail engines analyse.
// A flat mirror, splitter or window turns the beam but leaves its Gaussian parameter alone (Siegman, Lasers, 1986, §15.1: a plane mirror is the identity ABCD), so along the unfolded length it is a filter of OD = −log10(share).
//
// Positions are cumulative unfolded lengths from the laser. The element a path ends on when it turns is the filter;
// a path ending at the table edge gets a marker filter of OD 0 there so the beam leaving the table is reported.
import type { BenchDocument, BenchElement } from "@/lib/bench/schema";
import type { BenchDocumentV2, LaserV2Element, TableElement } from "@/lib/bench/schema-v2";

/** What the unfolded engines need of a traced path (TracedPath and the analysis' paths both fit). */
export type UnfoldablePath = {
  id: string;
  laserId: string;
  parentPathId: string | null;
  branchShare: number;
  startLengthMm: number;
  lengthMm: number;
  hits: readonly { elementId: string; distanceMm: number }[];
  end: { elementId: string } | { edge: unknown } | { continuesAs: readonly string[] };
};

/** Where an element of the unfolded chain comes from: the table element (or the edge) on a path. */
export type ChainOrigin = { pathId: string; elementId: string | null; role: "laser" | "element" | "turn" | "edge" };

export type UnfoldedChain = {
  doc: BenchDocument;
  /** Chain element id → its origin. */
  origin: Map<string, ChainOrigin>;
  /** The paths of the chain, root first. */
  lineage: string[];
};

/** The chain id of a table element met on a path: unique within a chain (an element is met at most once per run). */
export const chainId = (pathId: string, elementId: string): string => `⟨${pathId}⟩${elementId}`;
export const edgeChainId = (pathId: string): string => `⟨${pathId}⟩⟨edge⟩`;

/** The v1 laser of a table laser: its fields (further lines included) less the placement, at position 0. */
export function railLaser(laser: LaserV2Element, id: string): BenchElement {
  const { xMm: _x, yMm: _y, angleDeg: _a, ...fields } = laser;
  return { ...fields, id, positionMm: 0 } as BenchElement;
}

function railElement(e: TableElement, id: string, positionMm: number): BenchElement | null {
  switch (e.kind) {
    case "lens":
      // the clear aperture goes along: an engine that clips at a lens or filter rim uses it
      return (e.clearApertureMm === undefined
        ? { id, kind: "lens", positionMm, focalLengthMm: e.focalLengthMm }
        : { id, kind: "lens", positionMm, focalLengthMm: e.focalLengthMm, clearApertureMm: e.clearApertureMm }) as BenchElement;
    case "filter": {
      const filter: Record<string, unknown> = { id, kind: "filter", positionMm, opticalDensity: e.opticalDensity };
      if (e.opticalDensityBands !== undefined) filter.opticalDensityBands = e.opticalDensityBands;
      if (e.clearApertureMm !== undefined) filter.clearApertureMm = e.clearApertureMm;
      return filter as BenchElement;
    }
    case "aperture":
      return { id, kind: "aperture", positionMm, diameterMm: e.diameterMm };
    case "beam-block":
    case "screen":
      return { id, kind: e.kind, positionMm };
    default:
      return null;
  }
}

const odOfShare = (share: number): number => (share >= 1 ? 0 : -Math.log10(share));

type Segment = { elements: BenchElement[]; origins: [string, ChainOrigin][]; turn: { id: string; positionMm: number; elementId: string } | null };

/** The rail elements of one path (the element it turns on kept apart: its OD depends on the next path). */
function segmentOf(byId: ReadonlyMap<string, TableElement>, path: UnfoldablePath): Segment {
  const elements: BenchElement[] = [];
  const origins: [string, ChainOrigin][] = [];
  let turn: Segment["turn"] = null;
  for (const hit of path.hits) {
    const e = byId.get(hit.elementId);
    if (!e) continue;
    const id = chainId(path.id, hit.elementId);
    const positionMm = path.startLengthMm + hit.distanceMm;
    const rail = railElement(e, id, positionMm);
    if (rail) {
      elements.push(rail);
      origins.push([id, { pathId: path.id, elementId: hit.elementId, role: "element" }]);
    } else if (e.kind !== "laser") {
      turn = { id, positionMm, elementId: hit.elementId };
    }
  }
  if ("edge" in path.end) {
    const id = edgeChainId(path.id);
    elements.push({ id, kind: "filter", positionMm: path.startLengthMm + path.lengthMm, opticalDensity: 0 });
    origins.push([id, { pathId: path.id, elementId: null, role: "edge" }]);
  }
  return { elements, origins, turn };
}

/** Per-path pieces kept between the leaves of one analysis. */
export type UnfoldCache = Map<string, Segment>;

/**
 * The straight bench from the laser to the end of `leafId`. `byId` holds the table's elements, `paths` the traced paths.
 * Never throws for paths traceTable made; an unknown id is skipped. Pass one `cache` for every leaf of the same trace.
 */
export function unfoldPath(
  doc: BenchDocumentV2,
  byId: ReadonlyMap<string, TableElement>,
  pathsById: ReadonlyMap<string, UnfoldablePath>,
  leafId: string,
  cache: UnfoldCache = new Map(),
): UnfoldedChain {
  const lineage: UnfoldablePath[] = [];
  for (let p = pathsById.get(leafId); p; p = p.parentPathId === null ? undefined : pathsById.get(p.parentPathId)) lineage.unshift(p);
  const origin = new Map<string, ChainOrigin>();
  const elements: BenchElement[] = [];
  const root = lineage[0];
  const laser = byId.get(root.laserId);
  if (laser && laser.kind === "laser") {
    elements.push(railLaser(laser, laser.id));
    origin.set(laser.id, { pathId: root.id, elementId: laser.id, role: "laser" });
  }
  lineage.forEach((path, index) => {
    let segment = cache.get(path.id);
    if (!segment) cache.set(path.id, (segment = segmentOf(byId, path)));
    for (const e of segment.elements) elements.push(e);
    for (const [id, o] of segment.origins) origin.set(id, o);
    if (segment.turn) {
      // mirror, splitter or window: the share taken by the next path of this chain (none at the leaf)
      const child = lineage[index + 1];
      elements.push({ id: segment.turn.id, kind: "filter", positionMm: segment.turn.positionMm, opticalDensity: child ? odOfShare(child.branchShare) : 0 });
      origin.set(segment.turn.id, { pathId: path.id, elementId: segment.turn.elementId, role: "turn" });
    }
  });
  return {
    doc: { version: 1, ...(doc.title === undefined ? {} : { title: doc.title }), elements },
    origin,
    lineage: lineage.map((p) => p.id),
  };
}
