// analyzeBench: the beam at every element, the Fresnel analysis at every aperture the light reaches, and the warnings.
// Sources: Siegman, Lasers (1986) ch. 17, 20 (beam); Born & Wolf §8.2, §8.8 and Hecht §10.3 (zones); Collins, JOSA 60, 1168 (1970) (diffraction through an ABCD system); Self, Appl. Opt. 22, 658 (1983) (focusing inside the Rayleigh range).
//
// Per aperture the screen is the first screen downstream that the light reaches. With only free space between,
// κ = 1/ρ + 1/b exactly as PRODUCT.md; with lenses between, the Collins integral replaces 1/b by A/B of the
// aperture→screen matrix (and the profile's J0 argument uses B), which reduces to 1/b without lenses. With no
// screen reached, 1/b = 0 (the far field) and the screen fields are null. M² > 1: the embedded Gaussian gives the
// real radius W and curvature; the Fresnel quantities use the true λ with a coherent Gaussian of that W and ρ.
import type { BenchDocument } from "@/lib/bench/schema";
import {
  type AbcdMatrix,
  type BeamParameter,
  applyAbcd,
  beamRadiusM,
  curvaturePerM,
  qFromBeam,
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
import { kindNoun } from "@/lib/bench/kinds";

const M_PER_MM = 1e-3;
/** Below this |B| the screen is taken to be at (or imaged onto) the aperture; B is clamped to it, keeping its sign. */
const MIN_OBSERVATION_B_M = 1e-9;
export const ZONE_RADII_COUNT = 5;
/** Clipping below 1 % (PRODUCT.md) makes the zone analysis moot. */
const CLIPS_LITTLE_FRACTION = 0.99;
const PASSES_LITTLE_FRACTION = 0.01;
/** A lens focus counts as "small-waist" when the new waist is under a fifth of the beam radius on the lens. */
const SMALL_WAIST_RATIO = 0.2;
/** Paraxial Gaussian optics is only indicative beyond a far-field half-angle of 0.1 rad (tan θ ≈ θ within 0.3 %). */
const PARAXIAL_MAX_DIVERGENCE_RAD = 0.1;

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
};

export type BenchAnalysis = {
  laserId: string | null;
  wavelengthNm: number | null;
  m2: number;
  /** The screen or beam block where the light stops, or null. */
  stopId: string | null;
  elements: ElementAnalysis[];
  apertures: ApertureAnalysis[];
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

/** Pure and synchronous; never throws for a document the schema accepts. */
export function analyzeBench(doc: BenchDocument): BenchAnalysis {
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
    return { laserId: null, wavelengthNm: null, m2: 1, stopId: null, elements, apertures: [], waists: [], envelope: [], warnings };
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

  // apertures
  const apertures: ApertureAnalysis[] = [];
  const screen = stop !== null && stop.kind === "screen" ? stop : null;
  entries.forEach((entry, index) => {
    const e = entry.element;
    if (e.kind !== "aperture" || entry.status !== "lit" || entry.incident === null) return;
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
    const ratio = centreIntensityRatio(setup.radiusRatioSquared, n);
    const fraction = transmittedFraction(radiusM, setup.beamRadiusM);
    let irradianceWPerM2: number | null = null;
    if (system !== null) {
      // unobstructed: the real (M²) beam at the screen carrying the power that would arrive without this aperture
      const wScreen = beamRadiusM(applyAbcd(system.matrix, q), trace.effectiveWavelengthM);
      const powerW = entry.incident.powerMw * 1e-3 * system.transmission;
      irradianceWPerM2 = ((2 * powerW) / (Math.PI * wScreen * wScreen)) * ratio;
    }
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
      centre: centreAppearance(ratio),
      transmittedFraction: fraction,
      onAxisIrradianceWPerM2: irradianceWPerM2,
      onAxisIrradianceWPerCm2: irradianceWPerM2 === null ? null : irradianceWPerM2 * 1e-4,
      zoneRadiiMm: zoneRadiiM(trace.wavelengthM, setup.zoneCurvaturePerM, ZONE_RADII_COUNT).map((r) => r * MM_PER_M),
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
            `The ${named(e)} is followed by aperture${system.apertureIds.length > 1 ? "s" : ""} ${system.apertureIds.map((id) => `"${id}"`).join(", ")} before the screen: each aperture is analysed as if lit by the Gaussian beam alone, so the predicted pattern is approximate.`,
            e.id,
          ),
        );
      }
    }
  });
  if (trace.m2 > 1 && apertures.length > 0) {
    warnings.push(
      warning(
        "coherent-model-for-m2",
        `The laser's M² is ${formatNumber(trace.m2)}: the beam size follows the real beam, but the Fresnel patterns are computed for a coherent Gaussian of that size, so real fringes are less contrasted.`,
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

  return {
    laserId: laser.id,
    wavelengthNm: laser.wavelengthNm,
    m2: trace.m2,
    stopId: stop?.id ?? null,
    elements,
    apertures,
    waists: waistsOf(trace),
    envelope: envelopeOf(trace),
    warnings,
  };
}
