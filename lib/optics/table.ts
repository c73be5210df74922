// analyzeTable: the optics of a version 2 bench (the table plan) — every path traced, each leaf unfolded and run through the rail engine.
// Sources: the rail engine's (Siegman, Lasers, 1986; Born & Wolf §8.8; Collins 1970) along each path's unfolded length; geometry in table-trace.ts (Hecht §4.3).
//
// Only the leaves of the path tree are analysed: a leaf's unfolded bench holds every path before it, and an element
// upstream of a split sees the same beam in every leaf below it, so each (element, path) pair is taken from the first
// leaf that holds it. An aperture gets one entry per screen its light reaches (a split sends it to several); with no
// screen on any branch, one entry without a screen. Rail warnings that are artefacts of the unfolding are dropped.
import { laserBeamPowerMw } from "@/lib/bench/laser-power";
import type { BenchDocumentV2, TableElement } from "@/lib/bench/schema-v2";
import { analyzeBench as analyzeRail, type AnalyzeOptions, type ApertureAnalysis, type ChainBuild, type IncidentBeam } from "./analyze";
import { ChainPrefixCache } from "./chain";
import { fieldPowerProbe, probeOfChain, type FieldPowerProbe } from "./field-power";
import { MAX_GENERATIONS, MAX_PATHS, MIN_SHARE_OF_LASER, traceTable, type PathRole, type TableHit, type TablePathEnd, type TablePoint, type TableWarning } from "./table-trace";
import { unfoldPath, type ChainOrigin, type UnfoldCache } from "./table-unfold";

export { MAX_GENERATIONS, MAX_PATHS, MIN_SHARE_OF_LASER };
export type { TablePathEnd, TablePoint, TableWarning };

export type TablePath = {
  id: string;
  laserId: string;
  /** null for a laser's own first run. */
  parentPathId: string | null;
  /** The laser, mirror, splitter or window it leaves. */
  startElementId: string;
  role: PathRole;
  generation: number;
  /** Share of the power arriving at the start element that this path takes (1 for a laser's own run). */
  branchShare: number;
  /** Power at the start, mW (the average power; for a single pulse the power during the pulse, as the rail engine carries it). */
  powerMw: number;
  /** Share of the laser's power at the start from branch shares and filters alone (apertures, which clip by beam size, not counted). */
  shareOfLaser: number;
  start: TablePoint;
  directionDeg: number;
  /** Unfolded length from the laser to the start, mm. */
  startLengthMm: number;
  lengthMm: number;
  endPoint: TablePoint;
  /** In order; leaves out the start element and includes the element it ends on. */
  elementIds: string[];
  hits: { elementId: string; distanceMm: number; point: TablePoint; offsetMm: number }[];
  end: TablePathEnd;
  /** The beam arriving at the end point (the element it ends on, or the table edge); null if not computed. */
  arrival: IncidentBeam | null;
  cut?: "power" | "generations" | "path-limit";
};

export type TableElementAnalysis = {
  id: string;
  kind: string;
  pathId: string;
  laserId: string;
  /** Unfolded length from the laser, mm. */
  positionMm: number;
  /** Where the path's axis meets the element (the laser: where it stands). */
  xMm: number;
  yMm: number;
  status: "lit";
  incident: IncidentBeam;
  /** Power leaving the element on every run it sends on (0 for a screen or beam block; absorbed shares left out). */
  outgoingPowerMw: number;
};

export type TableApertureAnalysis = ApertureAnalysis & { pathId: string; laserId: string };
export type TableScreenAnalysis = { id: string; pathId: string; laserId: string; powerMw: number; centreIntensityRatio: number | null; centre: string | null };

/**
 * The propagated field's power probe of one leaf path's unfolded bench (chain element ids, as unfoldPath names them), for
 * the safety engine behind a clipping aperture; undefined where nothing on that path clips.
 */
export type TableFieldPower = (leafPathId: string) => FieldPowerProbe | undefined;

export type TableAnalysis = {
  version: 2;
  /**
   * Not part of the JSON answer (a non-enumerable property, absent after serialisation): the field power probes of the
   * leaf paths, sharing the analysis' field chains. assessBench uses it for E behind clipping apertures.
   */
  readonly fieldPower?: TableFieldPower;
  lasers: { id: string; wavelengthNm: number; m2: number }[];
  paths: TablePath[];
  elements: TableElementAnalysis[];
  apertures: TableApertureAnalysis[];
  screens: TableScreenAnalysis[];
  warnings: TableWarning[];
};

/**
 * Behind edges that cut almost nothing, the table's safety figures take a rigorous upper bound on the enclosed power
 * (at most (1.005)² ≈ 1 % above the unclipped Gaussian's) instead of integrating the field at every point; elsewhere the
 * field itself (see fieldPowerProbe).
 */
export const FIELD_BOUND_WITHIN = 0.005;

/** Rail warnings that come from the unfolding itself, not from the table. */
const UNFOLDING_ARTEFACTS = new Set(["same-position", "no-screen", "screen-not-reached", "element-beyond-stop", "element-upstream-of-laser", "no-laser"]);

/** Rail warnings whose meaning depends on what lies downstream (so each leaf may add its own). */
const DOWNSTREAM_CODES = new Set(["aperture-without-screen", "screen-at-aperture", "lens-between-aperture-and-screen", "apertures-in-series"]);

/** Unfolded ids (⟨path⟩element) in a rail message, put back as the table element's id. */
const rename = (message: string): string => (message.includes("⟨") ? message.replace(/⟨[^⟩]*⟩(?:⟨edge⟩)?/g, "") : message);

type RailScreen = { id: string; centreIntensityRatio?: number; centre?: string; powerMw?: number };

/**
 * Pure and synchronous; never throws for a document the version 2 schema accepts. The leaves share their common
 * beginnings through one field-chain cache (every leaf's unfolded bench starts with the paths before it).
 */
export function analyzeTable(doc: BenchDocumentV2, options: AnalyzeOptions = {}): TableAnalysis {
  const chainCache = options.chainCache ?? new ChainPrefixCache();
  const trace = traceTable(doc);
  const byId = new Map<string, TableElement>(doc.elements.map((e) => [e.id, e]));
  const pathsById = new Map(trace.paths.map((p) => [p.id, p]));
  const warnings: TableWarning[] = [...trace.warnings];
  const seenWarnings = new Set(warnings.map((w) => `${w.code}|${w.elementId ?? ""}|${w.message}`));
  const entries = new Map<string, TableElementAnalysis>(); // `${pathId}|${elementId}`
  const arrivals = new Map<string, IncidentBeam>();
  const apertures = new Map<string, TableApertureAnalysis>(); // `${pathId}|${apertureId}|${screenId}`
  const screens = new Map<string, TableScreenAnalysis>();
  const hits = new Map<string, TableHit>();
  for (const p of trace.paths) for (const h of p.hits) hits.set(`${p.id}|${h.elementId}`, h);
  const cache: UnfoldCache = new Map();
  const builds = new Map<string, ChainBuild | null>(); // each leaf's field chain, for its power probe

  const leaves = trace.paths.filter((p) => !("continuesAs" in p.end) || p.end.continuesAs.length === 0);
  for (const leaf of leaves) {
    const chain = unfoldPath(doc, byId, pathsById, leaf.id, cache);
    const originOf = (cid: string): ChainOrigin | undefined => chain.origin.get(cid);
    const known = {
      aperture: (cid: string, screenCid: string | null): boolean => {
        const o = originOf(cid);
        const screenId = screenCid === null ? null : (originOf(screenCid)?.elementId ?? null);
        return o !== undefined && o.elementId !== null && apertures.has(`${o.pathId}|${o.elementId}|${screenId ?? ""}`);
      },
      element: (cid: string): boolean => {
        const o = originOf(cid);
        return o !== undefined && o.elementId !== null && entries.has(`${o.pathId}|${o.elementId}`);
      },
    };
    const rail = analyzeRail(chain.doc, { chainCache, envelope: false, known, onChain: (build) => builds.set(leaf.id, build) });
    const fresh = new Set<string>(); // (path, element) pairs first met in this leaf

    for (const entry of rail.elements) {
      const o = originOf(entry.id);
      if (!o || entry.status !== "lit") continue;
      if (o.role === "edge") {
        arrivals.set(o.pathId, entry.incident);
        continue;
      }
      const elementId = o.elementId as string;
      const key = `${o.pathId}|${elementId}`;
      if (entries.has(key)) continue;
      const e = byId.get(elementId);
      if (!e) continue;
      fresh.add(entry.id);
      const path = pathsById.get(o.pathId);
      const hit = hits.get(key);
      let outgoingPowerMw = entry.outgoingPowerMw;
      if (o.role === "turn" && path && "continuesAs" in path.end) {
        outgoingPowerMw = path.end.continuesAs.reduce((sum, id) => sum + entry.incident.powerMw * (pathsById.get(id)?.branchShare ?? 0), 0);
      }
      entries.set(key, {
        id: elementId,
        kind: e.kind,
        pathId: o.pathId,
        laserId: path?.laserId ?? elementId,
        positionMm: entry.positionMm,
        xMm: hit ? hit.point.xMm : e.xMm,
        yMm: hit ? hit.point.yMm : e.yMm,
        status: "lit",
        incident: entry.incident,
        outgoingPowerMw,
      });
      if (path && "elementId" in path.end && path.end.elementId === elementId) arrivals.set(path.id, entry.incident);
      if (path && "continuesAs" in path.end && path.elementIds[path.elementIds.length - 1] === elementId) arrivals.set(path.id, entry.incident);
    }

    for (const a of rail.apertures) {
      const o = originOf(a.id);
      if (!o || o.elementId === null) continue;
      const screen = a.screenId === null ? null : originOf(a.screenId);
      const screenId = screen?.elementId ?? null;
      const key = `${o.pathId}|${o.elementId}|${screenId ?? ""}`;
      if (apertures.has(key)) continue;
      apertures.set(key, { ...a, id: o.elementId, screenId, pathId: o.pathId, laserId: leaf.laserId });
    }

    // The rail engine may report the screens it lights (the bench document contract revision 2); map them when it does.
    const railScreens = "screens" in rail && Array.isArray((rail as { screens?: unknown }).screens) ? ((rail as { screens: RailScreen[] }).screens) : [];
    for (const s of railScreens) {
      const o = originOf(s.id);
      if (!o || o.elementId === null) continue;
      const key = `${o.pathId}|${o.elementId}`;
      if (screens.has(key)) continue;
      screens.set(key, {
        id: o.elementId,
        pathId: o.pathId,
        laserId: leaf.laserId,
        powerMw: s.powerMw ?? 0,
        centreIntensityRatio: s.centreIntensityRatio ?? null,
        centre: s.centre ?? null,
      });
    }

    for (const w of rail.warnings) {
      if (UNFOLDING_ARTEFACTS.has(w.code)) continue;
      // a warning about an element analysed in an earlier leaf was reported there, unless it concerns what lies downstream
      if (w.elementId !== undefined && w.elementId !== leaf.laserId && !fresh.has(w.elementId) && !DOWNSTREAM_CODES.has(w.code)) continue;
      const o = w.elementId === undefined ? undefined : originOf(w.elementId);
      const mapped: TableWarning = {
        code: w.code,
        ...(o?.elementId ? { elementId: o.elementId } : {}),
        ...(o && o.role !== "laser" ? { pathId: o.pathId } : {}),
        message: rename(w.message),
      };
      const key = `${mapped.code}|${mapped.elementId ?? ""}|${mapped.message}`;
      if (seenWarnings.has(key)) continue;
      seenWarnings.add(key);
      warnings.push(mapped);
    }
  }

  // An aperture whose light reaches a screen on some branch keeps only the entries with a screen.
  const withScreen = new Set([...apertures.values()].filter((a) => a.screenId !== null).map((a) => `${a.pathId}|${a.id}`));
  const apertureList = [...apertures.values()].filter((a) => a.screenId !== null || !withScreen.has(`${a.pathId}|${a.id}`));
  const filteredWarnings = warnings.filter((w) => !(w.code === "aperture-without-screen" && w.elementId !== undefined && withScreen.has(`${w.pathId}|${w.elementId}`)));

  // Paths in order, with their start power and arrival; elements in path order, the laser first on its own run.
  const paths: TablePath[] = trace.paths.map((p) => {
    let powerMw = 0;
    if (p.parentPathId === null) {
      const laser = byId.get(p.laserId);
      powerMw = laser && laser.kind === "laser" ? laserBeamPowerMw(laser) : 0;
    } else {
      const atStart = entries.get(`${p.parentPathId}|${p.startElementId}`);
      powerMw = atStart ? atStart.incident.powerMw * p.branchShare : 0;
    }
    return {
      id: p.id,
      laserId: p.laserId,
      parentPathId: p.parentPathId,
      startElementId: p.startElementId,
      role: p.role,
      generation: p.generation,
      branchShare: p.branchShare,
      powerMw,
      shareOfLaser: p.shareOfLaser,
      start: p.start,
      directionDeg: p.directionDeg,
      startLengthMm: p.startLengthMm,
      lengthMm: p.lengthMm,
      endPoint: p.endPoint,
      elementIds: p.elementIds,
      hits: p.hits,
      end: p.end,
      arrival: arrivals.get(p.id) ?? null,
      ...(p.cut === undefined ? {} : { cut: p.cut }),
    };
  });
  const elements: TableElementAnalysis[] = [];
  for (const p of paths) {
    if (p.parentPathId === null) {
      const laser = byId.get(p.laserId);
      if (laser && laser.kind === "laser") {
        const w0 = laser.beamDiameterMm / 2;
        elements.push({
          id: laser.id,
          kind: "laser",
          pathId: p.id,
          laserId: laser.id,
          positionMm: 0,
          xMm: laser.xMm,
          yMm: laser.yMm,
          status: "lit",
          incident: { radiusMm: w0, wavefrontRadiusMm: null, powerMw: p.powerMw },
          outgoingPowerMw: p.powerMw,
        });
      }
    }
    for (const id of p.elementIds) {
      const entry = entries.get(`${p.id}|${id}`);
      if (entry) elements.push(entry);
    }
  }
  const screenList = screens.size > 0 ? [...screens.values()] : screensFromElements(elements, apertureList);

  const lasers = doc.elements
    .filter((e) => e.kind === "laser")
    .map((e) => (e.kind === "laser" ? { id: e.id, wavelengthNm: e.wavelengthNm, m2: e.m2 ?? 1 } : null))
    .filter((x): x is { id: string; wavelengthNm: number; m2: number } => x !== null)
    .sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const result: TableAnalysis = { version: 2, lasers, paths, elements, apertures: apertureList, screens: screenList, warnings: filteredWarnings };
  // The light arriving at an element of a path is the same in every leaf below that path (the same chain up to it):
  // answers asked by element are shared between leaves; answers by position (a focus in a gap) stay per leaf.
  const probes = new Map<string, FieldPowerProbe | undefined>();
  const byElement = new Map<string, number | null>();
  const fieldPower: TableFieldPower = (leafPathId) => {
    if (!probes.has(leafPathId)) {
      const built = builds.get(leafPathId);
      const options = { chainCache, boundWithin: FIELD_BOUND_WITHIN };
      const probe = built !== undefined ? probeOfChain(built, options) : pathsById.has(leafPathId) ? fieldPowerProbe(unfoldPath(doc, byId, pathsById, leafPathId, cache).doc, options) : undefined;
      probes.set(
        leafPathId,
        probe &&
          ((positionMm, radiusMm, elementId) => {
            if (elementId === undefined) return probe(positionMm, radiusMm);
            const key = `${elementId}|${radiusMm}`;
            let value = byElement.get(key);
            if (value === undefined) byElement.set(key, (value = probe(positionMm, radiusMm, elementId)));
            return value;
          }),
      );
    }
    return probes.get(leafPathId);
  };
  Object.defineProperty(result, "fieldPower", { value: fieldPower, enumerable: false });
  return result;
}

/** Screens lit, when the rail engine does not list them: the power arriving, and the centre from the last aperture before it. */
function screensFromElements(elements: readonly TableElementAnalysis[], apertures: readonly TableApertureAnalysis[]): TableScreenAnalysis[] {
  return elements
    .filter((e) => e.kind === "screen")
    .map((e) => {
      const lit = apertures.filter((a) => a.screenId === e.id);
      const last = lit.length > 0 ? lit[lit.length - 1] : null;
      return {
        id: e.id,
        pathId: e.pathId,
        laserId: e.laserId,
        powerMw: e.incident.powerMw,
        centreIntensityRatio: last ? last.centreIntensityRatio : null,
        centre: last ? last.centre : null,
      };
    });
}
