// The beam drawn by hazard: the safety engine's required eyewear OD at every element (and at foci) becomes stretches
// of beam, each in one of three bands with its own fill, hatching and outline dash, so print and colour-blind
// readers see the band without colour. Advice only: the laser safety officer and local rules decide.
import type { BenchDocument } from "@/lib/bench/schema";
import type { HazardPoint } from "@/lib/safety";

export type HazardBandId = "low" | "medium" | "high";

export type HazardBand = {
  id: HazardBandId;
  /** Lower bound of the required OD, inclusive. */
  fromOd: number;
  /** The band in words, for the legend and the labels on the drawing. */
  words: string;
  /** The pattern in words (the legend says how to read the drawing without colour). */
  pattern: string;
};

/** OD under 1, 1 to under 3, 3 and more. */
export const HAZARD_BANDS: readonly HazardBand[] = [
  { id: "low", fromOd: 0, words: "OD under 1", pattern: "light fill, solid edge" },
  { id: "medium", fromOd: 1, words: "OD 1 to under 3", pattern: "single hatching, dashed edge" },
  { id: "high", fromOd: 3, words: "OD 3 or more", pattern: "cross-hatching, dotted thick edge" },
] as const;

export function bandFor(opticalDensity: number): HazardBand {
  let band = HAZARD_BANDS[0];
  for (const b of HAZARD_BANDS) if (opticalDensity >= b.fromOd) band = b;
  return band;
}

export type HazardSegment = { fromMm: number; toMm: number; opticalDensity: number; band: HazardBand };

const STOPS = new Set(["screen", "beam-block"]);

/**
 * Stretches of lit beam between consecutive hazard points, each with the higher OD of its two ends — the OD
 * leaving the upstream point (a filter takes its own OD off; a lens or an aperture is counted as it arrives, which
 * can only overstate) and the OD arriving downstream. Past the last point (an open beam end) the OD leaving it
 * holds to `endMm`. Nothing is drawn after a screen or a beam block.
 */
export function hazardSegments(points: readonly HazardPoint[], doc: BenchDocument, endMm?: number): HazardSegment[] {
  const filterOd = new Map<string, number>();
  for (const e of doc.elements) if (e.kind === "filter") filterOd.set(e.id, e.opticalDensity);
  const lit = points
    .map((p, i) => ({ p, i }))
    .filter(({ p }) => p.opticalDensityRaw !== null && p.powerMw > 0)
    .sort((a, b) => a.p.positionMm - b.p.positionMm || a.i - b.i)
    .map(({ p }) => p);
  const leaving = (p: HazardPoint): number | null => {
    if (p.where !== "element") return p.opticalDensityRequired;
    if (STOPS.has(p.kind)) return null;
    const raw = p.opticalDensityRaw ?? 0;
    const filtered = filterOd.has(p.elementId) ? raw - (filterOd.get(p.elementId) ?? 0) : raw;
    return Math.max(0, filtered);
  };
  const out: HazardSegment[] = [];
  const push = (fromMm: number, toMm: number, od: number) => {
    if (!(toMm > fromMm)) return;
    const last = out.at(-1);
    const band = bandFor(od);
    // neighbours in the same band with the same OD read as one stretch
    if (last && last.toMm === fromMm && last.band.id === band.id && last.opticalDensity === od) last.toMm = toMm;
    else out.push({ fromMm, toMm, opticalDensity: od, band });
  };
  for (let k = 0; k < lit.length; k++) {
    const p = lit[k];
    const odOut = leaving(p);
    if (odOut === null) break; // the light stops here
    const q = lit[k + 1];
    if (q) push(p.positionMm, q.positionMm, Math.max(odOut, q.opticalDensityRequired));
    else if (endMm !== undefined) push(p.positionMm, endMm, odOut);
  }
  return out;
}

/** The part of a sampled envelope between two positions, with the ends interpolated. */
export function envelopeSlice(envelope: readonly { positionMm: number; radiusMm: number }[], fromMm: number, toMm: number): { positionMm: number; radiusMm: number }[] {
  const at = (mm: number): number | null => {
    for (let i = 1; i < envelope.length; i++) {
      const a = envelope[i - 1];
      const b = envelope[i];
      if (mm >= a.positionMm && mm <= b.positionMm) {
        const span = b.positionMm - a.positionMm;
        return span > 0 ? a.radiusMm + ((b.radiusMm - a.radiusMm) * (mm - a.positionMm)) / span : b.radiusMm;
      }
    }
    return null;
  };
  const out: { positionMm: number; radiusMm: number }[] = [];
  const start = at(fromMm);
  if (start !== null) out.push({ positionMm: fromMm, radiusMm: start });
  for (const p of envelope) if (p.positionMm > fromMm && p.positionMm < toMm) out.push(p);
  const end = at(toMm);
  if (end !== null) out.push({ positionMm: toMm, radiusMm: end });
  return out;
}
