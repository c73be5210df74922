// analyzeBench: the beam at every element, the Fresnel analysis at every aperture the light reaches, and the warnings.
// Sources: Siegman, Lasers (1986) ch. 17, 20 (beam); Born & Wolf §8.2, §8.8 and Hecht §10.3 (zones); Collins, JOSA 60, 1168 (1970) (diffraction through an ABCD system); Self, Appl. Opt. 22, 658 (1983) (focusing inside the Rayleigh range).
//
// Per aperture the screen is the first screen downstream that the light reaches. With only free space between,
// κ = 1/ρ + 1/b exactly as the bench document contract; with lenses between, the Collins integral replaces 1/b by A/B of the
// aperture→screen matrix (and the profile's J0 argument uses B), which reduces to 1/b without lenses. With no
// screen reached, 1/b = 0 (the far field) and the screen fields are null. M² > 1: the embedded Gaussian gives the
// real radius W and curvature; the Fresnel quantities use the true λ with a coherent Gaussian of that W and ρ.
import type { BenchDocument } from "@/lib/bench/schema";
import { laserBeamPowerMw } from "@/lib/bench/laser-power";
import {
  type AbcdMatrix,
  type BeamParameter,
  applyAbcd,
  beamRadiusM,
  curvaturePerM,
  qFromBeam,
  qAtWaist,
  waistOf,
  wavefrontRadiusM,
} from "./gaussian";
import {
  type CentreAppearance,
  type DiffractionRegime,
  centreAppearance,
  centreIntensityRatio,
  diffractionRegime,
  fresnelNumber,
  transmittedFraction,
  uniformWaveRatio,
  zoneRadiiM,
} from "./fresnel";
import {
  type BenchTrace,
  type ElementStatus,
  type EnvelopePoint,
  type TraceEntry,
  type Waist,
  MM_PER_M,
  envelopeOf,
  laserWaistRadiusM,
  systemThrough,
  traceBench,
  waistsOf,
} from "./propagate";
import { type OpticsWarning, formatLengthMm, formatNumber, warning } from "./warnings";
import { type ChainElement, type ChainPrefixCache, FieldChain } from "./chain";
import { gsmBlurWidth, gsmCentreRatio } from "./coherence";
import { kindNoun } from "@/lib/bench/kinds";

const M_PER_MM = 1e-3;
/** Below this |B| the screen is taken to be at (or imaged onto) the aperture; B is clamped to it, keeping its sign. */
const MIN_OBSERVATION_B_M = 1e-9;
export const ZONE_RADII_COUNT = 5;
/** Clipping below 1 % (the bench document contract) makes the zone analysis moot. */
const CLIPS_LITTLE_FRACTION = 0.99;
const PASSES_LITTLE_FRACTION = 0.01;
/** A lens focus counts as "small-waist" when the new waist is under a fifth of the beam radius on the lens. */
const SMALL_WAIST_RATIO = 0.2;
/** Paraxial Gaussian optics is only indicative beyond a far-field half-angle of 0.1 rad (tan θ ≈ θ within 0.3 %). */
const PARAXIAL_MAX_DIVERGENCE_RAD = 0.1;
/** A lens or filter mount cutting off more than this share of the light arriving is warned about. */
const MOUNT_CLIP_WARN_FRACTION = 1e-3;

export type IncidentBeam = {
  /** 1/e² radius arriving at the element. */
  radiusMm: number;
  /** > 0 diverging, < 0 converging, null flat. */
  wavefrontRadiusMm: number | null;
  powerMw: number;
};

export type ElementAnalysis = {
  id: string;
  kind: string;
  positionMm: number;
  /** "lit", or why no light arrives; unlit elements report incident = { radiusMm: 0, wavefrontRadiusMm: null, powerMw: 0 }. */
  status: ElementStatus;
  incident: IncidentBeam;
  /** Power leaving the element (0 for a screen or beam block). */
  outgoingPowerMw: number;
};

export type ApertureAnalysis = {
  id: string;
  positionMm: number;
  diameterMm: number;
  /** The screen the aperture's light reaches, or null. */
  screenId: string | null;
  /** b, aperture to screen along the axis; null without a screen. */
  observationDistanceMm: number | null;
  incident: IncidentBeam;
  /** (R²/λ)(1/ρ + 1/b); with lenses before the screen 1/b → A/B (Collins). Negative when the beam focuses before the screen. */
  fresnelNumber: number;
  /** |N|, the number of half-period zones the aperture exposes as seen from the screen (fractional). */
  zonesExposed: number;
  /** ⌊|N|⌋, the complete zones. */
  completeZones: number;
  /** round(|N|): odd → bright centre, even → dark (for w ≫ R). */
  nearestZoneCount: number;
  regime: DiffractionRegime;
  /** |1 − exp(−R²/w² − iπN)|². */
  centreIntensityRatio: number;
  /** The uniform-wave limit 4 sin²(πN/2). */
  uniformWaveRatio: number;
  centre: CentreAppearance;
  /** 1 − exp(−2R²/w²). */
  transmittedFraction: number;
  /** Absolute on-axis irradiance at the screen: the unobstructed Gaussian's (with the filters and other apertures met on the way) × centreIntensityRatio. Null without a screen. */
  onAxisIrradianceWPerM2: number | null;
  onAxisIrradianceWPerCm2: number | null;
  /** Outer radii of the first five half-period zones in the aperture plane, √(nλ/|1/ρ + 1/b|); empty when that is 0. */
  zoneRadiiMm: number[];
  /** The first non-paraxial term of the zone count, R⁴/(4λ)·(1/ρ³ + 1/b³) (Born & Wolf §8.2 path difference expanded one order further); > 0.1 makes the centre "between". */
  nonParaxialZoneShift: number;
};

export type ScreenAnalysis = {
  id: string;
  positionMm: number;
  /** On-axis intensity with every aperture (and clipping mount) upstream in place ÷ with none. */
  centreIntensityRatio: number;
  centre: CentreAppearance;
  /** Power arriving on the screen, from the propagated field. */
  powerMw: number;
};

export type BenchAnalysis = {
  laserId: string | null;
  wavelengthNm: number | null;
  m2: number;
  /** The screen or beam block where the light stops, or null. */
  stopId: string | null;
  elements: ElementAnalysis[];
  apertures: ApertureAnalysis[];
  /** Every screen the light reaches (the bench document contract revision 2). */
  screens: ScreenAnalysis[];
  /** The waist formed by the laser and by each lit lens (possibly virtual or beyond the next element). */
  waists: Waist[];
  /** 1/e² radius along the lit path, dense near every waist. */
  envelope: EnvelopePoint[];
  warnings: OpticsWarning[];
};

/** Everything the Fresnel integral of one aperture needs, in metres. */
export type FresnelSetup = {
  apertureRadiusM: number;
  wavelengthM: number;
  /** Real 1/e² radius W at the aperture. */
  beamRadiusM: number;
  wavefrontRadiusM: number | null;
  /** a = R²/W². */
  radiusRatioSquared: number;
  /** Aperture→screen matrix (B clamped away from 0); null without a screen. */
  matrix: AbcdMatrix | null;
  /** κ = 1/ρ + A/B (1/ρ without a screen). */
  zoneCurvaturePerM: number;
  fresnelNumber: number;
  /** |B| was below 1 nm: screen at, or imaged onto, the aperture. */
  degenerate: boolean;
  /** Geometric image of the aperture edge on the screen, R·|A + B/ρ|; null without a screen. */
  shadowRadiusM: number | null;
  /** 1/e² radius on the screen of the coherent Gaussian (true λ) without the aperture; null without a screen. */
  coherentScreenRadiusM: number | null;
};

export function fresnelSetup(
  q: BeamParameter,
  wavelengthM: number,
  effectiveWavelengthM: number,
  apertureRadiusM: number,
  screenMatrix: AbcdMatrix | null,
): FresnelSetup {
  const w = beamRadiusM(q, effectiveWavelengthM);
  const curvature = curvaturePerM(q);
  let matrix = screenMatrix;
  let degenerate = false;
  if (matrix !== null && Math.abs(matrix.b) < MIN_OBSERVATION_B_M) {
    degenerate = true;
    matrix = { ...matrix, b: matrix.b < 0 ? -MIN_OBSERVATION_B_M : MIN_OBSERVATION_B_M };
  }
  const kappa = curvature + (matrix === null ? 0 : matrix.a / matrix.b);
  let coherentScreenRadiusM: number | null = null;
  let shadowRadiusM: number | null = null;
  if (matrix !== null) {
    const qCoherent = qFromBeam(w, wavefrontRadiusM(q), wavelengthM);
    coherentScreenRadiusM = beamRadiusM(applyAbcd(matrix, qCoherent), wavelengthM);
    shadowRadiusM = apertureRadiusM * Math.abs(matrix.a + matrix.b * curvature);
  }
  return {
    apertureRadiusM,
    wavelengthM,
    beamRadiusM: w,
    wavefrontRadiusM: wavefrontRadiusM(q),
    radiusRatioSquared: (apertureRadiusM * apertureRadiusM) / (w * w),
    matrix,
    zoneCurvaturePerM: kappa,
    fresnelNumber: fresnelNumber(apertureRadiusM, wavelengthM, kappa),
    degenerate,
    shadowRadiusM,
    coherentScreenRadiusM,
  };
}

export type OpticsInputErrorCode = "no-laser" | "unknown-aperture" | "aperture-not-reached" | "aperture-without-screen" | "bad-option";

/** A request the optics cannot answer (unknown id, aperture in the dark, …): callers turn it into a 400/404 with the message. */
export class OpticsInputError extends Error {
  readonly code: OpticsInputErrorCode;
  constructor(code: OpticsInputErrorCode, message: string) {
    super(message);
    this.name = "OpticsInputError";
    this.code = code;
  }
}

/** The traced bench, one lit aperture and its screen set-up; throws OpticsInputError when there is none. */
export function apertureContext(
  doc: BenchDocument,
  apertureId: string,
  options: { requireScreen: boolean },
): { trace: BenchTrace; index: number; entry: TraceEntry; q: BeamParameter; powerMw: number; screenId: string | null; screenPositionMm: number | null; setup: FresnelSetup; transmissionToScreen: number } {
  const trace = traceBench(doc);
  if (trace.laser === null) throw new OpticsInputError("no-laser", "The bench has no laser.");
  const index = trace.entries.findIndex((en) => en.element.id === apertureId && en.element.kind === "aperture");
  if (index < 0) throw new OpticsInputError("unknown-aperture", `There is no aperture with id "${apertureId}" on the bench.`);
  const entry = trace.entries[index];
  const e = entry.element;
  if (e.kind !== "aperture" || entry.status !== "lit" || entry.incident === null) {
    throw new OpticsInputError("aperture-not-reached", `No light reaches the aperture "${apertureId}".`);
  }
  const stop = trace.stopIndex === null ? null : trace.entries[trace.stopIndex].element;
  const screen = stop !== null && stop.kind === "screen" ? stop : null;
  if (screen === null && options.requireScreen) {
    throw new OpticsInputError("aperture-without-screen", `No screen receives the light of the aperture "${apertureId}", so there is no pattern to compute.`);
  }
  const q = entry.incident.q;
  const system =
    screen === null || trace.stopIndex === null
      ? null
      : systemThrough(
          trace.entries.slice(index + 1, trace.stopIndex).map((en) => en.element),
          e.positionMm,
          screen.positionMm,
          q,
          trace.effectiveWavelengthM,
        );
  const setup = fresnelSetup(q, trace.wavelengthM, trace.effectiveWavelengthM, (e.diameterMm / 2) * M_PER_MM, system?.matrix ?? null);
  return {
    trace,
    index,
    entry,
    q,
    powerMw: entry.incident.powerMw,
    screenId: screen?.id ?? null,
    screenPositionMm: screen?.positionMm ?? null,
    setup,
    transmissionToScreen: system?.transmission ?? 1,
  };
}


/** Above this the first non-paraxial term of the zone count (in zones) makes the centre "between" (issue 12). */
export const NON_PARAXIAL_MAX_ZONES = 0.1;

/**
 * R⁴/(4λ)·(1/ρ³ + (A/B)³): the zone count's next term. The path from the wavefront to the axial point, expanded one
 * order past Born & Wolf §8.2's paraxial zones (√(b² + R²) − b = R²/2b − R⁴/8b³ + …), for the incident curvature 1/ρ
 * and the observation curvature A/B. The exact count is N − shift.
 */
export function nonParaxialZoneShift(apertureRadiusM: number, wavelengthM: number, setup: FresnelSetup): number {
  const c = setup.wavefrontRadiusM === null ? 0 : 1 / setup.wavefrontRadiusM;
  const kb = setup.matrix === null ? 0 : setup.zoneCurvaturePerM - c;
  const r2 = apertureRadiusM * apertureRadiusM;
  return (r2 * r2 * (c * c * c + kb * kb * kb)) / (4 * wavelengthM);
}

export type ChainBuild = { chain: FieldChain; indexOf: Map<string, number> };

/** The field chain of the traced bench (lit elements after the laser, to the stop); null when nothing can clip. */
export function buildChain(trace: BenchTrace, options: { refinement?: number; exactBessel?: boolean; prefixCache?: ChainPrefixCache } = {}): ChainBuild | null {
  const laser = trace.laser;
  if (laser === null) return null;
  const elements: ChainElement[] = [];
  const indexOf = new Map<string, number>();
  let canClip = false;
  for (const en of trace.entries) {
    const e = en.element;
    if (en.status !== "lit" || e.kind === "laser") continue;
    indexOf.set(e.id, elements.length);
    elements.push(e);
    if (e.kind === "aperture" || ((e.kind === "lens" || e.kind === "filter") && e.clearApertureMm !== undefined)) canClip = true;
  }
  if (!canClip) return null;
  const chain = new FieldChain(
    { positionMm: laser.positionMm, q: qAtWaist(laserWaistRadiusM(laser), trace.effectiveWavelengthM), powerMw: laserBeamPowerMw(laser) },
    elements,
    trace.wavelengthM,
    trace.m2,
    options,
  );
  return { chain, indexOf };
}

export type CentreModel = {
  ratio: number;
  /** "closed-form": the bench document contract's single-aperture formula; "gsm": partially coherent (M² > 1); "chain": the propagated field. */
  model: "closed-form" | "gsm" | "chain";
  /** True when a clipping edge lies upstream of the aperture. */
  upstream: boolean;
  /** From the propagated field when upstream; else null (use the Gaussian fraction). */
  transmittedFraction: number | null;
};

/** The centre ratio of the aperture at trace index `index` with it and every clipping edge upstream in place, none downstream. */
export function centreModel(trace: BenchTrace, build: ChainBuild | null, index: number, setup: FresnelSetup): CentreModel {
  const id = trace.entries[index].element.id;
  const ci = build?.indexOf.get(id);
  if (build !== null && ci !== undefined && build.chain.planes.some((p) => p.index < ci)) {
    const plane = build.chain.results[ci]?.plane ?? null;
    const fraction = plane === null ? 1 : plane.powerInRel > 0 ? plane.powerOutRel / plane.powerInRel : 0;
    const at = setup.matrix === null ? null : build.chain.screenIntensity(ci, [0]);
    const ratio = at === null ? centreIntensityRatio(setup.radiusRatioSquared, setup.fresnelNumber) : at.values[0];
    return { ratio, model: "chain", upstream: true, transmittedFraction: fraction };
  }
  if (trace.m2 > 1 && setup.matrix !== null && setup.coherentScreenRadiusM !== null) {
    const t = gsmBlurWidth(setup.radiusRatioSquared, trace.m2);
    const sigmaV = (Math.PI * setup.apertureRadiusM * setup.coherentScreenRadiusM) / (setup.wavelengthM * Math.abs(setup.matrix.b));
    return { ratio: gsmCentreRatio(setup.radiusRatioSquared, setup.fresnelNumber, t, sigmaV), model: "gsm", upstream: false, transmittedFraction: null };
  }
  return { ratio: centreIntensityRatio(setup.radiusRatioSquared, setup.fresnelNumber), model: "closed-form", upstream: false, transmittedFraction: null };
}

/** Laser power × every filter before trace index `index`: what would arrive with no aperture or mount at all. */
function unclippedPowerMw(trace: BenchTrace, index: number): number {
  let p = trace.laser === null ? 0 : laserBeamPowerMw(trace.laser);
  for (let i = 0; i < index; i++) {
    const en = trace.entries[i];
    if (en.status === "lit" && en.element.kind === "filter") p *= Math.pow(10, -en.element.opticalDensity);
  }
  return p;
}

/** The filters' transmission strictly between two trace indices. */
function filtersBetween(entries: readonly TraceEntry[], from: number, to: number | null): number {
  let t = 1;
  const end = to ?? entries.length;
  for (let i = from + 1; i < end; i++) {
    const e = entries[i].element;
    if (entries[i].status === "lit" && e.kind === "filter") t *= Math.pow(10, -e.opticalDensity);
  }
  return t;
}

const NO_LIGHT: IncidentBeam = { radiusMm: 0, wavefrontRadiusMm: null, powerMw: 0 };

function incidentOf(trace: BenchTrace, entry: TraceEntry): IncidentBeam {
  if (entry.incident === null) return NO_LIGHT;
  const r = wavefrontRadiusM(entry.incident.q);
  return {
    radiusMm: beamRadiusM(entry.incident.q, trace.effectiveWavelengthM) * MM_PER_M,
    wavefrontRadiusMm: r === null ? null : r * MM_PER_M,
    powerMw: entry.incident.powerMw,
  };
}

/** Where a Gaussian focus sits relative to the lens's focal plane, in words. */
const focalShift = (shiftMm: number): string =>
  Math.abs(shiftMm) < 1e-3 ? "at the focal plane" : `${formatLengthMm(Math.abs(shiftMm))} ${shiftMm < 0 ? "before" : "beyond"} the focal plane`;
const named = (e: { id: string; kind: string }): string => `${kindNoun(e.kind)} "${e.id}"`;

/** What a caller may share between analyses: the field chain's cache of common beginnings (see FieldChain). */
export type AnalyzeOptions = {
  chainCache?: ChainPrefixCache;
  /** false: leave the drawing envelope out (the table's leaves, which draw from their paths instead). */
  envelope?: boolean;
  /**
   * The table's leaves share what lies upstream of their split: true for an aperture (with the screen its light
   * reaches) or a lens the caller already has from an earlier leaf leaves its analysis and its own warnings out.
   */
  known?: { aperture(id: string, screenId: string | null): boolean; element(id: string): boolean };
  /** Hands out the field chain this analysis built (null when nothing can clip), for a power probe on the same bench. */
  onChain?: (build: ChainBuild | null) => void;
};

/** Pure and synchronous; never throws for a document the schema accepts. */
export function analyzeBench(doc: BenchDocument, options: AnalyzeOptions = {}): BenchAnalysis {
  const trace = traceBench(doc);
  const warnings: OpticsWarning[] = [];
  const { entries } = trace;
  const elements: ElementAnalysis[] = entries.map((entry) => ({
    id: entry.element.id,
    kind: entry.element.kind,
    positionMm: entry.element.positionMm,
    status: entry.status,
    incident: incidentOf(trace, entry),
    outgoingPowerMw: entry.outgoing === null ? 0 : entry.outgoing.powerMw,
  }));
  const laser = trace.laser;
  if (laser === null) {
    warnings.push(warning("no-laser", "There is no laser on the bench, so nothing is lit."));
    return { laserId: null, wavelengthNm: null, m2: 1, stopId: null, elements, apertures: [], screens: [], waists: [], envelope: [], warnings };
  }

  // positions shared by several elements
  for (let i = 0; i < entries.length; ) {
    let j = i + 1;
    while (j < entries.length && entries[j].element.positionMm === entries[i].element.positionMm) j++;
    if (j - i > 1) {
      const group = entries.slice(i, j).map((en) => named(en.element));
      warnings.push(
        warning(
          "same-position",
          `${group.join(", ")} are at the same position, ${formatLengthMm(entries[i].element.positionMm)}; the beam meets them in the order listed (by kind, then id). Move them apart if the order matters.`,
          entries[i + 1].element.id,
        ),
      );
    }
    i = j;
  }

  const stopEntry = trace.stopIndex === null ? null : entries[trace.stopIndex];
  const stop = stopEntry?.element ?? null;
  for (const entry of entries) {
    const e = entry.element;
    if (entry.status === "upstream-of-laser") {
      warnings.push(
        warning(
          "element-upstream-of-laser",
          `The ${named(e)} at ${formatLengthMm(e.positionMm)} is upstream of the laser (at ${formatLengthMm(laser.positionMm)}); the beam travels toward larger positions, so it gets no light and is ignored.`,
          e.id,
        ),
      );
    } else if (entry.status === "beyond-stop" && stop !== null) {
      const code = e.kind === "aperture" ? "aperture-not-reached" : "element-beyond-stop";
      warnings.push(
        warning(code, `The ${named(e)} at ${formatLengthMm(e.positionMm)} lies beyond the ${named(stop)}, which stops the light; it gets none${e.kind === "aperture" ? " and has no Fresnel analysis" : ""}.`, e.id),
      );
    }
  }
  const screensDownstream = entries.filter((en) => en.status !== "upstream-of-laser" && en.element.kind === "screen");
  if (screensDownstream.length === 0) {
    warnings.push(warning("no-screen", "There is no screen downstream of the laser, so no diffraction pattern is observed and no aperture has an observation distance."));
  } else if (stop === null || stop.kind !== "screen") {
    const blocker = stop ?? null;
    warnings.push(
      warning(
        "screen-not-reached",
        `Nothing reaches the ${named(screensDownstream[0].element)}: ${blocker === null ? "the light does not get there" : `the ${named(blocker)} at ${formatLengthMm(blocker.positionMm)} stops the beam first`}.`,
        screensDownstream[0].element.id,
      ),
    );
  }

  const chainBuild = buildChain(trace, options.chainCache ? { prefixCache: options.chainCache } : {});
  options.onChain?.(chainBuild);

  // apertures
  const apertures: ApertureAnalysis[] = [];
  const screen = stop !== null && stop.kind === "screen" ? stop : null;
  entries.forEach((entry, index) => {
    const e = entry.element;
    if (e.kind !== "aperture" || entry.status !== "lit" || entry.incident === null) return;
    if (options.known?.aperture(e.id, screen?.id ?? null)) return;
    const q = entry.incident.q;
    const radiusM = (e.diameterMm / 2) * M_PER_MM;
    const system =
      screen === null || trace.stopIndex === null
        ? null
        : systemThrough(
            entries.slice(index + 1, trace.stopIndex).map((en) => en.element),
            e.positionMm,
            screen.positionMm,
            q,
            trace.effectiveWavelengthM,
          );
    const setup = fresnelSetup(q, trace.wavelengthM, trace.effectiveWavelengthM, radiusM, system?.matrix ?? null);
    const n = setup.fresnelNumber;
    const model = centreModel(trace, chainBuild, index, setup);
    const ratio = model.ratio;
    const fraction = model.transmittedFraction ?? transmittedFraction(radiusM, setup.beamRadiusM);
    let irradianceWPerM2: number | null = null;
    if (system !== null) {
      // unobstructed: the real (M²) beam at the screen carrying the power that would arrive with no aperture at all
      const wScreen = beamRadiusM(applyAbcd(system.matrix, q), trace.effectiveWavelengthM);
      const powerW = model.upstream ? unclippedPowerMw(trace, index) * 1e-3 * filtersBetween(entries, index, trace.stopIndex) : entry.incident.powerMw * 1e-3 * system.transmission;
      irradianceWPerM2 = ((2 * powerW) / (Math.PI * wScreen * wScreen)) * ratio;
    }
    const shift = nonParaxialZoneShift(radiusM, trace.wavelengthM, setup);
    let centre = centreAppearance(ratio);
    if (Math.abs(shift) > NON_PARAXIAL_MAX_ZONES && screen !== null) {
      centre = "between";
      warnings.push(
        warning(
          "zone-count-non-paraxial",
          `At the ${named(e)} the paraxial zone count (${formatNumber(Math.abs(n))}) is uncertain by ${formatNumber(Math.abs(shift))} zone (the next term of the path difference, R⁴/(4λ)·(1/ρ³ + 1/b³)): the aperture is too wide for its distance to call the centre, so it is shown as "between".`,
          e.id,
        ),
      );
    }
    if (model.model === "chain" && trace.m2 > 1) centre = "between";
    const zones = Math.abs(n);
    const record: ApertureAnalysis = {
      id: e.id,
      positionMm: e.positionMm,
      diameterMm: e.diameterMm,
      screenId: screen?.id ?? null,
      observationDistanceMm: screen === null ? null : screen.positionMm - e.positionMm,
      incident: incidentOf(trace, entry),
      fresnelNumber: n,
      zonesExposed: zones,
      completeZones: Math.floor(zones),
      nearestZoneCount: Math.round(zones),
      regime: diffractionRegime(n),
      centreIntensityRatio: ratio,
      uniformWaveRatio: uniformWaveRatio(n),
      centre,
      transmittedFraction: fraction,
      onAxisIrradianceWPerM2: irradianceWPerM2,
      onAxisIrradianceWPerCm2: irradianceWPerM2 === null ? null : irradianceWPerM2 * 1e-4,
      zoneRadiiMm: zoneRadiiM(trace.wavelengthM, setup.zoneCurvaturePerM, ZONE_RADII_COUNT).map((r) => r * MM_PER_M),
      nonParaxialZoneShift: shift,
    };
    apertures.push(record);

    const wMm = setup.beamRadiusM * MM_PER_M;
    if (fraction > CLIPS_LITTLE_FRACTION) {
      warnings.push(
        warning(
          "aperture-clips-little",
          `The ${named(e)} (${formatLengthMm(e.diameterMm)} across) clips ${(1 - fraction) * 100 < 0.01 ? "less than 0.01" : `only ${formatNumber((1 - fraction) * 100)}`} % of the beam (1/e² radius ${formatLengthMm(wMm)}): the beam hardly touches its edge, so its zone count and centre prediction are moot.`,
          e.id,
        ),
      );
    } else if (fraction < PASSES_LITTLE_FRACTION) {
      warnings.push(
        warning("aperture-passes-little", `The ${named(e)} passes only ${formatNumber(fraction * 100)} % of the beam's power (1/e² radius ${formatLengthMm(wMm)} on a ${formatLengthMm(e.diameterMm)} aperture).`, e.id),
      );
    }
    if (screen === null) {
      warnings.push(
        warning(
          "aperture-without-screen",
          `No screen receives the light of the ${named(e)}, so it has no observation distance; its Fresnel number (${formatNumber(n)}) is for the far field (1/b = 0).`,
          e.id,
        ),
      );
    } else {
      if (setup.degenerate) {
        warnings.push(
          warning("screen-at-aperture", `The ${named(screen)} is at, or imaged onto, the ${named(e)}: it shows the aperture's shadow, not a diffraction pattern, and the zone figures are not meaningful.`, e.id),
        );
      }
      if (system !== null && system.lensIds.length > 0) {
        warnings.push(
          warning(
            "lens-between-aperture-and-screen",
            `Lens${system.lensIds.length > 1 ? "es" : ""} ${system.lensIds.map((id) => `"${id}"`).join(", ")} between the ${named(e)} and the ${named(screen)}: the zones are counted through the lens system (Collins integral, 1/b replaced by A/B), not over the bare distance.`,
            e.id,
          ),
        );
      }
      if (system !== null && system.apertureIds.length > 0) {
        warnings.push(
          warning(
            "apertures-in-series",
            `The ${named(e)} is followed by aperture${system.apertureIds.length > 1 ? "s" : ""} ${system.apertureIds.map((id) => `"${id}"`).join(", ")} before the screen: its centre figure is for it and the apertures upstream of it only; the screen's own figure has every aperture in place (the diffracted field is carried through all of them).`,
            e.id,
          ),
        );
      }
    }
  });
  if (trace.m2 > 1 && apertures.length > 0) {
    const chained = chainBuild !== null && chainBuild.chain.planes.length > 1;
    warnings.push(
      chained
        ? warning(
            "coherent-model-for-m2",
            `The laser's M² is ${formatNumber(trace.m2)} and the light passes more than one clipping edge: the field is carried as a coherent Gaussian of the real size, which a partially coherent beam does not follow, so centres behind the second edge are shown as "between".`,
            laser.id,
          )
        : warning(
            "partially-coherent-beam",
            `The laser's M² is ${formatNumber(trace.m2)}: the pattern is computed for a partially coherent (Gaussian Schell-model) beam of the same size and divergence, so its contrast is lower than a perfect beam's; bright or dark is given only where the contrast allows.`,
            laser.id,
          ),
    );
  }

  const laserDivergenceRad = trace.effectiveWavelengthM / (Math.PI * laserWaistRadiusM(laser));
  if (laserDivergenceRad > PARAXIAL_MAX_DIVERGENCE_RAD) {
    warnings.push(
      warning(
        "focus-beyond-paraxial",
        `The laser's waist (${formatLengthMm(laser.beamDiameterMm / 2)} radius) diverges at ${formatNumber(laserDivergenceRad)} rad: beyond paraxial optics, so the predicted beam sizes are only indicative.`,
        laser.id,
      ),
    );
  }

  // lenses: focusing inside the Rayleigh range, and foci beyond paraxial optics
  for (const entry of entries) {
    const e = entry.element;
    if (e.kind !== "lens" || entry.status !== "lit" || entry.incident === null || entry.outgoing === null) continue;
    if (options.known?.element(e.id)) continue;
    const qIn = entry.incident.q;
    const radiusInM = beamRadiusM(qIn, trace.effectiveWavelengthM);
    const waist = waistOf(entry.outgoing.q, trace.effectiveWavelengthM);
    const waistMm = e.positionMm + waist.offsetM * MM_PER_M;
    if (e.focalLengthMm > 0 && Math.abs(qIn.re) < qIn.im && waist.offsetM > 0 && waist.radiusM < SMALL_WAIST_RATIO * radiusInM) {
      warnings.push(
        warning(
          "lens-focus-in-rayleigh-range",
          `The ${named(e)} (f = ${formatLengthMm(e.focalLengthMm)}) sits inside the Rayleigh range of the incoming beam (zR = ${formatLengthMm(qIn.im * MM_PER_M)}) and focuses it to a small waist of ${formatLengthMm(waist.radiusM * MM_PER_M)} radius at ${formatLengthMm(waistMm)}, ${focalShift(waist.offsetM * MM_PER_M - e.focalLengthMm)} (Self 1983); the irradiance there is high.`,
          e.id,
        ),
      );
    }
    const divergenceRad = trace.effectiveWavelengthM / (Math.PI * waist.radiusM);
    if (divergenceRad > PARAXIAL_MAX_DIVERGENCE_RAD) {
      warnings.push(
        warning(
          "focus-beyond-paraxial",
          `The ${named(e)} makes a waist of ${formatLengthMm(waist.radiusM * MM_PER_M)} radius, diverging at ${formatNumber(divergenceRad)} rad: beyond paraxial optics, so the predicted size and position are only indicative.`,
          e.id,
        ),
      );
    }
  }

  // the propagated field: powers behind the clipping edges, mounts that clip, and what reaches the screen
  const screens: ScreenAnalysis[] = [];
  if (chainBuild !== null) {
    const { chain, indexOf } = chainBuild;
    const byId = new Map(chain.results.map((r) => [r.id, r]));
    for (const el of elements) {
      const r = byId.get(el.id);
      if (r === undefined || el.status !== "lit") continue;
      el.incident = { ...el.incident, powerMw: r.incidentPowerMw };
      el.outgoingPowerMw = r.outgoingPowerMw;
    }
    for (const ap of apertures) {
      const r = byId.get(ap.id);
      if (r !== undefined) ap.incident = { ...ap.incident, powerMw: r.incidentPowerMw };
    }
    for (const plane of chain.planes) {
      const e = chain.elements[plane.index];
      if (e.kind === "lens" || e.kind === "filter") {
        const lost = plane.powerInRel > 0 ? 1 - plane.powerOutRel / plane.powerInRel : 0;
        if (lost > MOUNT_CLIP_WARN_FRACTION) {
          warnings.push(
            warning(
              "clear-aperture-clips",
              `The ${named(e)}'s mount (${formatLengthMm(e.clearApertureMm ?? 0)} clear aperture) cuts off ${formatNumber(lost * 100)} % of the light arriving there: it acts as an aperture, and the light behind it carries its diffraction rings.`,
              e.id,
            ),
          );
        }
      }
      if (plane.method === "geometric-limit") {
        warnings.push(
          warning(
            "field-geometric-limit",
            `Behind the ${named(e)} the diffracted field is taken in the geometric limit (its edge is imaged close to, or lies very many zones from, the previous one), so the figures downstream of it are approximate.`,
            e.id,
          ),
        );
      }
    }
    if (screen !== null && chain.stopIndex !== null) {
      const stopResult = chain.results[chain.stopIndex];
      const last = chain.planes.length > 0 ? chain.planes[chain.planes.length - 1] : null;
      const lastRecord = last === null ? undefined : apertures.find((a) => a.id === last.elementId);
      let ratio = 1;
      let centre: CentreAppearance = "between";
      if (lastRecord !== undefined) {
        ratio = lastRecord.centreIntensityRatio;
        centre = lastRecord.centre;
      } else if (last !== null) {
        const at = chain.screenIntensity(indexOf.get(stopResult.id) ?? chain.stopIndex, [0]);
        ratio = at === null ? 1 : at.values[0];
        centre = trace.m2 > 1 ? "between" : centreAppearance(ratio);
      }
      screens.push({ id: screen.id, positionMm: screen.positionMm, centreIntensityRatio: ratio, centre, powerMw: stopResult.incidentPowerMw });
    }
  } else if (screen !== null && stopEntry !== null && stopEntry.incident !== null) {
    screens.push({ id: screen.id, positionMm: screen.positionMm, centreIntensityRatio: 1, centre: "between", powerMw: stopEntry.incident.powerMw });
  }

  return {
    laserId: laser.id,
    wavelengthNm: laser.wavelengthNm,
    m2: trace.m2,
    stopId: stop?.id ?? null,
    elements,
    apertures,
    screens,
    waists: waistsOf(trace),
    envelope: options.envelope === false ? [] : envelopeOf(trace),
    warnings,
  };
}
