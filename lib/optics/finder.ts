// The finder: screen positions that give a bright or dark centre behind an aperture, and the inverse — the aperture
// diameter or position giving a wanted zone count. Sources: Born & Wolf §8.2, §8.8 and Hecht §10.3 (N = R²κ/λ, odd N bright, even dark); Collins, JOSA 60, 1168 (1970) for lenses in between.
//
// The on-axis ratio |1 − e^{−a}e^{−iπN}|² is largest, (1 + e^{−a})², at odd |N| and smallest, (1 − e^{−a})², at
// even |N| (a = R²/w² is fixed by the aperture plane), so every odd crossing is equally bright in relative terms.
// "Best first" therefore ranks by the positional tolerance — how far the screen may move while |N| stays within
// ±¼ of the integer, 0.5/|dN/dz| — so the easiest position to set up comes first. N(z) is sampled adaptively
// (intervals split until |ΔN| ≤ ½) and each integer crossing is refined by bisection to 1e-9 mm.
import type { BenchDocument } from "@/lib/bench/schema";
import { type BeamParameter, applyAbcd, beamRadiusM } from "./gaussian";
import { centreAppearance, centreIntensityRatio, transmittedFraction, type CentreAppearance } from "./fresnel";
import { OpticsInputError, analyzeBench, apertureContext, buildChain, fresnelSetup } from "./analyze";
import { beamBefore, systemBetween } from "./propagate";

const M_PER_MM = 1e-3;
const INITIAL_SAMPLES = 256;
const MAX_EVALUATIONS = 20_000;
const MIN_INTERVAL_MM = 1e-6;
export const DEFAULT_FINDER_RESULTS = 10;

export type ScreenCandidate = {
  positionMm: number;
  observationDistanceMm: number;
  /** The integer |N| at this position. */
  zoneCount: number;
  fresnelNumber: number;
  centreIntensityRatio: number;
  centre: CentreAppearance;
  /** Absolute on-axis irradiance there (unobstructed Gaussian × ratio). */
  onAxisIrradianceWPerCm2: number;
  /** Screen travel keeping |N| within ±¼ of zoneCount: 0.5/|dN/dz|. */
  toleranceMm: number;
};

export type ScreenSearch = {
  /** Odd zone counts, best (widest tolerance) first. */
  bright: ScreenCandidate[];
  /** Even zone counts (≥ 2), best first. */
  dark: ScreenCandidate[];
  /** The range actually searched (clamped to the aperture and to any stop in between). */
  fromMm: number;
  toMm: number;
  notes: string[];
};

type Sample = { z: number; n: number };

/** Sample f on [from, to], splitting intervals until |Δf| ≤ ½; null values (blocked) end a run. */
function sampleAdaptive(f: (z: number) => number | null, from: number, to: number): Sample[][] {
  const runs: Sample[][] = [];
  let run: Sample[] = [];
  let evaluations = 0;
  const evaluate = (z: number): number | null => {
    evaluations++;
    return f(z);
  };
  const refine = (a: Sample, b: Sample, out: Sample[]): void => {
    // iterative subdivision (explicit stack, depth-first so the output stays in order)
    const stack: [Sample, Sample][] = [[a, b]];
    while (stack.length > 0) {
      const [l, r] = stack.pop() as [Sample, Sample];
      if (Math.abs(r.n - l.n) <= 0.5 || r.z - l.z < MIN_INTERVAL_MM || evaluations >= MAX_EVALUATIONS) {
        out.push(r);
        continue;
      }
      const zm = 0.5 * (l.z + r.z);
      const nm = evaluate(zm);
      if (nm === null) {
        out.push(r);
        continue;
      }
      const m = { z: zm, n: nm };
      stack.push([m, r], [l, m]);
    }
  };
  let prev: Sample | null = null;
  for (let i = 0; i <= INITIAL_SAMPLES; i++) {
    const z = from + ((to - from) * i) / INITIAL_SAMPLES;
    const n = evaluate(z);
    if (n === null || !Number.isFinite(n)) {
      if (run.length > 0) runs.push(run);
      run = [];
      prev = null;
      continue;
    }
    const s = { z, n };
    if (prev === null) run.push(s);
    else refine(prev, s, run);
    prev = s;
  }
  if (run.length > 0) runs.push(run);
  return runs;
}

function bisect(f: (z: number) => number | null, lo: number, hi: number, level: number): number {
  let fl = (f(lo) ?? level) - level;
  for (let i = 0; i < 80 && hi - lo > 1e-9; i++) {
    const mid = 0.5 * (lo + hi);
    const fm = (f(mid) ?? level) - level;
    if ((fm <= 0) === (fl <= 0)) {
      lo = mid;
      fl = fm;
    } else hi = mid;
  }
  return 0.5 * (lo + hi);
}

type Crossing = { lo: number; hi: number; level: number; slope: number };

/**
 * Integer levels crossed by the sampled |N|, taken from the flattest intervals first and stopping once `quota`
 * odd and `quota` even levels are found (near the aperture |N| runs to millions, so never enumerate them all).
 * `only` restricts the search to one level.
 */
function integerCrossings(runs: Sample[][], quota: number, only?: number): Crossing[] {
  const intervals: Crossing[] = [];
  for (const run of runs) {
    for (let i = 1; i < run.length; i++) {
      const a = run[i - 1];
      const b = run[i];
      intervals.push({ lo: a.z, hi: b.z, level: 0, slope: Math.abs(b.n - a.n) / Math.max(b.z - a.z, 1e-300) });
    }
  }
  intervals.sort((x, y) => x.slope - y.slope);
  const out: Crossing[] = [];
  let odd = 0;
  let even = 0;
  const nAt = new Map<number, number>();
  for (const run of runs) for (const smp of run) nAt.set(smp.z, smp.n);
  for (const iv of intervals) {
    if (odd >= quota && even >= quota) break;
    const na = nAt.get(iv.lo) ?? 0;
    const nb = nAt.get(iv.hi) ?? 0;
    const lo = Math.min(na, nb);
    const hi = Math.max(na, nb);
    if (only !== undefined) {
      if (lo < only && only <= hi) out.push({ ...iv, level: only });
      continue;
    }
    for (let k = Math.floor(lo) + 1; k <= hi && (odd < quota || even < quota); k++) {
      if (k % 2 === 1) {
        if (odd >= quota) continue;
        odd++;
      } else {
        if (even >= quota) continue;
        even++;
      }
      out.push({ ...iv, level: k });
    }
  }
  return out;
}

/** PRODUCT finder: screen positions in [fromMm, toMm] downstream of the aperture giving a bright (odd) or dark (even) centre. */
export function findScreenPositions(
  doc: BenchDocument,
  apertureId: string,
  range: { fromMm: number; toMm: number; maxResults?: number },
): ScreenSearch {
  const ctx = apertureContext(doc, apertureId, { requireScreen: false });
  const { trace, q, powerMw } = ctx;
  const apertureMm = ctx.entry.element.positionMm;
  const radiusM = ctx.setup.apertureRadiusM;
  const maxResults = Math.max(1, Math.round(range.maxResults ?? DEFAULT_FINDER_RESULTS));
  if (!Number.isFinite(range.fromMm) || !Number.isFinite(range.toMm) || range.toMm <= range.fromMm) {
    throw new OpticsInputError("bad-option", "The search range needs finite fromMm < toMm.");
  }
  const notes: string[] = [];
  const moved = new Set<string>(ctx.screenId === null ? [] : [ctx.screenId]);
  let fromMm = Math.max(range.fromMm, apertureMm + 1e-3);
  let toMm = range.toMm;
  // clamp at the first stop (other than the screen being moved) after the aperture
  for (const en of trace.entries.slice(ctx.index + 1)) {
    const e = en.element;
    if ((e.kind === "screen" || e.kind === "beam-block") && !moved.has(e.id)) {
      if (e.positionMm < toMm) {
        toMm = e.positionMm;
        notes.push(`The search stops at the ${e.kind === "screen" ? "screen" : "beam block"} "${e.id}" (${e.positionMm} mm), which blocks the light beyond it.`);
      }
      break;
    }
  }
  if (toMm <= fromMm) return { bright: [], dark: [], fromMm, toMm, notes: [...notes, "The range lies upstream of the aperture or behind a stop."] };
  fromMm = Math.min(fromMm, toMm);

  const nAt = (zMm: number): number | null => {
    const sys = systemBetween(trace, apertureMm, zMm, q, moved);
    if (sys === null) return null;
    return Math.abs(fresnelSetup(q, trace.wavelengthM, trace.effectiveWavelengthM, radiusM, sys.matrix).fresnelNumber);
  };
  const a = ctx.setup.radiusRatioSquared;
  if ((1 + Math.exp(-a)) ** 2 < 2) {
    notes.push(`The beam is much narrower than the aperture (R²/w² = ${a.toPrecision(3)}), so the centre never reaches twice the unobstructed intensity: odd counts are only slightly brighter.`);
  }
  const crossings = integerCrossings(sampleAdaptive(nAt, fromMm, toMm), maxResults);
  // With a clipping edge upstream (or a partially coherent beam) the centre at a trial position is the whole
  // analysis's: the bench re-analysed with the screen moved there, upstream apertures in place, none downstream.
  const build = buildChain(trace);
  const chainIndex = build?.indexOf.get(apertureId);
  const upstream = build !== null && chainIndex !== undefined && build.chain.planes.some((p) => p.index < chainIndex);
  const analysed = upstream || trace.m2 > 1;
  if (upstream) notes.push("Apertures upstream stay in place: each position's centre comes from the diffracted field through them, and a position whose centre is not clearly bright or dark is left out.");
  const analysedAt = (zMm: number): { ratio: number; centre: CentreAppearance; irradianceWPerCm2: number | null } | null => {
    const screenId = ctx.screenId ?? "finder-screen";
    const elements = [...doc.elements.filter((e) => e.id !== screenId), { id: screenId, kind: "screen" as const, positionMm: zMm }];
    const ap = analyzeBench({ ...doc, elements }).apertures.find((x) => x.id === apertureId);
    if (ap === undefined || ap.screenId !== screenId) return null;
    return { ratio: ap.centreIntensityRatio, centre: ap.centre, irradianceWPerCm2: ap.onAxisIrradianceWPerCm2 };
  };
  const candidate = (c: Crossing): ScreenCandidate | null => {
    const z = c.lo === c.hi ? c.lo : bisect(nAt, c.lo, c.hi, c.level);
    const sys = systemBetween(trace, apertureMm, z, q, moved);
    if (sys === null) return null;
    const setup = fresnelSetup(q, trace.wavelengthM, trace.effectiveWavelengthM, radiusM, sys.matrix);
    const full = analysed ? analysedAt(z) : null;
    if (analysed && full === null) return null;
    const ratio = full?.ratio ?? centreIntensityRatio(a, setup.fresnelNumber);
    const wScreen = beamRadiusM(applyAbcd(sys.matrix, q), trace.effectiveWavelengthM);
    const irradianceWPerM2 = full !== null && full.irradianceWPerCm2 !== null ? full.irradianceWPerCm2 * 1e4 : ((2 * powerMw * 1e-3 * sys.transmission) / (Math.PI * wScreen * wScreen)) * ratio;
    // local slope from a small symmetric difference, falling back to the sampled one
    const dz = Math.max(1e-6, 1e-6 * Math.abs(z));
    const n1 = nAt(z - dz);
    const n2 = nAt(z + dz);
    const slope = n1 !== null && n2 !== null ? Math.abs(n2 - n1) / (2 * dz) : c.slope;
    return {
      positionMm: z,
      observationDistanceMm: z - apertureMm,
      zoneCount: c.level,
      fresnelNumber: setup.fresnelNumber,
      centreIntensityRatio: ratio,
      centre: full?.centre ?? centreAppearance(ratio),
      onAxisIrradianceWPerCm2: irradianceWPerM2 * 1e-4,
      toleranceMm: slope > 0 ? 0.5 / slope : Number.MAX_VALUE,
    };
  };
  const pick = (odd: boolean): ScreenCandidate[] => {
    const chosen = crossings
      .filter((c) => (c.level % 2 === 1) === odd && c.level >= 1)
      .sort((x, y) => x.slope - y.slope)
      .slice(0, maxResults)
      .map(candidate)
      .filter((c): c is ScreenCandidate => c !== null && (!upstream || c.centre === (odd ? "bright" : "dark")));
    return chosen.sort((x, y) => y.toleranceMm - x.toleranceMm);
  };
  const bright = pick(true);
  const dark = pick(false);
  if (bright.length === 0 && dark.length === 0) notes.push("The zone count does not pass a whole number anywhere in the range.");
  return { bright, dark, fromMm, toMm, notes };
}

/** The screen the inverse solvers use: the given position, or the aperture's own screen. */
function screenFor(ctx: ReturnType<typeof apertureContext>, screenPositionMm: number | undefined, apertureMm: number): number {
  const z = screenPositionMm ?? ctx.screenPositionMm;
  if (z === null || z === undefined || !Number.isFinite(z)) {
    throw new OpticsInputError("aperture-without-screen", "Give a screen position: the aperture has no screen downstream.");
  }
  if (z <= apertureMm) throw new OpticsInputError("bad-option", "The screen must lie downstream of the aperture.");
  return z;
}

export type DiameterSolution = {
  /** The diameter giving exactly `zones` half-period zones, or null when no diameter can. */
  diameterMm: number | null;
  fresnelNumber: number | null;
  transmittedFraction: number | null;
  centreIntensityRatio: number | null;
  message: string;
};

/** Inverse: the aperture diameter giving `zones` exposed zones at the screen, N = R²κ/λ ⇒ R = √(zones·λ/|κ|). */
export function solveApertureDiameter(doc: BenchDocument, apertureId: string, zones: number, options: { screenPositionMm?: number } = {}): DiameterSolution {
  if (!Number.isFinite(zones) || zones <= 0) throw new OpticsInputError("bad-option", "The wanted zone count must be a positive number.");
  const ctx = apertureContext(doc, apertureId, { requireScreen: false });
  const { trace, q } = ctx;
  const apertureMm = ctx.entry.element.positionMm;
  const screenMm = screenFor(ctx, options.screenPositionMm, apertureMm);
  const moved = new Set<string>(ctx.screenId === null ? [] : [ctx.screenId]);
  const sys = systemBetween(trace, apertureMm, screenMm, q, moved);
  if (sys === null) return { diameterMm: null, fresnelNumber: null, transmittedFraction: null, centreIntensityRatio: null, message: "A screen or beam block between the aperture and that position stops the light." };
  const kappa = fresnelSetup(q, trace.wavelengthM, trace.effectiveWavelengthM, ctx.setup.apertureRadiusM, sys.matrix).zoneCurvaturePerM;
  if (!(Math.abs(kappa) > 0)) {
    return { diameterMm: null, fresnelNumber: null, transmittedFraction: null, centreIntensityRatio: null, message: "The screen is at the geometric focus of the beam: the zones are infinitely wide, so no diameter gives that count." };
  }
  const radiusM = Math.sqrt((zones * trace.wavelengthM) / Math.abs(kappa));
  const setup = fresnelSetup(q, trace.wavelengthM, trace.effectiveWavelengthM, radiusM, sys.matrix);
  const ratio = centreIntensityRatio(setup.radiusRatioSquared, setup.fresnelNumber);
  return {
    diameterMm: (2 * radiusM) / M_PER_MM,
    fresnelNumber: setup.fresnelNumber,
    transmittedFraction: transmittedFraction(radiusM, setup.beamRadiusM),
    centreIntensityRatio: ratio,
    message: `An aperture ${((2 * radiusM) / M_PER_MM).toPrecision(4)} mm across exposes ${zones} zone${zones === 1 ? "" : "s"} at the screen (${screenMm} mm).`,
  };
}

export type PositionSolution = {
  positionMm: number;
  fresnelNumber: number;
  centreIntensityRatio: number;
  centre: CentreAppearance;
  transmittedFraction: number;
};

/**
 * Inverse: aperture positions between fromMm (default: the laser) and the screen giving `zones` exposed zones.
 * The aperture keeps its diameter; the beam arriving at each trial position is recomputed. Nearest to the current
 * position first.
 */
export function solveAperturePosition(
  doc: BenchDocument,
  apertureId: string,
  zones: number,
  options: { screenPositionMm?: number; fromMm?: number; toMm?: number } = {},
): { solutions: PositionSolution[]; notes: string[] } {
  if (!Number.isFinite(zones) || zones <= 0) throw new OpticsInputError("bad-option", "The wanted zone count must be a positive number.");
  const ctx = apertureContext(doc, apertureId, { requireScreen: false });
  const { trace } = ctx;
  const laserMm = trace.laser?.positionMm ?? 0;
  const apertureMm = ctx.entry.element.positionMm;
  const screenMm = screenFor(ctx, options.screenPositionMm, apertureMm);
  const radiusM = ctx.setup.apertureRadiusM;
  const exclude = new Set<string>([apertureId, ...(ctx.screenId === null ? [] : [ctx.screenId])]);
  const fromMm = Math.max(options.fromMm ?? laserMm, laserMm) + 1e-6;
  const toMm = Math.min(options.toMm ?? screenMm, screenMm) - 1e-6;
  const notes: string[] = [];
  if (toMm <= fromMm) return { solutions: [], notes: ["The range between the laser and the screen is empty."] };
  const at = (zMm: number): { q: BeamParameter; n: number } | null => {
    const beam = beamBefore(trace, zMm, exclude);
    if (beam === null) return null;
    const sys = systemBetween(trace, zMm, screenMm, beam.q, exclude);
    if (sys === null) return null;
    return { q: beam.q, n: Math.abs(fresnelSetup(beam.q, trace.wavelengthM, trace.effectiveWavelengthM, radiusM, sys.matrix).fresnelNumber) };
  };
  const nAt = (zMm: number): number | null => at(zMm)?.n ?? null;
  const solutions: PositionSolution[] = [];
  // every sampled interval where |N| − zones changes sign (or touches 0)
  const wanted: Crossing[] = [];
  for (const run of sampleAdaptive(nAt, fromMm, toMm)) {
    for (let i = 1; i < run.length; i++) {
      const da = run[i - 1].n - zones;
      const db = run[i].n - zones;
      if (da === 0 && i > 1) continue; // already taken as the previous interval's right end
      if (da * db <= 0) wanted.push({ lo: run[i - 1].z, hi: run[i].z, level: zones, slope: 0 });
    }
  }
  for (const c of wanted) {
    const z = c.lo === c.hi ? c.lo : bisect(nAt, c.lo, c.hi, zones);
    const r = at(z);
    if (r === null) continue;
    const setup = fresnelSetup(r.q, trace.wavelengthM, trace.effectiveWavelengthM, radiusM, null);
    const ratio = centreIntensityRatio(setup.radiusRatioSquared, zones);
    solutions.push({
      positionMm: z,
      fresnelNumber: r.n,
      centreIntensityRatio: ratio,
      centre: centreAppearance(ratio),
      transmittedFraction: transmittedFraction(radiusM, setup.beamRadiusM),
    });
  }
  solutions.sort((x, y) => Math.abs(x.positionMm - apertureMm) - Math.abs(y.positionMm - apertureMm));
  if (solutions.length === 0) notes.push(`No position between ${fromMm.toFixed(1)} mm and ${toMm.toFixed(1)} mm gives ${zones} zones with this aperture.`);
  return { solutions, notes };
}
