// assessTable: the laser safety of a version 2 bench (the table plan) — every laser and line classified, every path's OD, every beam leaving the table.
// Formulas: those of assessBeam and the rail assessBench (ANSI Z136.1-2014 Tables 5a/8 and Appendix B; IEC 60825-1:2014; the bench document contract OD rule), applied per path along its unfolded length.
//
// Entry point: callers use `assessBench(doc, analyzeBench(doc), options)` from lib/safety (index.ts dispatches on
// doc.version: version 2 comes here, version 1 to the rail assessment unchanged). Each leaf path of the analysis is
// unfolded into a straight bench (lib/optics/table-unfold.ts) and assessed by the rail assessBench; an open beam at
// the table edge is assessed by assessBeam with the beam as it arrives there (its size, its own far-field divergence,
// its share of the laser's power or pulse energy) for its NOHD, and by the rail assessment's figures at the edge for
// exceedsMpe and OD (every line, sum of fractions). Each laser's class and per-line MPE, NOHD and OD come from the
// rail assessment of the laser alone (assessBeam once per line, the class over all lines). For the NOHD beyond the
// edge, further lines are taken to carry all their power inside the limiting aperture: the cautious reading.
import type { BenchDocumentV2, LaserV2Element, TableElement } from "@/lib/bench/schema-v2";
import type { TableAnalysis } from "@/lib/optics/table";
import { railLaser, unfoldPath, type UnfoldCache } from "@/lib/optics/table-unfold";
import { laserBeamPowerMw } from "@/lib/bench/laser-power";
import { assessBeam, type BeamAssessment, type BeamInput } from "./beam";
import { assessBench as assessRail, waistFrom, type BeamAtElement, type LaserFigures, type BenchSafetyOptions, type EnclosedPowerMw, type HazardPoint } from "./bench";
import { selectCautions, type CautionSituation, type SelectedCaution } from "./cautions";
import type { PulseRule } from "./pulsed";
import { LIMITATIONS, type Limitation } from "./limitations";
import { FINAL_SAY, type HazardClass } from "./types";

/**
 * What the table assessment needs of analyzeBench's version 2 answer. `fieldPower` (the analysis carries it, not in
 * its JSON) gives each leaf's power probe from the propagated field behind clipping apertures, as the rail has; without
 * it, every point behind a clipping element is taken to put all its power inside the limiting aperture (the cautious
 * answer) and a note says so.
 */
export type TableBeam = Pick<TableAnalysis, "paths" | "elements"> & { fieldPower?: (leafPathId: string) => EnclosedPowerMw | undefined };

export type TableLineFigures = {
  wavelengthNm: number;
  powerMw: number;
  /** "main" for the laser's own beam, "line" for a further line. */
  source: "main" | "line";
  /** The class of this line on its own. */
  hazardClass: HazardClass;
  mpeWPerCm2: number | null;
  perPulseJPerCm2: number | null;
  /** The repetitive-pulse rule that governs this line's MPE (lib/safety/pulsed.ts); null for a continuous-wave line. */
  pulseRule: PulseRule | null;
  /** NOHD of the free beam from the laser, m (sum-of-fractions share with lines of the same tissue group). */
  nohdM: number;
  /** Eyewear OD at the laser's exit (floored at 0). */
  opticalDensityRequired: number;
  mpeSource: string;
  nohdSource: string;
};

export type TableLaserAssessment = {
  laserId: string;
  /** The most hazardous class over its lines. */
  hazardClass: HazardClass;
  lines: TableLineFigures[];
  /** The highest OD on any path of this laser, and where; null when nothing is lit. */
  governing: TableHazardPoint | null;
};

export type TableHazardPoint = Omit<HazardPoint, "kind"> & { kind: string; pathId: string; laserId: string };

export type OpenBeam = {
  pathId: string;
  laserId: string;
  /** The element the run leaves (laser, mirror, splitter, window) and its role there. */
  startElementId: string;
  role: string;
  /** Where it leaves the table. */
  xMm: number;
  yMm: number;
  directionDeg: number;
  powerMw: number;
  /** The irradiance averaged over the limiting aperture where it leaves exceeds the MPE (default exposure) for some line. */
  exceedsMpe: boolean;
  /** Highest eyewear OD over the lines there (floored at 0). */
  opticalDensityRequired: number;
  /** NOHD measured from the table edge, m (the largest over the lines). */
  nohdM: number;
};

export type TableSafetyAssessment = {
  version: 2;
  lasers: TableLaserAssessment[];
  openBeams: OpenBeam[];
  points: TableHazardPoint[];
  governing: TableHazardPoint | null;
  lensHazards: { elementId: string; pathId: string; fromFocusM: number; fromLensM: number; source: string }[];
  screenHazards: { elementId: string; pathId: string; diffuseReflectionNhzM: number; source: string }[];
  cautions: SelectedCaution[];
  warnings: { code: string; elementId?: string; pathId?: string; message: string }[];
  notes: string[];
  limitations: readonly Limitation[];
  finalSay: string;
};

const PULSE_KEYS = ["pulseDurationS", "pulseRepetitionRateHz", "pulseEnergyJ", "pulsesPerBurst", "burstPulseRateHz"] as const;
const fmt = (v: number) => (Number.isFinite(v) ? String(Number(v.toPrecision(3))) : String(v));

/** The laser's pulse fields as assessBeam takes them; pulses that overlap are assessed as continuous-wave. */
function pulseFields(laser: LaserV2Element, energyScale: number): Partial<Record<(typeof PULSE_KEYS)[number], number>> {
  const source = laser as unknown as Record<string, unknown>;
  const out: Partial<Record<(typeof PULSE_KEYS)[number], number>> = {};
  for (const k of PULSE_KEYS) if (typeof source[k] === "number") out[k] = source[k] as number;
  if (out.pulseDurationS === undefined) return {};
  if (out.pulseRepetitionRateHz !== undefined && out.pulseDurationS * out.pulseRepetitionRateHz >= 1) return {};
  if (out.pulseEnergyJ !== undefined) out.pulseEnergyJ *= energyScale;
  return out;
}

/** Far-field 1/e² full-angle divergence of a Gaussian of waist radius w0: θ = 2M²λ/(π w0) (Siegman, Lasers, §17.1), mrad. */
const divergenceMradOf = (wavelengthNm: number, m2: number, waistRadiusMm: number) => ((2 * m2 * wavelengthNm * 1e-6) / (Math.PI * waistRadiusMm)) * 1000;

type Line = { wavelengthNm: number; powerMw: number; source: "main" | "line" };
const linesOf = (laser: LaserV2Element): Line[] => [
  { wavelengthNm: laser.wavelengthNm, powerMw: laserBeamPowerMw(laser), source: "main" },
  ...(laser.lines ?? []).map((l) => ({ wavelengthNm: l.wavelengthNm, powerMw: l.powerMw, source: "line" as const })),
];

/** The limiting-aperture stand-in for a further line: a beam far narrower than any limiting aperture puts all its power inside it. */
const POINT_BEAM_DIAMETER_MM = 1e-3;

function assessLine(laser: LaserV2Element, line: Line, beam: { diameterMm: number; divergenceMrad: number; powerScale: number }, options: BenchSafetyOptions): BeamAssessment {
  const main = line.source === "main";
  const pulses = main ? pulseFields(laser, beam.powerScale) : {};
  const singlePulse = pulses.pulseEnergyJ !== undefined && pulses.pulseRepetitionRateHz === undefined;
  const powerMw = main ? (laser.powerMw === undefined || singlePulse ? undefined : laser.powerMw * beam.powerScale) : line.powerMw * beam.powerScale;
  const input = {
    wavelengthNm: line.wavelengthNm,
    ...(powerMw === undefined ? {} : { powerMw: Math.max(powerMw, Number.MIN_VALUE) }),
    beamDiameterMm: main ? beam.diameterMm : POINT_BEAM_DIAMETER_MM,
    divergenceMrad: beam.divergenceMrad,
    ...(options.exposureS === undefined ? {} : { exposureS: options.exposureS }),
    ...(options.standard === undefined ? {} : { standard: options.standard }),
    ...pulses,
  } as BeamInput;
  return assessBeam(input);
}

export function assessTable(doc: BenchDocumentV2, beam: TableBeam, options: BenchSafetyOptions = {}): TableSafetyAssessment {
  const byId = new Map<string, TableElement>(doc.elements.map((e) => [e.id, e]));
  const pathsById = new Map(beam.paths.map((p) => [p.id, p]));
  const entryOf = new Map(beam.elements.map((e) => [`${e.pathId}|${e.id}`, e]));
  const lasers = doc.elements.filter((e): e is LaserV2Element => e.kind === "laser").sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const warnings: TableSafetyAssessment["warnings"] = [];
  const notes: string[] = [];
  const situationsByLaser = new Map<string, Set<CautionSituation>>(lasers.map((l) => [l.id, new Set<CautionSituation>()]));

  // 1. Every laser, once per line: the rail assessment of the laser alone.
  const laserResults: TableLaserAssessment[] = [];
  for (const laser of lasers) {
    try {
      const alone = railLaser(laser, laser.id);
      const free = assessRail(
        { version: 1, elements: [alone] },
        { elements: [{ id: laser.id, kind: "laser", positionMm: 0, incident: null }] },
        lasers.length === 1 ? options : { ...options, labelClass: undefined },
      );
      const lines = free.lines.lines.map(
        (l): TableLineFigures => ({
          wavelengthNm: l.wavelengthNm,
          powerMw: l.powerMw,
          source: l.main ? "main" : "line",
          hazardClass: l.hazardClass,
          mpeWPerCm2: l.mpeWPerCm2,
          perPulseJPerCm2: l.perPulseJPerCm2,
          pulseRule: l.assessment.pulsedMpe?.governingRule ?? null,
          nohdM: l.nohdM,
          opticalDensityRequired: l.opticalDensityRequired,
          mpeSource: l.assessment.figures.mpe.source,
          nohdSource: l.assessment.figures.nohd.source,
        }),
      );
      laserResults.push({ laserId: laser.id, hazardClass: free.hazardClass, lines, governing: null });
      for (const w of free.warnings) if (w.code !== "open-beam-end") warnings.push({ ...w, elementId: laser.id });
    } catch (error) {
      warnings.push({
        code: "laser-not-assessed",
        elementId: laser.id,
        message: `Laser "${laser.id}" could not be assessed (${error instanceof Error ? error.message : "unknown reason"}); it is taken as class 4. Ask your laser safety officer.`,
      });
      laserResults.push({
        laserId: laser.id,
        hazardClass: "4",
        lines: linesOf(laser).map((l) => ({
          wavelengthNm: l.wavelengthNm, powerMw: l.powerMw, source: l.source, hazardClass: "4", mpeWPerCm2: null, perPulseJPerCm2: null, pulseRule: null,
          nohdM: Number.POSITIVE_INFINITY, opticalDensityRequired: Number.POSITIVE_INFINITY, mpeSource: "not assessed", nohdSource: "not assessed",
        })),
        governing: null,
      });
    }
    if ((laser.lines ?? []).length > 0) {
      notes.push(`Laser "${laser.id}": beyond the table edge its further lines are taken to follow the main beam with all their power inside the limiting aperture (their beam size is not modelled), the cautious reading.`);
    }
  }

  // 2. Each leaf path, unfolded, through the rail assessment.
  const points = new Map<string, TableHazardPoint>();
  const edgePoints = new Map<string, HazardPoint>(); // path id → the rail figures where it leaves the table
  const lensHazards = new Map<string, TableSafetyAssessment["lensHazards"][number]>();
  const screenHazards = new Map<string, TableSafetyAssessment["screenHazards"][number]>();
  const leaves = beam.paths.filter((p) => !("continuesAs" in p.end) || p.end.continuesAs.length === 0);
  const unfoldCache: UnfoldCache = new Map();
  const beamAt = new Map<string, BeamAtElement>(); // chain element id → the light arriving there
  const pointKey = (pathId: string, elementId: string, where: string): string => `${pathId}|${elementId}|${where}`; // each path's piece of the unfolded benches, made once for all leaves
  const fieldless = new Set<string>(); // lasers whose clipped light was taken as all inside the limiting aperture
  const laserFigures = new Map<string, LaserFigures>(); // each laser's own figures, worked out once for all its leaves
  for (const leaf of leaves) {
    const chain = unfoldPath(doc, byId, pathsById, leaf.id, unfoldCache);
    const elements: BeamAtElement[] = chain.doc.elements.map((e) => {
      // a chain id names one element on one path, so its light is the same in every leaf (only a turn's OD differs)
      let at = beamAt.get(e.id);
      if (at === undefined || at.kind !== e.kind || at.positionMm !== e.positionMm) {
        const o = chain.origin.get(e.id);
        let incident: BeamAtElement["incident"] = null;
        if (o?.role === "edge") incident = pathsById.get(o.pathId)?.arrival ?? null;
        else if (o?.elementId) incident = entryOf.get(`${o.pathId}|${o.elementId}`)?.incident ?? null;
        beamAt.set(e.id, (at = { id: e.id, kind: e.kind, positionMm: e.positionMm, incident }));
      }
      return at;
    });
    let rail: ReturnType<typeof assessRail>;
    try {
      // behind a clipping aperture, E from the propagated field (the bench document contract revision 2), as on the rail
      const enclosedPowerMw = beam.fieldPower ? beam.fieldPower(leaf.id) : allInsideBehindClip(chain.doc, () => fieldless.add(leaf.laserId));
      // a point an earlier leaf gave (the same path and element, so the same light) is not worked out again
      const skipPoint = (chainElementId: string, where: HazardPoint["where"]): boolean => {
        const o = chain.origin.get(chainElementId);
        return o !== undefined && o.role !== "edge" && o.elementId !== null && points.has(pointKey(o.pathId, o.elementId, where));
      };
      rail = assessRail(chain.doc, { elements, skipPoint, laserFigures, ownCautions: true, ...(enclosedPowerMw ? { enclosedPowerMw } : {}) }, { ...options, labelClass: undefined });
    } catch (error) {
      warnings.push({
        code: "path-not-assessed",
        pathId: leaf.id,
        message: `The beam path ${leaf.id} of laser "${leaf.laserId}" could not be assessed (${error instanceof Error ? error.message : "unknown reason"}). Ask the safety officer.`,
      });
      continue;
    }
    const situations = situationsByLaser.get(leaf.laserId);
    for (const p of rail.points) {
      const o = chain.origin.get(p.elementId);
      if (!o) continue;
      const path = pathsById.get(o.pathId);
      let elementId = o.elementId;
      let kind = p.kind;
      if (o.role === "edge") {
        if (p.where === "element") {
          edgePoints.set(o.pathId, p); // the edge's own figures are the open beam's
          continue;
        }
        elementId = path && path.elementIds.length > 0 ? path.elementIds[path.elementIds.length - 1] : (path?.startElementId ?? null);
        kind = elementId ? (byId.get(elementId)?.kind ?? "edge") : "edge";
      } else if (o.role === "turn" || o.role === "element") {
        kind = byId.get(o.elementId as string)?.kind ?? p.kind;
      }
      if (elementId === null) continue;
      const key = pointKey(o.pathId, elementId, p.where); // at most one focus per gap, one point per element
      if (points.has(key)) continue;
      points.set(key, {
        elementId, kind, where: p.where, positionMm: p.positionMm, powerMw: p.powerMw, radiusMm: p.radiusMm,
        peakIrradianceWPerCm2: p.peakIrradianceWPerCm2, averagedIrradianceWPerCm2: p.averagedIrradianceWPerCm2,
        opticalDensityRaw: p.opticalDensityRaw, opticalDensityRequired: p.opticalDensityRequired,
        ...(p.lines === undefined ? {} : { lines: p.lines }), pathId: o.pathId, laserId: leaf.laserId,
      });
      if (p.where !== "element") situations?.add("focusing-optics");
    }
    for (const h of rail.lensHazards) {
      const o = chain.origin.get(h.elementId);
      if (!o?.elementId) continue;
      const key = `${o.pathId}|${o.elementId}`;
      if (!lensHazards.has(key)) lensHazards.set(key, { ...h, elementId: o.elementId, pathId: o.pathId });
      const lens = byId.get(o.elementId);
      if (lens?.kind === "lens" && lens.focalLengthMm > 0) situations?.add("focusing-optics");
    }
    for (const h of rail.screenHazards) {
      const o = chain.origin.get(h.elementId);
      if (!o?.elementId) continue;
      const key = `${o.pathId}|${o.elementId}`;
      if (!screenHazards.has(key)) screenHazards.set(key, { ...h, elementId: o.elementId, pathId: o.pathId });
      situations?.add("screen-in-beam");
    }
    for (const w of rail.warnings) {
      if (w.code === "open-beam-end") continue; // reported per open beam below
      const o = w.elementId === undefined ? undefined : chain.origin.get(w.elementId);
      const entry = { code: w.code, ...(o?.elementId ? { elementId: o.elementId } : {}), message: w.message };
      if (!warnings.some((x) => x.code === entry.code && x.elementId === entry.elementId && x.message === entry.message)) warnings.push(entry);
    }
  }

  for (const laserId of fieldless) {
    notes.push(`Laser "${laserId}": behind a clipping aperture the light was taken to fall wholly inside the limiting aperture (the propagated field was not available here), the cautious reading.`);
  }

  // 3. Every path that leaves the table.
  const openBeams: OpenBeam[] = [];
  for (const path of beam.paths) {
    if (!("edge" in path.end)) continue;
    const laser = byId.get(path.laserId);
    if (!laser || laser.kind !== "laser") continue;
    const situations = situationsByLaser.get(laser.id);
    situations?.add("open-beam-end");
    const arrival = path.arrival;
    const m2 = laser.m2 ?? 1;
    const laserPower = laserBeamPowerMw(laser);
    const powerScale = arrival && laserPower > 0 ? arrival.powerMw / laserPower : path.shareOfLaser;
    const radiusMm = arrival ? arrival.radiusMm : laser.beamDiameterMm / 2;
    let exceeds = false;
    let od = 0;
    let nohd = 0;
    for (const line of linesOf(laser)) {
      const waist = arrival ? waistFrom({ ...arrival }, line.wavelengthNm, m2) : { radiusMm: laser.beamDiameterMm / 2, distanceMm: 0 };
      try {
        const a = assessLine(laser, line, { diameterMm: 2 * radiusMm, divergenceMrad: divergenceMradOf(line.wavelengthNm, m2, waist.radiusMm), powerScale }, options);
        nohd = Math.max(nohd, a.nohdM);
      } catch {
        nohd = Number.POSITIVE_INFINITY; // cannot say: the cautious answer
      }
    }
    // exceedsMpe and OD: the rail assessment's figures at the edge (every line, with the sum of fractions)
    const atEdge = edgePoints.get(path.id);
    if (atEdge && atEdge.opticalDensityRaw !== null) {
      exceeds = atEdge.opticalDensityRaw > 0;
      od = atEdge.opticalDensityRequired;
    } else if (!atEdge) {
      exceeds = true; // not assessed: the cautious answer
      od = Number.POSITIVE_INFINITY;
    }
    const edge = path.end.edge as { xMm: number; yMm: number };
    const open: OpenBeam = {
      pathId: path.id,
      laserId: laser.id,
      startElementId: path.startElementId,
      role: path.role,
      xMm: edge.xMm,
      yMm: edge.yMm,
      directionDeg: path.directionDeg,
      powerMw: arrival ? arrival.powerMw : laserPower * path.shareOfLaser,
      exceedsMpe: exceeds,
      opticalDensityRequired: od,
      nohdM: nohd,
    };
    openBeams.push(open);
    const from = path.parentPathId === null ? `laser "${laser.id}"` : describeRole(path.role, byId.get(path.startElementId));
    warnings.push({
      code: exceeds ? "open-beam" : "open-beam-below-mpe",
      elementId: path.startElementId,
      pathId: path.id,
      message: exceeds
        ? `Open beam above the MPE: ${from} leaves the table at (${fmt(edge.xMm)}, ${fmt(edge.yMm)}) mm heading ${fmt(path.directionDeg)}° with ${fmt(open.powerMw)} mW; hazardous to ${fmt(nohd)} m beyond the edge (NOHD). Stop it with a beam block on the table.`
        : `${capitalise(from)} leaves the table at (${fmt(edge.xMm)}, ${fmt(edge.yMm)}) mm heading ${fmt(path.directionDeg)}° with ${fmt(open.powerMw)} mW, below the MPE there; end it on a beam block all the same.`,
    });
  }

  // 4. Governing points and cautions.
  const pointList = [...points.values()];
  let governing: TableHazardPoint | null = null;
  for (const result of laserResults) {
    let best: TableHazardPoint | null = null;
    for (const p of pointList) {
      if (p.laserId !== result.laserId || p.opticalDensityRaw === null) continue;
      if (best === null || (best.opticalDensityRaw as number) < p.opticalDensityRaw) best = p;
    }
    result.governing = best;
    if (best && (governing === null || (governing.opticalDensityRaw as number) < (best.opticalDensityRaw as number))) governing = best;
  }
  const cautions: SelectedCaution[] = [];
  const seen = new Set<string>();
  for (const result of laserResults) {
    const laser = byId.get(result.laserId) as LaserV2Element;
    const situations = situationsByLaser.get(result.laserId) ?? new Set<CautionSituation>();
    const od = Math.max(result.governing?.opticalDensityRequired ?? 0, ...result.lines.map((l) => (Number.isFinite(l.opticalDensityRequired) ? l.opticalDensityRequired : 0)));
    if (od > 0) situations.add("eyewear-needed");
    if (Object.keys(pulseFields(laser, 1)).length > 0) situations.add("pulsed");
    for (const c of selectCautions({ hazardClass: result.hazardClass, wavelengthNm: laser.wavelengthNm, situations: [...situations], opticalDensityRequired: od })) {
      const key = `${c.id}|${c.text}`;
      if (seen.has(key)) continue;
      seen.add(key);
      cautions.push(c);
    }
  }

  return {
    version: 2,
    lasers: laserResults,
    openBeams,
    points: pointList,
    governing,
    lensHazards: [...lensHazards.values()],
    screenHazards: [...screenHazards.values()],
    cautions,
    warnings,
    notes,
    limitations: LIMITATIONS,
    finalSay: FINAL_SAY,
  };
}

const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

function describeRole(role: string, e: TableElement | undefined): string {
  const id = e ? `"${e.id}"` : "";
  switch (role) {
    case "front-ghost":
      return `the front-surface ghost of window ${id}`;
    case "rear-ghost":
      return `the rear-surface ghost of window ${id}`;
    case "transmitted":
      return e?.kind === "window" ? `the beam through window ${id}` : `the transmitted port of beam splitter ${id}`;
    default:
      return e?.kind === "beam-splitter" ? `the reflected port of beam splitter ${id}` : `the beam reflected by ${e ? `${e.kind.replace("-", " ")} ${id}` : "a mirror"}`;
  }
}

/**
 * Without the propagated field: at every point at or behind the first element that can clip (an aperture, or a lens or
 * filter with a clear aperture), all the power is taken to lie inside the limiting aperture — never less cautious than
 * any field. Undefined when nothing on the unfolded bench can clip.
 */
function allInsideBehindClip(doc: { elements: readonly { id: string; kind: string; positionMm: number; clearApertureMm?: number }[] }, used: () => void): EnclosedPowerMw | undefined {
  const clip = doc.elements.find((e) => e.kind === "aperture" || ((e.kind === "lens" || e.kind === "filter") && e.clearApertureMm !== undefined));
  if (!clip) return undefined;
  const order = new Map(doc.elements.map((e, i) => [e.id, i]));
  const clipIndex = order.get(clip.id) as number;
  return (positionMm, _radiusMm, elementId) => {
    const behind = elementId !== undefined ? (order.get(elementId) ?? -1) > clipIndex : positionMm > clip.positionMm;
    if (!behind) return null;
    used();
    return Number.POSITIVE_INFINITY;
  };
}
