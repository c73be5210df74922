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
  elementIds: readonly string[];
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

/** The v1 laser of a table laser: its fields less the placement and further lines, at position 0. */
export function railLaser(laser: LaserV2Element, id: string): BenchElement {
  const { xMm: _x, yMm: _y, angleDeg: _a, lines: _l, ...fields } = laser;
  return { ...fields, id, positionMm: 0 } as BenchElement;
}

function railElement(e: TableElement, id: string, positionMm: number): BenchElement | null {
  switch (e.kind) {
    case "lens":
    case "filter": {
      // the clear aperture goes along: an engine that clips at a lens or filter rim uses it
      const { xMm: _x, yMm: _y, angleDeg: _a, ...fields } = e;
      return { ...fields, id, positionMm } as BenchElement;
    }
    case "aperture": {
      const { xMm: _x, yMm: _y, angleDeg: _a, clearApertureMm: _c, ...fields } = e;
      return { ...fields, id, positionMm };
    }
    case "beam-block":
    case "screen":
      return { id, kind: e.kind, positionMm };
    default:
      return null;
  }
}

const odOfShare = (share: number): number => (share >= 1 ? 0 : -Math.log10(share));

/**
 * The straight bench from the laser to the end of `leafId`. `byId` holds the table's elements, `paths` the traced paths.
 * Never throws for paths traceTable made; an unknown id is skipped.
 */
export function unfoldPath(
  doc: BenchDocumentV2,
  byId: ReadonlyMap<string, TableElement>,
  pathsById: ReadonlyMap<string, UnfoldablePath>,
  leafId: string,
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
    const child = lineage[index + 1];
    const distances = new Map(path.hits.map((h) => [h.elementId, h.distanceMm]));
    for (const elementId of path.elementIds) {
      const e = byId.get(elementId);
      const distanceMm = distances.get(elementId);
      if (!e || distanceMm === undefined) continue;
      const id = chainId(path.id, elementId);
      const positionMm = path.startLengthMm + distanceMm;
      const rail = railElement(e, id, positionMm);
      if (rail) {
        elements.push(rail);
        origin.set(id, { pathId: path.id, elementId, role: "element" });
      } else if (e.kind !== "laser") {
        // mirror, splitter or window: the share taken by the next path of this chain (none at the leaf)
        elements.push({ id, kind: "filter", positionMm, opticalDensity: child ? odOfShare(child.branchShare) : 0 });
        origin.set(id, { pathId: path.id, elementId, role: "turn" });
      }
    }
    if ("edge" in path.end) {
      const id = edgeChainId(path.id);
      elements.push({ id, kind: "filter", positionMm: path.startLengthMm + path.lengthMm, opticalDensity: 0 });
      origin.set(id, { pathId: path.id, elementId: null, role: "edge" });
    }
  });
  return {
    doc: { version: 1, ...(doc.title === undefined ? {} : { title: doc.title }), elements },
    origin,
    lineage: lineage.map((p) => p.id),
  };
}
