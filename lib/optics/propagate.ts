// The Gaussian beam through the bench: beam order, q at every element, power, the waists and the envelope for drawing.
// Sources: Siegman, Lasers (1986) ch. 17 and 20 (q and ABCD); the embedded-Gaussian rule λ → M²λ (Siegman ch. 17.7; ISO 11146).
//
// Beam order: by positionMm, ties broken by kind (laser, lens, filter, aperture, screen, beam-block) and then by id,
// so reordering the input array never changes a result. Elements upstream of the laser see no light. Light stops
// at the first screen or beam block. After a clipping aperture the beam is taken to keep the same q (radius and
// wavefront) with its power multiplied by the transmitted fraction 1 − exp(−2R²/w²): the usual engineering
// choice; the real clipped beam carries diffraction rings and spreads slightly faster, which the Fresnel
// analysis of that aperture describes and the envelope does not. Internal lengths are metres; the API is mm.
import { laserBeamPowerMw } from "@/lib/bench/laser-power";
import type { BenchDocument, BenchElement, LaserElement } from "@/lib/bench/schema";
import { type AbcdMatrix, type BeamParameter, IDENTITY, beamRadiusM, compose, freeSpace, lensQ, propagateQ, qAtWaist, thinLens, waistOf } from "./gaussian";
import { transmittedFraction } from "./fresnel";

export const MM_PER_M = 1000;
const M_PER_MM = 1e-3;
const M_PER_NM = 1e-9;

/**
 * The laser's waist radius, never below 1 nm: the schema accepts any positive diameter, and a waist far under λ
 * is outside paraxial optics anyway (analyzeBench warns "focus-beyond-paraxial"); the floor keeps every figure finite.
 */
export const laserWaistRadiusM = (laser: LaserElement): number => Math.max((laser.beamDiameterMm / 2) * M_PER_MM, 1e-9);

const KIND_RANK: Record<string, number> = { laser: 0, lens: 1, filter: 2, aperture: 3, screen: 4, "beam-block": 5 };
const rankOf = (kind: string): number => KIND_RANK[kind] ?? 6;

/** Beam order: positionMm, then kind rank, then id (code-unit order, locale-free). */
export function compareBeamOrder(x: BenchElement, y: BenchElement): number {
  if (x.positionMm !== y.positionMm) return x.positionMm - y.positionMm;
  const r = rankOf(x.kind) - rankOf(y.kind);
  if (r !== 0) return r;
  return x.id < y.id ? -1 : x.id > y.id ? 1 : 0;
}

export const isStop = (e: BenchElement): boolean => e.kind === "screen" || e.kind === "beam-block";

export type BeamState = { readonly q: BeamParameter; readonly powerMw: number };

export type ElementStatus = "lit" | "upstream-of-laser" | "beyond-stop";

export type TraceEntry = {
  readonly element: BenchElement;
  readonly status: ElementStatus;
  /** Beam arriving at the element; null unless lit. */
  readonly incident: BeamState | null;
  /** Beam leaving the element; null when it stops the beam or is not lit. */
  readonly outgoing: BeamState | null;
};

export type BenchTrace = {
  readonly laser: LaserElement | null;
  readonly wavelengthM: number;
  readonly m2: number;
  /** M²·λ, the wavelength of the embedded Gaussian. */
  readonly effectiveWavelengthM: number;
  /** Every element, in beam order. */
  readonly entries: readonly TraceEntry[];
  /** Index in entries of the screen or beam block that stops the light; null if nothing does. */
  readonly stopIndex: number | null;
};

/** Gaussian power inside a lens or filter mount of the given clear aperture (1 when none is given). */
const mountFraction = (clearApertureMm: number | undefined, q: BeamParameter, effectiveWavelengthM: number): number =>
  clearApertureMm === undefined ? 1 : transmittedFraction((clearApertureMm / 2) * M_PER_MM, beamRadiusM(q, effectiveWavelengthM));

/** Power transmission of an element for an incident beam (1 for lenses, 10^−OD for filters, the Gaussian fraction for apertures). */
export function elementTransmission(e: BenchElement, q: BeamParameter, effectiveWavelengthM: number): number {
  switch (e.kind) {
    case "filter":
      return Math.pow(10, -e.opticalDensity) * mountFraction(e.clearApertureMm, q, effectiveWavelengthM);
    case "lens":
      return mountFraction(e.clearApertureMm, q, effectiveWavelengthM);
    case "aperture":
      return transmittedFraction((e.diameterMm / 2) * M_PER_MM, beamRadiusM(q, effectiveWavelengthM));
    case "screen":
    case "beam-block":
      return 0;
    default:
      return 1;
  }
}

/** Trace the embedded Gaussian from the laser through the bench. Never throws for a schema-valid document. */
export function traceBench(doc: BenchDocument): BenchTrace {
  const sorted = [...doc.elements].sort(compareBeamOrder);
  const laser = (sorted.find((e) => e.kind === "laser") as LaserElement | undefined) ?? null;
  if (laser === null) {
    return {
      laser: null,
      wavelengthM: NaN,
      m2: 1,
      effectiveWavelengthM: NaN,
      entries: sorted.map((element) => ({ element, status: "upstream-of-laser", incident: null, outgoing: null })),
      stopIndex: null,
    };
  }
  const wavelengthM = laser.wavelengthNm * M_PER_NM;
  const m2 = laser.m2 ?? 1;
  const effectiveWavelengthM = wavelengthM * m2;
  const entries: TraceEntry[] = [];
  let seenLaser = false;
  let stopIndex: number | null = null;
  let q: BeamParameter = qAtWaist(laserWaistRadiusM(laser), effectiveWavelengthM);
  let powerMw = laserBeamPowerMw(laser);
  let lastPositionMm = laser.positionMm;
  for (const element of sorted) {
    if (!seenLaser) {
      if (element === laser) {
        seenLaser = true;
        const state: BeamState = { q, powerMw };
        entries.push({ element, status: "lit", incident: state, outgoing: state });
      } else {
        entries.push({ element, status: "upstream-of-laser", incident: null, outgoing: null });
      }
      continue;
    }
    if (stopIndex !== null) {
      entries.push({ element, status: "beyond-stop", incident: null, outgoing: null });
      continue;
    }
    q = propagateQ(q, (element.positionMm - lastPositionMm) * M_PER_MM);
    lastPositionMm = element.positionMm;
    const incident: BeamState = { q, powerMw };
    if (element.kind === "lens") q = lensQ(q, element.focalLengthMm * M_PER_MM);
    const t = elementTransmission(element, incident.q, effectiveWavelengthM);
    powerMw *= t;
    if (isStop(element)) {
      stopIndex = entries.length;
      entries.push({ element, status: "lit", incident, outgoing: null });
    } else {
      entries.push({ element, status: "lit", incident, outgoing: { q, powerMw } });
    }
  }
  return { laser, wavelengthM, m2, effectiveWavelengthM, entries, stopIndex };
}

/**
 * The embedded-Gaussian q (metres) and power just before `positionMm`, as if the elements in excludeIds were absent.
 * Null if the position is upstream of the laser or past the stop. Apertures upstream are applied (power × fraction).
 */
export function beamBefore(trace: BenchTrace, positionMm: number, excludeIds: ReadonlySet<string> = new Set()): BeamState | null {
  if (trace.laser === null || positionMm < trace.laser.positionMm) return null;
  const stop = trace.stopIndex === null ? null : trace.entries[trace.stopIndex].element;
  if (stop !== null && !excludeIds.has(stop.id) && stop.positionMm < positionMm) return null;
  // replay lenses, filters and apertures in (laser, positionMm), skipping the excluded ones
  let q = qAtWaist(laserWaistRadiusM(trace.laser), trace.effectiveWavelengthM);
  let powerMw = laserBeamPowerMw(trace.laser);
  let last = trace.laser.positionMm;
  for (const entry of trace.entries) {
    const e = entry.element;
    if (entry.status === "upstream-of-laser" || e.kind === "laser" || excludeIds.has(e.id)) continue;
    if (e.positionMm >= positionMm) break;
    if (isStop(e)) return null;
    q = propagateQ(q, (e.positionMm - last) * M_PER_MM);
    last = e.positionMm;
    powerMw *= elementTransmission(e, q, trace.effectiveWavelengthM);
    if (e.kind === "lens") q = lensQ(q, e.focalLengthMm * M_PER_MM);
  }
  return { q: propagateQ(q, (positionMm - last) * M_PER_MM), powerMw };
}

/**
 * The paraxial system from a plane at fromMm through `elements` (in beam order, all between the two planes)
 * to a plane at toMm: free space and thin lenses, plus the product of the power transmissions of filters and
 * apertures met by the beam q0 launched at fromMm. Null when a screen or beam block is among the elements.
 */
export function systemThrough(
  elements: readonly BenchElement[],
  fromMm: number,
  toMm: number,
  q0: BeamParameter,
  effectiveWavelengthM: number,
): { matrix: AbcdMatrix; transmission: number; lensIds: string[]; apertureIds: string[] } | null {
  let m: AbcdMatrix = IDENTITY;
  let q = q0;
  let transmission = 1;
  let last = fromMm;
  const lensIds: string[] = [];
  const apertureIds: string[] = [];
  for (const e of elements) {
    if (isStop(e)) return null;
    if (e.kind === "laser") continue;
    const d = (e.positionMm - last) * M_PER_MM;
    m = compose(freeSpace(d), m);
    q = propagateQ(q, d);
    last = e.positionMm;
    transmission *= elementTransmission(e, q, effectiveWavelengthM);
    if (e.kind === "lens") {
      m = compose(thinLens(e.focalLengthMm * M_PER_MM), m);
      q = lensQ(q, e.focalLengthMm * M_PER_MM);
      lensIds.push(e.id);
    } else if (e.kind === "aperture") apertureIds.push(e.id);
  }
  m = compose(freeSpace((toMm - last) * M_PER_MM), m);
  return { matrix: m, transmission, lensIds, apertureIds };
}

/** systemThrough for the bench's own elements strictly between two positions, skipping excludeIds. */
export function systemBetween(
  trace: BenchTrace,
  fromMm: number,
  toMm: number,
  q0: BeamParameter,
  excludeIds: ReadonlySet<string> = new Set(),
): ReturnType<typeof systemThrough> {
  const between = trace.entries
    .filter((en) => en.status !== "upstream-of-laser" && !excludeIds.has(en.element.id))
    .map((en) => en.element)
    .filter((e) => e.kind !== "laser" && e.positionMm > fromMm && e.positionMm < toMm);
  return systemThrough(between, fromMm, toMm, q0, trace.effectiveWavelengthM);
}

export type Waist = {
  /** The laser or lens that forms this waist. */
  readonly afterElementId: string;
  readonly positionMm: number;
  readonly radiusMm: number;
  readonly rayleighRangeMm: number;
  /** True when the waist lies upstream of the element that forms it (a diverging beam's virtual waist). */
  readonly virtual: boolean;
  /** True when the beam is stopped (or the next element changes it) before reaching the waist. */
  readonly beyondNextElement: boolean;
};

export function waistsOf(trace: BenchTrace): Waist[] {
  const out: Waist[] = [];
  const lit = trace.entries.filter((e) => e.status === "lit");
  lit.forEach((entry, i) => {
    const e = entry.element;
    if ((e.kind !== "laser" && e.kind !== "lens") || entry.outgoing === null) return;
    const w = waistOf(entry.outgoing.q, trace.effectiveWavelengthM);
    const positionMm = e.positionMm + w.offsetM * MM_PER_M;
    const next = lit[i + 1];
    out.push({
      afterElementId: e.id,
      positionMm,
      radiusMm: w.radiusM * MM_PER_M,
      rayleighRangeMm: w.rayleighRangeM * MM_PER_M,
      virtual: w.offsetM < 0,
      beyondNextElement: next !== undefined && positionMm > next.element.positionMm,
    });
  });
  return out;
}

export type EnvelopePoint = { readonly positionMm: number; readonly radiusMm: number };

const UNIFORM_SAMPLES_PER_SEGMENT = 16;
const WAIST_SAMPLES = 25; // at z_w + zR·sinh(t), t ∈ [−3, 3]: dense at the waist, sparser out to ±10 zR

/**
 * The 1/e² radius along the lit path, for drawing: each free-space segment gets uniform samples plus a
 * sinh-spaced cluster around any waist inside it, so a tight focus is drawn with its true minimum.
 * With no stop, the path is drawn past the last element by max(100 mm, a quarter of the lit span).
 */
export function envelopeOf(trace: BenchTrace): EnvelopePoint[] {
  const lit = trace.entries.filter((e) => e.status === "lit");
  if (trace.laser === null || lit.length === 0) return [];
  const points: EnvelopePoint[] = [];
  const lambda = trace.effectiveWavelengthM;
  const firstMm = lit[0].element.positionMm;
  for (let i = 0; i < lit.length; i++) {
    const entry = lit[i];
    if (entry.outgoing === null) break;
    const startMm = entry.element.positionMm;
    let endMm: number;
    if (i + 1 < lit.length) endMm = lit[i + 1].element.positionMm;
    else endMm = startMm + Math.max(100, 0.25 * (startMm - firstMm));
    const lengthM = (endMm - startMm) * M_PER_MM;
    const q = entry.outgoing.q;
    const offsets: number[] = [];
    for (let k = 0; k <= UNIFORM_SAMPLES_PER_SEGMENT; k++) offsets.push((lengthM * k) / UNIFORM_SAMPLES_PER_SEGMENT);
    const waistOffsetM = -q.re;
    const zr = q.im;
    if (waistOffsetM > -3 * zr && waistOffsetM < lengthM + 3 * zr) {
      for (let k = 0; k < WAIST_SAMPLES; k++) {
        const t = -3 + (6 * k) / (WAIST_SAMPLES - 1);
        const z = waistOffsetM + zr * Math.sinh(t);
        if (z > 0 && z < lengthM) offsets.push(z);
      }
      if (waistOffsetM > 0 && waistOffsetM < lengthM) offsets.push(waistOffsetM);
    }
    offsets.sort((x, y) => x - y);
    // the first point of a later segment repeats the previous segment's last one (a thin element keeps w)
    let prev = i > 0 ? 0 : -Infinity;
    for (const z of offsets) {
      if (z - prev <= 1e-12) continue;
      prev = z;
      const qz = propagateQ(q, z);
      points.push({ positionMm: startMm + z * MM_PER_M, radiusMm: beamRadiusM(qz, lambda) * MM_PER_M });
    }
  }
  return points;
}
