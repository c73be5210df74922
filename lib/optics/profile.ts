// The radial intensity on the screen behind a Gaussian-lit circular aperture (paraxial Fresnel/Collins integral) and its ring image.
// Sources: Born & Wolf, Principles of Optics (7th ed.) §8.8 (Fresnel diffraction at a circular aperture) and §8.5.2 (Airy limit); Collins, JOSA 60, 1168 (1970); Gauss–Legendre quadrature (Abramowitz & Stegun 25.4.29; Davis & Rabinowitz, Methods of Numerical Integration, §2.7).
//
// With s = ρ/R, a = R²/w², N the Fresnel number and v = 2πrR/(λ|B|) (B = b in free space), the intensity relative
// to the unobstructed on-axis intensity is I(r) = |2β ∫₀¹ e^{−βs²} J₀(vs) s ds|², β = a − iπN; at v = 0 this is
// the closed form |1 − e^{−β}|². Method: composite Gauss–Legendre, 16 nodes per panel, panels uniform in s;
// the integrand's local frequency is ≤ |N|s + v/2π cycles per unit s, so the panel count is
// ⌈s_max(|N|s_max + v/2π)/5 + 2⌉ (≤ 5 cycles per 16-node panel), with s_max = min(1, √(40/a)) since
// e^{−40} is below double precision. J₀ comes from a cubic Hermite table (≤ 1.5e-8). Measured error against 16×
// the panels with exact J₀: ≈ 1.3e-7 of the peak at N = 200 (scripts/bench-optics.ts prints it). When the work
// would pass 1.5·10⁷ node evaluations (|N| beyond ~2500 for 1024 radii), the profile falls back to the geometric shadow:
// the unobstructed Gaussian inside R|A + B/ρ| and dark outside, with the exact closed form at r = 0.
import type { BenchDocument } from "@/lib/bench/schema";
import { besselJ0, fastJ0, fastJ0Table, prepareFastJ0 } from "./bessel";
import { type CentreModel, OpticsInputError, apertureContext, buildChain, centreModel } from "./analyze";
import type { ChainBuild } from "./analyze";
import { gsmBlurWidth, gsmRadialIntensity } from "./coherence";
import { gaussLegendre } from "./quadrature";

const MM_PER_M = 1000;
const M_PER_MM = 1e-3;
const GL_ORDER = 16;
const CYCLES_PER_PANEL = 5;
const GAUSSIAN_CUTOFF = 40; // e^{−40} ≈ 4e-18
const MAX_WORK = 1.5e7;
export const DEFAULT_PROFILE_POINTS = 512;
export const MAX_PROFILE_POINTS = 16384;


const GL = gaussLegendre(GL_ORDER);

/** Round a panel count up to a ladder of 8 steps per octave, so nearby radii share one set of nodes. */
function ladder(p: number): number {
  if (p <= 16) return p;
  const step = 2 ** (Math.floor(Math.log2(p)) - 3);
  return Math.ceil(p / step) * step;
}

type NodeSet = { s: Float64Array; gr: Float64Array; gi: Float64Array };

/** Nodes on [0, sMax] in `panels` panels, with weight·s·e^{−βs²} folded in. */
function nodeSet(panels: number, sMax: number, a: number, n: number): NodeSet {
  const count = panels * GL_ORDER;
  const s = new Float64Array(count);
  const gr = new Float64Array(count);
  const gi = new Float64Array(count);
  const h = sMax / panels;
  let k = 0;
  for (let p = 0; p < panels; p++) {
    const mid = (p + 0.5) * h;
    for (let j = 0; j < GL_ORDER; j++) {
      const sj = mid + 0.5 * h * GL.x[j];
      const s2 = sj * sj;
      const mag = 0.5 * h * GL.w[j] * sj * Math.exp(-a * s2);
      // phase πN s², reduced mod 2 in units of π to keep digits at large N
      const ph = n * s2;
      const red = ph - 2 * Math.floor(ph / 2);
      s[k] = sj;
      gr[k] = mag * Math.cos(Math.PI * red);
      gi[k] = mag * Math.sin(Math.PI * red);
      k++;
    }
  }
  return { s, gr, gi };
}

export type RadialOptions = {
  /** Multiply the panel count (the reference uses 16). */
  refinement?: number;
  /** Use the exact besselJ0 instead of the table (for references). */
  exactBessel?: boolean;
};

export const panelsFor = (a: number, n: number, v: number, refinement = 1): number => {
  const sMax = Math.min(1, Math.sqrt(GAUSSIAN_CUTOFF / a));
  return Math.ceil(((sMax * (Math.abs(n) * sMax + v / (2 * Math.PI))) / CYCLES_PER_PANEL + 2) * refinement);
};

/** Estimated node evaluations for these v. */
export function radialWork(a: number, n: number, vs: ArrayLike<number>, refinement = 1): number {
  let work = 0;
  for (let i = 0; i < vs.length; i++) work += ladder(panelsFor(a, n, vs[i], refinement)) * GL_ORDER;
  return work;
}

/**
 * I(v) = |2β ∫₀¹ e^{−βs²} J₀(vs) s ds|², β = a − iπN, by composite Gauss–Legendre (see header).
 * a = R²/w², n = Fresnel number, v = 2πrR/(λ|B|).
 */
export function fresnelRadialIntensity(a: number, n: number, vs: ArrayLike<number>, options: RadialOptions = {}): Float64Array {
  const refinement = options.refinement ?? 1;
  const exact = options.exactBessel ?? false;
  const sMax = Math.min(1, Math.sqrt(GAUSSIAN_CUTOFF / a));
  const betaRe = a;
  const betaIm = -Math.PI * n;
  const out = new Float64Array(vs.length);
  const cache = new Map<number, NodeSet>();
  let vMax = 0;
  for (let i = 0; i < vs.length; i++) vMax = Math.max(vMax, Math.abs(vs[i]));
  if (!exact) prepareFastJ0(vMax * sMax);
  for (let i = 0; i < vs.length; i++) {
    const v = Math.abs(vs[i]);
    const panels = ladder(panelsFor(a, n, v, refinement));
    let set = cache.get(panels);
    if (set === undefined) {
      set = nodeSet(panels, sMax, a, n);
      cache.set(panels, set);
    }
    const { s, gr, gi } = set;
    let sumRe = 0;
    let sumIm = 0;
    const count = s.length;
    if (v === 0) {
      for (let k = 0; k < count; k++) {
        sumRe += gr[k];
        sumIm += gi[k];
      }
    } else if (exact) {
      for (let k = 0; k < count; k++) {
        const j = besselJ0(v * s[k]);
        sumRe += gr[k] * j;
        sumIm += gi[k] * j;
      }
    } else {
      // fastJ0 inlined: this loop is the whole cost of a profile
      const { table, count: tableCount, invStep } = fastJ0Table();
      const vStep = v * invStep;
      for (let k = 0; k < count; k++) {
        const u = vStep * s[k];
        const idx = u | 0;
        let j: number;
        if (idx + 1 < tableCount) {
          const t = u - idx;
          const t2 = t * t;
          const t3 = t2 * t;
          const m = 2 * idx;
          j = (2 * t3 - 3 * t2 + 1) * table[m] + (t3 - 2 * t2 + t) * table[m + 1] + (3 * t2 - 2 * t3) * table[m + 2] + (t3 - t2) * table[m + 3];
        } else j = fastJ0(v * s[k]);
        sumRe += gr[k] * j;
        sumIm += gi[k] * j;
      }
    }
    const fRe = 2 * (betaRe * sumRe - betaIm * sumIm);
    const fIm = 2 * (betaRe * sumIm + betaIm * sumRe);
    out[i] = fRe * fRe + fIm * fIm;
  }
  return out;
}

export type ProfileOptions = { radiiMm?: number[]; maxRadiusMm?: number; points?: number };

export type ScreenProfile = {
  radiusMm: number[];
  /** Intensity divided by the unobstructed on-axis intensity at the screen; [0] at r = 0 is centreIntensityRatio. */
  relativeIntensity: number[];
  /** "quadrature" normally; "geometric-shadow" when |N| is too large to integrate (see the header). */
  method: "quadrature" | "geometric-shadow";
  fresnelNumber: number;
  centreIntensityRatio: number;
  /** Where the geometric shadow of the aperture edge falls on the screen. */
  shadowRadiusMm: number;
};

type ProfileGeometry = {
  a: number;
  n: number;
  vPerM: number;
  shadowRadiusM: number;
  coherentScreenRadiusM: number;
  defaultMaxRadiusM: number;
  /** The centre ratio and how it is computed (the same as analyzeBench's). */
  model: CentreModel;
  chain: { build: ChainBuild; index: number } | null;
  gsm: { t: number; sigmaV: number } | null;
};

function profileGeometry(doc: BenchDocument, apertureId: string): ProfileGeometry {
  const { setup, trace, index } = apertureContext(doc, apertureId, { requireScreen: true });
  if (setup.matrix === null || setup.shadowRadiusM === null || setup.coherentScreenRadiusM === null) {
    throw new OpticsInputError("aperture-without-screen", `No screen receives the light of the aperture "${apertureId}".`);
  }
  const bAbs = Math.abs(setup.matrix.b);
  const vPerM = (2 * Math.PI * setup.apertureRadiusM) / (setup.wavelengthM * bAbs);
  const airyZeroM = (1.21967 * setup.wavelengthM * bAbs) / (2 * setup.apertureRadiusM);
  const lit = Math.min(setup.shadowRadiusM, 1.5 * setup.coherentScreenRadiusM);
  const build = buildChain(trace);
  const model = centreModel(trace, build, index, setup);
  const ci = build?.indexOf.get(apertureId);
  const t = gsmBlurWidth(setup.radiusRatioSquared, trace.m2);
  return {
    model,
    chain: model.model === "chain" && build !== null && ci !== undefined ? { build, index: ci } : null,
    gsm: model.model === "gsm" ? { t, sigmaV: (Math.PI * setup.apertureRadiusM * setup.coherentScreenRadiusM) / (setup.wavelengthM * bAbs) } : null,
    a: setup.radiusRatioSquared,
    n: setup.fresnelNumber,
    vPerM,
    shadowRadiusM: setup.shadowRadiusM,
    coherentScreenRadiusM: setup.coherentScreenRadiusM,
    defaultMaxRadiusM: Math.max(1.3 * lit, 3 * airyZeroM),
  };
}

function radiiFrom(options: ProfileOptions, defaultMaxRadiusM: number): number[] {
  if (options.radiiMm !== undefined) {
    if (options.radiiMm.length > MAX_PROFILE_POINTS || options.radiiMm.some((r) => !Number.isFinite(r) || r < 0)) {
      throw new OpticsInputError("bad-option", `radiiMm must hold at most ${MAX_PROFILE_POINTS} finite radii, none negative.`);
    }
    return [...options.radiiMm];
  }
  const maxMm = options.maxRadiusMm ?? defaultMaxRadiusM * MM_PER_M;
  if (!Number.isFinite(maxMm) || maxMm <= 0) throw new OpticsInputError("bad-option", "maxRadiusMm must be a positive finite number.");
  const points = Math.round(options.points ?? DEFAULT_PROFILE_POINTS);
  if (!Number.isFinite(points) || points < 2 || points > MAX_PROFILE_POINTS) {
    throw new OpticsInputError("bad-option", `points must be between 2 and ${MAX_PROFILE_POINTS}.`);
  }
  return Array.from({ length: points }, (_, i) => (maxMm * i) / (points - 1));
}

function profileAt(g: ProfileGeometry, radiiMm: number[]): { values: number[]; method: ScreenProfile["method"] } {
  const centre = g.model.ratio;
  const vs = radiiMm.map((r) => r * M_PER_MM * g.vPerM);
  if (g.chain !== null) {
    // the propagated field through every clipping edge up to this aperture (chain.ts)
    const at = g.chain.build.chain.screenIntensity(g.chain.index, radiiMm.map((r) => r * M_PER_MM));
    if (at !== null) {
      return { values: radiiMm.map((r, i) => (r === 0 ? centre : at.values[i])), method: at.method === "geometric-limit" ? "geometric-shadow" : "quadrature" };
    }
  }
  if (g.gsm !== null && radialWork(g.a, g.n, vs) * (1.5 * g.gsm.t + 2) * GL_ORDER <= MAX_WORK) {
    const intensity = gsmRadialIntensity(g.a, g.n, g.gsm.t, g.gsm.sigmaV, vs);
    return { values: radiiMm.map((r, i) => (r === 0 ? centre : intensity[i])), method: "quadrature" };
  }
  if (radialWork(g.a, g.n, vs) > MAX_WORK) {
    const w2 = g.coherentScreenRadiusM * g.coherentScreenRadiusM;
    const values = radiiMm.map((rMm) => {
      if (rMm === 0) return centre;
      const r = rMm * M_PER_MM;
      return r <= g.shadowRadiusM ? Math.exp((-2 * r * r) / w2) : 0;
    });
    return { values, method: "geometric-shadow" };
  }
  const intensity = fresnelRadialIntensity(g.a, g.n, vs);
  // r = 0 from the closed form, so the profile and analyzeBench agree to the last digit
  return { values: radiiMm.map((r, i) => (r === 0 ? centre : intensity[i])), method: "quadrature" };
}

/** The bench document contract screenProfile: the radial pattern on the aperture's screen relative to the unobstructed on-axis intensity. */
export function screenProfile(doc: BenchDocument, apertureId: string, options: ProfileOptions = {}): ScreenProfile {
  const g = profileGeometry(doc, apertureId);
  const radiusMm = radiiFrom(options, g.defaultMaxRadiusM);
  const { values, method } = profileAt(g, radiusMm);
  return {
    radiusMm,
    relativeIntensity: values,
    method,
    fresnelNumber: g.n,
    centreIntensityRatio: g.model.ratio,
    shadowRadiusMm: g.shadowRadiusM * MM_PER_M,
  };
}

export type RingImage = {
  widthPx: number;
  heightPx: number;
  /** Side of one square pixel on the screen. */
  pixelSizeMm: number;
  /** Half-width of the image: it spans −maxRadiusMm … +maxRadiusMm in x and y. */
  maxRadiusMm: number;
  /** The largest relative intensity in the image (intensity values are divided by it). */
  peakRelativeIntensity: number;
  /** Row-major, top row first, each in [0, 1]. */
  intensity: Float32Array;
  method: ScreenProfile["method"];
};

export const DEFAULT_RING_IMAGE_PX = 256;
export const MAX_RING_IMAGE_PX = 2048;

/** The pattern as a square grey image for the client to paint: one radial profile, interpolated per pixel. */
export function ringImage(doc: BenchDocument, apertureId: string, options: { sizePx?: number; maxRadiusMm?: number } = {}): RingImage {
  const size = Math.round(options.sizePx ?? DEFAULT_RING_IMAGE_PX);
  if (!Number.isFinite(size) || size < 8 || size > MAX_RING_IMAGE_PX) throw new OpticsInputError("bad-option", `sizePx must be between 8 and ${MAX_RING_IMAGE_PX}.`);
  const g = profileGeometry(doc, apertureId);
  const maxRadiusMm = options.maxRadiusMm ?? g.defaultMaxRadiusM * MM_PER_M;
  if (!Number.isFinite(maxRadiusMm) || maxRadiusMm <= 0) throw new OpticsInputError("bad-option", "maxRadiusMm must be a positive finite number.");
  const pixelSizeMm = (2 * maxRadiusMm) / size;
  // radial samples: 4 per pixel out to the corner, so linear interpolation does not blur the inner rings
  const cornerMm = maxRadiusMm * Math.SQRT2;
  const samples = Math.ceil(2 * size * Math.SQRT2) + 2;
  const stepMm = cornerMm / (samples - 1);
  const radii = Array.from({ length: samples }, (_, i) => i * stepMm);
  const { values, method } = profileAt(g, radii);
  const intensity = new Float32Array(size * size);
  let peak = 0;
  const half = size / 2;
  for (let y = 0; y < size; y++) {
    const dy = (y + 0.5 - half) * pixelSizeMm;
    for (let x = 0; x < size; x++) {
      const dx = (x + 0.5 - half) * pixelSizeMm;
      const u = Math.hypot(dx, dy) / stepMm;
      const i = Math.min(Math.floor(u), samples - 2);
      const t = u - i;
      const val = values[i] * (1 - t) + values[i + 1] * t;
      intensity[y * size + x] = val;
      if (val > peak) peak = val;
    }
  }
  if (peak > 0) for (let k = 0; k < intensity.length; k++) intensity[k] /= peak;
  return { widthPx: size, heightPx: size, pixelSizeMm, maxRadiusMm, peakRelativeIntensity: peak, intensity, method };
}
