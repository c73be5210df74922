// The field chain: the radial field behind every clipping aperture or lens/filter mount, carried through free space, thin lenses, filters and further apertures to any plane downstream.
// Sources: Collins, JOSA 60, 1168 (1970) (diffraction through an ABCD system); Born & Wolf, Principles of Optics (7th ed.) §8.8 (Fresnel integral of a circular aperture); Gauss–Legendre quadrature (Abramowitz & Stegun 25.4.29).
//
// Geometry-free: the chain is a start beam (embedded-Gaussian q, power) and a list of v1-like elements in beam order
// along one unfolded axis (positionMm increasing), so a table path can be fed in as well as a straight bench.
//
// Method. The first element that clips the Gaussian (an aperture, or a lens/filter whose clearApertureMm is given,
// with R²/w² < 8) is a "clip plane": its field is the coherent Gaussian (real 1/e² radius W and wavefront radius of
// the embedded Gaussian, true λ) cut off at R. Between clip planes every lens and stretch of free space is one ABCD
// matrix, and the field at the next plane is Collins' integral
//   u'(r) = (2π/(iλB)) e^{iπDr²/(λB)} ∫₀^X u(ρ) e^{iπAρ²/(λB)} J₀(2πρr/(λB)) ρ dρ,
// evaluated by composite 16-node Gauss–Legendre panels on [0, X] (X the plane's radius; for a Gaussian-lit plane
// min(R, √40·w) since e^{−40} is below double precision). Sampling rule: the integrand's phase runs through at most
//   |D_in/(λB_in) + A/(λB)|·X²/2 + 2·X_prev·X/(λ|B_in|) + X·r_out/(λ|B|)
// cycles on [0, X] (quadratic phase of the arriving field and of the kernel, the arriving field's own ripples — at most
// X_prev/(λ|B_in|) cycles per metre — and the Bessel kernel out to the largest radius r_out wanted downstream), and the
// panel count is that ÷ 4 + 2 (≤ 4 cycles per 16-node panel: GL error below 1e-9 per panel). J₀ comes from the
// Hermite table of bessel.ts (≤ 1.5e-8). The error of a centre value or a profile point, measured against 16× the
// panels with the exact J₀ (scripts/bench-optics.ts), is below 1e-6 of the peak for three apertures in series.
// Filters only scale the power; intensities are carried relative to the power arriving at the first clip plane.
//
// Limits, stated: (1) a later aperture or mount wider than the field's extent — the geometric image of the last
// clip plane's edge plus 3λ/(πw) + 100λ/X of spread — is taken as not clipping (the diffraction tail it would cut
// holds of the order of 1e-3 of the power the upstream edge diffracts); (2) when a hop would cost more than
// MAX_HOP_WORK node pairs (Fresnel numbers in the tens of thousands, or B → 0: a plane imaged onto the next), the
// field there is taken in the geometric limit — the Gaussian cut at the projected shadow of the previous edge, exact
// for B = 0 — and the plane's method says so; (3) an edge that cuts at most e^{−16} of the Gaussian (R²/w² ≥ 8) is no
// clip plane: the centre figures downstream move by at most 7e-4 of themselves, and the power probes add its loss
// back as an upper bound (powerInsideMw). Power inside a circle comes from the Lommel integral over node pairs
// (powerInsideCircle), not from the field on a target grid. Paraxial scalar theory throughout, like the rest of the engine.
import type { BenchElement } from "@/lib/bench/schema";
import { type AbcdMatrix, type BeamParameter, IDENTITY, applyAbcd, beamRadiusM, compose, curvaturePerM, freeSpace, propagateQ, lensQ, qFromBeam, thinLens, wavefrontRadiusM } from "./gaussian";
import { besselJ0, besselJ1, fastJ0, fastJ1, prepareFastJ0, prepareFastJ1 } from "./bessel";
import { cauchySums } from "./cauchy-sum";
import { gaussLegendre } from "./quadrature";

const M_PER_MM = 1e-3;
const GL_ORDER = 16;
const CYCLES_PER_PANEL = 4;
/**
 * The power in a circle (powerInsideCircle) is a smooth sum over node pairs and takes 5 cycles a panel (3.2 nodes a
 * cycle): against 3× the panels it moved by at most 4e-7 of itself on five setups with lenses either side of the
 * iris (tests/unit/optics/chain.test.ts checks ≤ 1e-6).
 */
const POWER_CYCLES_PER_PANEL = 5;
/**
 * R²/w² at or above this cuts at most e^{−16} ≈ 1.1e-7 of the Gaussian's power: not a clip plane. The centre intensity
 * it would change by at most 2e^{−8} ≈ 7e-4 of itself; the power it removes is kept (the chain's skipped edges) and
 * the power probes add it back as a rigorous bound, so the safety figures stay on the cautious side.
 */
const GAUSSIAN_CLIP_LIMIT = 8;
/** The Gaussian's reach on a plane: beyond √40·w it holds e^{−80} of the power. */
const GAUSSIAN_REACH = Math.sqrt(40);
/** Diffraction spread allowed beyond the geometric image when deciding that a later aperture does not clip (× λ/X). */
const TAIL_SPREAD = 100;
/**
 * The same spread for a power probe's "a circle wider than the field holds all of it": a smaller margin only makes the
 * figure a little larger than the field's (never smaller); tests/unit/optics/chain.test.ts measures the excess.
 */
const PROBE_TAIL_SPREAD = 10;
/** Node pairs (source nodes × target points) one hop may cost before the geometric limit is used. */
export const MAX_HOP_WORK = 2e6;
/** Nodes one plane may hold (memory bound). */
const MAX_PLANE_NODES = 65_536;

const GL = gaussLegendre(GL_ORDER);

/** Each plane's field on the node sets asked of it, by panel count (see FieldChain.fieldOn). */
const PLANE_FIELDS = new WeakMap<object, Map<number, NodeField>>();

/** e^{iπx} with x reduced mod 2 first, so large phases keep their digits. */
function cisPi(x: number): [number, number] {
  const red = x - 2 * Math.floor(x / 2);
  const a = Math.PI * red;
  return [Math.cos(a), Math.sin(a)];
}

/** A field sampled on quadrature nodes: radius, weight·radius (the ρ dρ measure) and the complex value. */
type NodeField = { rho: Float64Array; wr: Float64Array; re: Float64Array; im: Float64Array };

function quadratureNodes(xMaxM: number, panels: number): { rho: Float64Array; wr: Float64Array } {
  const count = panels * GL_ORDER;
  const rho = new Float64Array(count);
  const wr = new Float64Array(count);
  const h = xMaxM / panels;
  let k = 0;
  for (let p = 0; p < panels; p++) {
    const mid = (p + 0.5) * h;
    for (let j = 0; j < GL_ORDER; j++) {
      const r = mid + 0.5 * h * GL.x[j];
      rho[k] = r;
      wr[k] = 0.5 * h * GL.w[j] * r;
      k++;
    }
  }
  return { rho, wr };
}

export type PlaneMethod = "gaussian" | "quadrature" | "geometric-limit";

/** One clip plane: an element whose edge cuts the field. */
export type ClipPlane = {
  elementId: string;
  /** Index of the element in the chain's element list. */
  index: number;
  positionMm: number;
  /** The clipping radius (aperture radius, or half the clear aperture). */
  radiusM: number;
  /** How the field just behind it is known. */
  method: PlaneMethod;
  /** Coherent unclipped Gaussian here (true λ): 1/e² radius and wavefront curvature 1/R. */
  gaussianRadiusM: number;
  gaussianCurvaturePerM: number;
  /** Power arriving and leaving, relative to the power arriving at the first clip plane (filters excluded). */
  powerInRel: number;
  powerOutRel: number;
};

type PlaneState = ClipPlane & {
  /** For "gaussian" and "geometric-limit": the field is scale·√(2/πw²)·e^{−ρ²/w²+iπκρ²/λ} for ρ ≤ cutM. */
  cutM: number;
  amplitudeScale: number;
  /** For "quadrature": the previous plane's nodes prepared for the hop here, and the hop's matrix. */
  from: { plane: PlaneState; matrix: AbcdMatrix; source: NodeField } | null;
  /** Integration reach on this plane (≤ radiusM). */
  reachM: number;
};

export type ChainStart = {
  positionMm: number;
  /** Embedded-Gaussian q (λ_eff = M²λ) of the beam leaving the start, in metres. */
  q: BeamParameter;
  powerMw: number;
};

export type ChainOptions = {
  refinement?: number;
  exactBessel?: boolean;
  /**
   * Chains that begin alike (the unfolded leaves of one table share every path before they split) reuse the work done
   * for their common first elements: pass one cache to every chain of the same analysis. The answers are the same as
   * without it (the same operations on the same numbers); only repeated work is skipped.
   */
  prefixCache?: ChainPrefixCache;
};

/** The chain's state after some first elements: what the constructor needs to go on from there. */
type PrefixState = {
  q: BeamParameter;
  last: number;
  powerMw: number;
  referencePowerMw: number;
  qc: BeamParameter | null;
  firstPlaneQ: BeamParameter | null;
  sinceLast: AbcdMatrix;
  states: PlaneState[];
  results: ChainElementResult[];
  coherentQ: BeamParameter[];
  kept: ChainElement[];
  skipped: SkippedEdge[];
};

/** An edge before the first clip plane that cuts too little to be one (R²/w² ≥ GAUSSIAN_CLIP_LIMIT). */
type SkippedEdge = { index: number; positionMm: number; /** Share of the power arriving there that it removes, e^{−2R²/w²}. */ lostShare: number };

type PrefixNode = { state: PrefixState | null; next: Map<string, PrefixNode> };

/** A trie of chain states keyed by the start, the options and each element in turn (see ChainOptions.prefixCache). */
export class ChainPrefixCache {
  private readonly roots = new Map<string, PrefixNode>();
  private readonly keys = new WeakMap<object, string>();
  /** The key of an element: every field the chain reads of it, remembered per object. */
  keyOf(e: ChainElement): string {
    let k = this.keys.get(e);
    if (k === undefined) {
      const f = e as { focalLengthMm?: number; diameterMm?: number; clearApertureMm?: number; opticalDensity?: number };
      k = `${e.kind}|${e.id}|${e.positionMm}|${f.focalLengthMm}|${f.diameterMm}|${f.clearApertureMm}|${f.opticalDensity}`;
      this.keys.set(e, k);
    }
    return k;
  }
  root(key: string): PrefixNode {
    let node = this.roots.get(key);
    if (!node) this.roots.set(key, (node = { state: null, next: new Map() }));
    return node;
  }
}

/** Elements a chain may hold: v1 kinds other than the laser, with an optional mount size on lenses and filters. */
export type ChainElement = Exclude<BenchElement, { kind: "laser" }>;

const clipRadiusM = (e: ChainElement): number | null => {
  if (e.kind === "aperture") return (e.diameterMm / 2) * M_PER_MM;
  if ((e.kind === "lens" || e.kind === "filter") && e.clearApertureMm !== undefined) return (e.clearApertureMm / 2) * M_PER_MM;
  return null;
};

export type ChainElementResult = {
  id: string;
  /** Power arriving at the element and leaving it (mW), from the propagated field. */
  incidentPowerMw: number;
  outgoingPowerMw: number;
  /** The clip plane this element is, or null (not clipping, or no edge). */
  plane: ClipPlane | null;
};

/**
 * The field chain for one beam path. Elements must be in beam order, downstream of the start, and the chain stops
 * at the first screen or beam block (it is included). Pure: the same input gives the same numbers.
 */
export class FieldChain {
  readonly wavelengthM: number;
  readonly effectiveWavelengthM: number;
  readonly elements: readonly ChainElement[];
  readonly results: readonly ChainElementResult[];
  readonly planes: readonly ClipPlane[];
  /** Index of the stopping element, or null. */
  readonly stopIndex: number | null;
  /** Power arriving at the first clip plane, mW (the unit of the relative powers). */
  readonly referencePowerMw: number;
  private readonly states: PlaneState[];
  private readonly start: ChainStart;
  private readonly refinement: number;
  private readonly exactBessel: boolean;
  /** MAX_HOP_WORK, scaled by refinement² so a refined reference never falls back where the normal run integrates. */
  private readonly maxHopWork: number;
  /** Coherent q (true λ) just before element i, and the beam position. */
  private readonly coherentQ: BeamParameter[];
  private readonly firstPlaneQ: BeamParameter | null;
  private readonly skipped: SkippedEdge[];

  constructor(start: ChainStart, elements: readonly ChainElement[], wavelengthM: number, m2: number, options: ChainOptions = {}) {
    this.start = start;
    this.wavelengthM = wavelengthM;
    this.effectiveWavelengthM = wavelengthM * m2;
    this.refinement = options.refinement ?? 1;
    this.exactBessel = options.exactBessel ?? false;
    this.maxHopWork = MAX_HOP_WORK * this.refinement * this.refinement;
    const lambda = wavelengthM;
    let states: PlaneState[] = [];
    let results: ChainElementResult[] = [];
    let coherentQ: BeamParameter[] = [];
    let stopIndex: number | null = null;
    // embedded Gaussian (for the real W and R), and power
    let q = start.q;
    let last = start.positionMm;
    let powerMw = start.powerMw;
    let referencePowerMw = start.powerMw;
    let qc: BeamParameter | null = null; // coherent q from the first clip plane on
    let firstPlaneQ: BeamParameter | null = null;
    let sinceLast: AbcdMatrix = IDENTITY; // from the last clip plane to here
    let kept: ChainElement[] = [];
    let skipped: SkippedEdge[] = [];
    // go on from the longest cached beginning (a stop ends a chain, so a cached state never follows one)
    const cache = options.prefixCache;
    let node: PrefixNode | null = null;
    let from = 0;
    if (cache) {
      node = cache.root(JSON.stringify([start, wavelengthM, m2, this.refinement, this.exactBessel]));
      let best: PrefixState | null = null;
      for (let i = 0; i < elements.length; i++) {
        const child: PrefixNode | undefined = node.next.get(cache.keyOf(elements[i]));
        if (!child || child.state === null) break;
        node = child;
        best = child.state;
        from = i + 1;
      }
      if (best !== null) {
        ({ q, last, powerMw, referencePowerMw, qc, firstPlaneQ, sinceLast } = best);
        states = best.states.slice();
        results = best.results.slice();
        coherentQ = best.coherentQ.slice();
        kept = best.kept.slice();
        skipped = best.skipped.slice();
      }
    }
    for (let i = from; i < elements.length; i++) {
      const e = elements[i];
      kept.push(e);
      const d = (e.positionMm - last) * M_PER_MM;
      q = propagateQ(q, d);
      if (qc !== null) qc = propagateQ(qc, d);
      sinceLast = compose(freeSpace(d), sinceLast);
      last = e.positionMm;
      const incidentPowerMw = powerMw;
      // coherent Gaussian of the real W and R with the true λ, whether or not a plane exists yet
      const wReal = beamRadiusM(q, this.effectiveWavelengthM);
      const qHere: BeamParameter = qc ?? qFromBeam(wReal, wavefrontRadiusM(q), lambda);
      coherentQ.push(qHere);
      let plane: PlaneState | null = null;
      const radius = clipRadiusM(e);
      if (radius !== null) {
        const prev = states.length === 0 ? null : states[states.length - 1];
        if (prev === null) {
          const a = (radius * radius) / (wReal * wReal);
          if (a >= GAUSSIAN_CLIP_LIMIT) {
            const lostShare = Math.exp(-2 * a);
            if (lostShare > 0) skipped.push({ index: i, positionMm: e.positionMm, lostShare });
          } else {
            qc = qHere;
            firstPlaneQ = qHere;
            referencePowerMw = powerMw;
            const w = beamRadiusM(qHere, lambda);
            const out = -Math.expm1(-2 * a);
            plane = {
              elementId: e.id, index: i, positionMm: e.positionMm, radiusM: radius, method: "gaussian",
              gaussianRadiusM: w, gaussianCurvaturePerM: curvaturePerM(qHere), powerInRel: 1, powerOutRel: out,
              cutM: radius, amplitudeScale: 1, from: null, reachM: Math.min(radius, GAUSSIAN_REACH * w),
            };
          }
        } else if (qc !== null) {
          plane = this.nextPlane(prev, sinceLast, e, i, radius, qc);
        }
      }
      if (plane !== null) {
        states.push(plane);
        sinceLast = IDENTITY;
      }
      // the element's own action
      if (e.kind === "lens") {
        q = lensQ(q, e.focalLengthMm * M_PER_MM);
        if (qc !== null) qc = lensQ(qc, e.focalLengthMm * M_PER_MM);
        sinceLast = compose(thinLens(e.focalLengthMm * M_PER_MM), sinceLast);
      }
      let outgoing = incidentPowerMw;
      if (plane !== null) outgoing = incidentPowerMw * (plane.powerInRel > 0 ? plane.powerOutRel / plane.powerInRel : 0);
      else if (radius !== null && states.length === 0) outgoing = incidentPowerMw * -Math.expm1((-2 * radius * radius) / (wReal * wReal));
      if (e.kind === "filter") {
        const t = Math.pow(10, -e.opticalDensity);
        outgoing *= t;
      }
      if (e.kind === "screen" || e.kind === "beam-block") outgoing = 0;
      powerMw = outgoing;
      results.push({ id: e.id, incidentPowerMw, outgoingPowerMw: outgoing, plane: plane === null ? null : publicPlane(plane) });
      if (e.kind === "screen" || e.kind === "beam-block") {
        stopIndex = i;
        break;
      }
      if (cache && node) {
        const key = cache.keyOf(e);
        let child = node.next.get(key);
        if (!child) node.next.set(key, (child = { state: null, next: new Map() }));
        if (child.state === null) {
          child.state = { q, last, powerMw, referencePowerMw, qc, firstPlaneQ, sinceLast, states: states.slice(), results: results.slice(), coherentQ: coherentQ.slice(), kept: kept.slice(), skipped: skipped.slice() };
        }
        node = child;
      }
    }
    this.elements = kept;
    this.results = results;
    this.states = states;
    this.planes = states.map(publicPlane);
    this.stopIndex = stopIndex;
    this.referencePowerMw = referencePowerMw;
    this.coherentQ = coherentQ;
    this.firstPlaneQ = firstPlaneQ;
    this.skipped = skipped;
  }

  /** True when the field differs from the plain Gaussian anywhere: a clip plane, or an edge that cuts too little to be one. */
  get clipsAnything(): boolean {
    return this.states.length > 0 || this.skipped.length > 0;
  }

  /** The next clip plane behind `prev`, or null when the element's edge lies outside the field (see header, limit 1). */
  private nextPlane(prev: PlaneState, matrix: AbcdMatrix, e: ChainElement, index: number, radius: number, qc: BeamParameter): PlaneState | null {
    const lambda = this.wavelengthM;
    const w = beamRadiusM(qc, lambda);
    const kappa = curvaturePerM(qc);
    const shadow = prev.reachM * Math.abs(matrix.a + matrix.b * prev.gaussianCurvaturePerM);
    if (!(radius < this.extentM(prev, matrix))) return null;
    const base = {
      elementId: e.id, index, positionMm: e.positionMm, radiusM: radius, gaussianRadiusM: w, gaussianCurvaturePerM: kappa,
      powerInRel: prev.powerOutRel,
    };
    const reach = radius;
    // quadrature hop if affordable
    const panelsHere = this.panelsFor(prev, matrix, reach, "power", null);
    const source = this.sourceNodesFor(prev, matrix, reach);
    if (source !== null && Number.isFinite(panelsHere) && source.rho.length * panelsHere * GL_ORDER <= this.maxHopWork) {
      const plane: PlaneState = { ...base, method: "quadrature", powerOutRel: 0, cutM: radius, amplitudeScale: 1, from: { plane: prev, matrix, source }, reachM: reach };
      const nodes = this.fieldOn(plane, panelsHere);
      const field = nodes;
      let power = 0;
      for (let k = 0; k < nodes.rho.length; k++) power += 2 * Math.PI * nodes.wr[k] * (field.re[k] * field.re[k] + field.im[k] * field.im[k]);
      plane.powerOutRel = Math.min(power, prev.powerOutRel);
      return plane;
    }
    // geometric limit: the Gaussian cut at the projected shadow of the previous edge
    const shadowFraction = -Math.expm1((-2 * shadow * shadow) / (w * w));
    const cut = Math.min(radius, shadow);
    const cutFraction = -Math.expm1((-2 * cut * cut) / (w * w));
    const out = shadowFraction > 0 ? (prev.powerOutRel * cutFraction) / shadowFraction : shadow > 0 ? prev.powerOutRel * Math.min(1, (cut / shadow) ** 2) : 0;
    return {
      ...base, method: "geometric-limit", powerOutRel: Math.min(out, prev.powerOutRel), cutM: cut,
      amplitudeScale: shadowFraction > 0 ? Math.sqrt(prev.powerOutRel / shadowFraction) : 0, from: null, reachM: Math.min(cut, GAUSSIAN_REACH * w),
    };
  }

  /**
   * Panels on a plane's [0, reach] for: a hop of `matrix` out to radius rOut ("hop"), or the power integral ("power").
   * Infinity when the hop cannot be integrated (B = 0).
   */
  private panelsFor(from: PlaneState, matrix: AbcdMatrix | null, reachM: number, purpose: "hop" | "power", rOutM: number | null, cyclesPerPanel = CYCLES_PER_PANEL): number {
    const lambda = this.wavelengthM;
    let cycles = 0;
    // the arriving field's own phase on this plane: for a quadrature plane, what its incoming hop gives it
    const incoming = purpose === "power" ? matrix : from.from?.matrix ?? null;
    const prevReach = purpose === "power" ? from.reachM : from.from?.plane.reachM ?? 0;
    if (purpose === "power") {
      // the target plane's field (arriving through `matrix` from `from`) sampled on [0, reach]
      if (matrix === null || !(Math.abs(matrix.b) > 0)) return Infinity;
      cycles = (2 * prevReach * reachM) / (lambda * Math.abs(matrix.b));
    } else {
      let quad = 0;
      if (from.method === "quadrature" && incoming !== null) {
        quad = incoming.d / (lambda * incoming.b);
        cycles += (2 * prevReach * reachM) / (lambda * Math.abs(incoming.b));
      } else quad = from.gaussianCurvaturePerM / lambda;
      if (matrix !== null) {
        if (!(Math.abs(matrix.b) > 0)) return Infinity;
        quad += matrix.a / (lambda * matrix.b);
        if (rOutM !== null) cycles += (reachM * rOutM) / (lambda * Math.abs(matrix.b));
      }
      cycles += (Math.abs(quad) * reachM * reachM) / 2;
    }
    if (!Number.isFinite(cycles)) return Infinity;
    return Math.ceil((cycles / cyclesPerPanel + 2) * this.refinement);
  }

  /** The plane's field on its own nodes, prepared (kernel phase and measure folded in) for a hop of `matrix` out to rOut. Null if unaffordable. */
  private sourceNodesFor(plane: PlaneState, matrix: AbcdMatrix, rOutM: number, cyclesPerPanel = CYCLES_PER_PANEL): NodeField | null {
    const panels = this.panelsFor(plane, matrix, plane.reachM, "hop", rOutM, cyclesPerPanel);
    if (!Number.isFinite(panels) || !(Math.abs(matrix.b) > 0)) return null;
    const count = panels * GL_ORDER;
    if (count > MAX_PLANE_NODES * this.refinement) return null;
    if (plane.from !== null && plane.from.source.rho.length * count > this.maxHopWork) return null;
    const lambda = this.wavelengthM;
    const re = new Float64Array(count);
    const im = new Float64Array(count);
    if (plane.from === null) {
      // a Gaussian cut at cutM: its own wavefront and the kernel's in one phase factor
      const nodes = quadratureNodes(plane.reachM, panels);
      const w = plane.gaussianRadiusM;
      const amp = plane.amplitudeScale * Math.sqrt(2 / (Math.PI * w * w));
      const chirp = plane.gaussianCurvaturePerM / lambda + matrix.a / (lambda * matrix.b);
      for (let k = 0; k < count; k++) {
        const r = nodes.rho[k];
        if (r > plane.cutM) continue;
        const m = amp * Math.exp(-(r * r) / (w * w)) * nodes.wr[k];
        const x = chirp * r * r;
        const phase = Math.PI * (x - 2 * Math.floor(x / 2)); // cisPi, inlined in this hot loop
        re[k] = m * Math.cos(phase);
        im[k] = m * Math.sin(phase);
      }
      return { rho: nodes.rho, wr: nodes.wr, re, im };
    }
    const nodes = this.fieldOn(plane, panels);
    const field = nodes;
    for (let k = 0; k < count; k++) {
      const [c, s] = cisPi((matrix.a * nodes.rho[k] * nodes.rho[k]) / (lambda * matrix.b));
      const fr = field.re[k] * nodes.wr[k];
      const fi = field.im[k] * nodes.wr[k];
      re[k] = fr * c - fi * s;
      im[k] = fr * s + fi * c;
    }
    return { rho: nodes.rho, wr: nodes.wr, re, im };
  }

  /**
   * The plane's field on its own `panels`-panel quadrature nodes over [0, reach], computed once per plane and panel
   * count (the same numbers every time; a plane is asked for the same nodes by its power, its next hop and the
   * safety engine's power probes).
   */
  private fieldOn(plane: PlaneState, panels: number): NodeField {
    let byPanels = PLANE_FIELDS.get(plane);
    if (!byPanels) PLANE_FIELDS.set(plane, (byPanels = new Map()));
    let hit = byPanels.get(panels);
    if (!hit) {
      const nodes = quadratureNodes(plane.reachM, panels);
      const field = this.evaluate(plane, nodes.rho);
      hit = { rho: nodes.rho, wr: nodes.wr, re: field.re, im: field.im };
      byPanels.set(panels, hit);
    }
    return hit;
  }

  /** The field just behind a plane at the given radii (0 beyond its edge), in √(relative power)/m. */
  private evaluate(plane: PlaneState, radii: ArrayLike<number>): { re: Float64Array; im: Float64Array } {
    const n = radii.length;
    const re = new Float64Array(n);
    const im = new Float64Array(n);
    const lambda = this.wavelengthM;
    if (plane.from === null) {
      const w = plane.gaussianRadiusM;
      const amp = plane.amplitudeScale * Math.sqrt(2 / (Math.PI * w * w));
      for (let k = 0; k < n; k++) {
        const r = radii[k];
        if (r > plane.cutM) continue;
        const m = amp * Math.exp(-(r * r) / (w * w));
        const [c, s] = cisPi((plane.gaussianCurvaturePerM * r * r) / lambda);
        re[k] = m * c;
        im[k] = m * s;
      }
      return { re, im };
    }
    const { matrix, source } = plane.from;
    const out = hop(source, matrix, lambda, radii, this.exactBessel);
    for (let k = 0; k < n; k++) {
      if (radii[k] > plane.radiusM) continue;
      re[k] = out.re[k];
      im[k] = out.im[k];
    }
    return { re, im };
  }

  /** Index of the last clip plane strictly before element index `before` (or all, when null). */
  private lastPlaneBefore(before: number | null): PlaneState | null {
    let found: PlaneState | null = null;
    for (const p of this.states) if (before === null || p.index < before) found = p;
    return found;
  }

  /** The ABCD matrix from just after a plane's element to just before element index `to` (lenses and free space). */
  private matrixFrom(plane: PlaneState, toIndex: number, toPositionMm?: number): AbcdMatrix {
    let m: AbcdMatrix = IDENTITY;
    let last = plane.positionMm;
    const first = plane.index;
    const e0 = this.elements[first];
    if (e0.kind === "lens") m = thinLens(e0.focalLengthMm * M_PER_MM);
    for (let i = first + 1; i < Math.min(toIndex, this.elements.length); i++) {
      const e = this.elements[i];
      if (toPositionMm !== undefined && e.positionMm >= toPositionMm) break;
      m = compose(freeSpace((e.positionMm - last) * M_PER_MM), m);
      last = e.positionMm;
      if (e.kind === "lens") m = compose(thinLens(e.focalLengthMm * M_PER_MM), m);
    }
    const endMm = toPositionMm ?? this.elements[Math.min(toIndex, this.elements.length - 1)].positionMm;
    return compose(freeSpace((endMm - last) * M_PER_MM), m);
  }

  /** The coherent unclipped Gaussian's on-axis intensity at the stop, relative units (2/(πw²)). */
  private referenceOnAxis(stop: number): number {
    const q = this.coherentQ[stop];
    const w = beamRadiusM(q, this.wavelengthM);
    return 2 / (Math.PI * w * w);
  }

  /** True when a clip plane lies before element index `upTo` (inclusive). */
  hasPlaneUpTo(upTo: number): boolean {
    return this.states.some((p) => p.index <= upTo);
  }

  /** The clip planes at or before element index `upTo` (the configuration "this aperture and every one upstream"). */
  planesUpTo(upTo: number): ClipPlane[] {
    return this.planes.filter((p) => p.index <= upTo);
  }

  /**
   * Relative intensity (÷ the unclipped on-axis intensity there) at radii on the stop screen, with the clip planes
   * at or before element index `upTo` in place and none after. Null without a stop, or with no plane in place.
   */
  screenIntensity(upTo: number, radiiM: ArrayLike<number>): { values: Float64Array; method: PlaneMethod } | null {
    if (this.stopIndex === null) return null;
    const plane = this.lastPlaneBefore(upTo + 1);
    if (plane === null) return null;
    const matrix = this.matrixFrom(plane, this.stopIndex);
    const ref = this.referenceOnAxis(this.stopIndex);
    let rMax = 0;
    for (let i = 0; i < radiiM.length; i++) rMax = Math.max(rMax, radiiM[i]);
    const source = this.sourceNodesFor(plane, matrix, rMax);
    const values = new Float64Array(radiiM.length);
    if (source === null || source.rho.length * radiiM.length > 4 * this.maxHopWork) {
      // geometric limit at the screen: the Gaussian inside the projected edge (only r = 0 is ever asked of it here)
      const w = beamRadiusM(this.coherentQ[this.stopIndex], this.wavelengthM);
      const shadow = plane.cutM * Math.abs(matrix.a + matrix.b * plane.gaussianCurvaturePerM);
      const cutFraction = -Math.expm1((-2 * plane.cutM * plane.cutM) / (plane.gaussianRadiusM * plane.gaussianRadiusM));
      const scale = plane.method === "quadrature" ? (cutFraction > 0 ? plane.powerOutRel / cutFraction : 0) : plane.amplitudeScale * plane.amplitudeScale;
      for (let i = 0; i < radiiM.length; i++) values[i] = radiiM[i] <= shadow ? scale * Math.exp((-2 * radiiM[i] * radiiM[i]) / (w * w)) : 0;
      return { values, method: "geometric-limit" };
    }
    const out = hop(source, matrix, this.wavelengthM, radiiM, this.exactBessel);
    for (let i = 0; i < radiiM.length; i++) values[i] = (out.re[i] * out.re[i] + out.im[i] * out.im[i]) / ref;
    return { values, method: plane.method === "geometric-limit" ? "geometric-limit" : "quadrature" };
  }

  /**
   * Power (mW) inside a centred circle of radius radiusM at a position on the axis, from the propagated field; null
   * where nothing upstream clips (the plain Gaussian holds there) or the position is outside the chain.
   * `beforeIndex`: count only the edges before that element (the light arriving at it).
   *
   * Two shortcuts, both never below the field's own figure: a circle wider than the field's extent (the geometric
   * image of the last plane's edge plus its diffraction spread, the test nextPlane uses) holds all the power; and the
   * edges that cut too little to be planes (GAUSSIAN_CLIP_LIMIT) are added back by the triangle inequality on the
   * circle — the true field is the one computed without them minus what each blocked, and a blocked part, carried on
   * by the same lossless system and cut further by later edges, holds at most the power lost there:
   * √P_true ≤ √P_computed + Σ √lost.
   */
  powerInsideMw(positionMm: number, radiusM: number, beforeIndex?: number, options: { boundWithin?: number } = {}): number | null {
    if (!(radiusM > 0)) return null;
    const upstream = (index: number, pos: number) => (beforeIndex !== undefined ? index < beforeIndex : pos < positionMm);
    let plane: PlaneState | null = null;
    for (const p of this.states) if (upstream(p.index, p.positionMm)) plane = p;
    const edges = this.skipped.filter((s) => upstream(s.index, s.positionMm));
    if (plane === null && edges.length === 0) return null;
    const end = this.stopIndex === null ? Infinity : this.elements[this.stopIndex].positionMm;
    if (positionMm > end) return null;
    if (plane === null) return this.skippedEdgesBoundMw(positionMm, radiusM, beforeIndex, edges);
    // the skipped edges' losses relative to the power arriving at the first plane (÷ what all of them left: never less)
    const keptShare = edges.reduce((k, s) => k - s.lostShare, 1);
    const rootSkipped = edges.reduce((sum, s) => sum + Math.sqrt(s.lostShare / keptShare), 0);
    const widen = (rel: number) => (rootSkipped > 0 ? (Math.sqrt(rel) + rootSkipped) ** 2 : rel);
    // filters between the first plane and the position
    let filters = 1;
    for (let i = 0; i < this.elements.length; i++) {
      const e = this.elements[i];
      if (!upstream(i, e.positionMm)) break;
      if (e.kind === "filter" && this.firstPlaneQ !== null && i >= this.states[0].index) filters *= Math.pow(10, -e.opticalDensity);
    }
    const scaleMw = this.referencePowerMw * filters;
    const total = widen(plane.powerOutRel);
    const matrix = this.matrixFrom(plane, beforeIndex ?? this.elements.length, beforeIndex === undefined ? positionMm : undefined);
    if (radiusM >= this.extentM(plane, matrix, PROBE_TAIL_SPREAD)) return total * scaleMw;
    if (options.boundWithin !== undefined) {
      // An upper bound without the field (the same inequality with the unclipped Gaussian and every edge's loss). Used
      // when it is within `boundWithin` of the Gaussian's own figure (edges that cut almost nothing).
      const first = this.states[0];
      let rootLost = rootSkipped;
      for (const p of this.states) {
        if (!upstream(p.index, p.positionMm)) break;
        rootLost += Math.sqrt(Math.max(0, p.powerInRel - p.powerOutRel));
      }
      const toHere = this.matrixFrom(first, beforeIndex ?? this.elements.length, beforeIndex === undefined ? positionMm : undefined);
      const firstQ = qFromBeam(first.gaussianRadiusM, first.gaussianCurvaturePerM === 0 ? null : 1 / first.gaussianCurvaturePerM, this.wavelengthM);
      // matrixFrom starts behind the first plane's element; a lens there acts on the unclipped Gaussian as well
      const w = beamRadiusM(applyAbcd(toHere, firstQ), this.wavelengthM);
      const gaussianRel = first.powerInRel * -Math.expm1((-2 * radiusM * radiusM) / (w * w));
      if (rootLost <= options.boundWithin * Math.sqrt(gaussianRel)) {
        const bound = (Math.sqrt(gaussianRel) + rootLost) ** 2;
        return Math.min(bound, total) * scaleMw;
      }
    }
    const source = Math.abs(matrix.b) > 0 ? this.sourceNodesFor(plane, matrix, radiusM, POWER_CYCLES_PER_PANEL) : null;
    let rel: number;
    if (source !== null && (source.rho.length * source.rho.length) / 2 <= this.maxHopWork) {
      rel = powerInsideCircle(source, matrix, this.wavelengthM, radiusM, this.exactBessel);
    } else {
      // geometric limit: the Gaussian inside the projected edge, scaled to the plane's power
      const q = applyAbcd(matrix, this.planeQ(plane));
      const w = beamRadiusM(q, this.wavelengthM);
      const shadow = plane.cutM * Math.abs(matrix.a + matrix.b * plane.gaussianCurvaturePerM);
      const inShadow = -Math.expm1((-2 * shadow * shadow) / (w * w));
      const r = Math.min(radiusM, shadow);
      rel = inShadow > 0 ? (plane.powerOutRel * -Math.expm1((-2 * r * r) / (w * w))) / inShadow : plane.powerOutRel;
    }
    return Math.min(widen(rel), total) * scaleMw;
  }

  /**
   * With only skipped edges upstream: the unclipped Gaussian's power inside the circle, widened by their losses
   * (powerInsideMw's inequality); the power carried there is the Gaussian's less those losses, so it is scaled back up.
   */
  private skippedEdgesBoundMw(positionMm: number, radiusM: number, beforeIndex: number | undefined, edges: readonly SkippedEdge[]): number | null {
    let q: BeamParameter;
    let carriedMw: number;
    if (beforeIndex !== undefined) {
      if (beforeIndex >= this.results.length) return null;
      q = this.coherentQ[beforeIndex];
      carriedMw = this.results[beforeIndex].incidentPowerMw;
    } else {
      let j = -1;
      for (let i = 0; i < this.results.length && this.elements[i].positionMm < positionMm; i++) j = i;
      if (j < 0) return null;
      const e = this.elements[j];
      q = e.kind === "lens" ? lensQ(this.coherentQ[j], e.focalLengthMm * M_PER_MM) : this.coherentQ[j];
      q = propagateQ(q, (positionMm - e.positionMm) * M_PER_MM);
      carriedMw = this.results[j].outgoingPowerMw;
    }
    const w = beamRadiusM(q, this.wavelengthM);
    const inside = -Math.expm1((-2 * radiusM * radiusM) / (w * w));
    const keptShare = edges.reduce((k, s) => k * (1 - s.lostShare), 1);
    const rootLost = edges.reduce((sum, s) => sum + Math.sqrt(s.lostShare), 0);
    return (carriedMw / keptShare) * Math.min(1, (Math.sqrt(inside) + rootLost) ** 2);
  }

  /** How far from the axis the field of a plane reaches after `matrix`: the geometric image of its edge plus its diffraction spread (header, limit 1). */
  private extentM(plane: PlaneState, matrix: AbcdMatrix, tailSpread = TAIL_SPREAD): number {
    const lambda = this.wavelengthM;
    const shadow = plane.reachM * Math.abs(matrix.a + matrix.b * plane.gaussianCurvaturePerM);
    const spread = (3 * lambda) / (Math.PI * plane.gaussianRadiusM) + (tailSpread * lambda) / plane.reachM;
    return shadow + Math.abs(matrix.b) * spread;
  }

  private planeQ(plane: PlaneState): BeamParameter {
    const r = plane.gaussianCurvaturePerM === 0 ? null : 1 / plane.gaussianCurvaturePerM;
    return qFromBeam(plane.gaussianRadiusM, r, this.wavelengthM);
  }
}

function publicPlane(p: PlaneState): ClipPlane {
  return {
    elementId: p.elementId, index: p.index, positionMm: p.positionMm, radiusM: p.radiusM, method: p.method,
    gaussianRadiusM: p.gaussianRadiusM, gaussianCurvaturePerM: p.gaussianCurvaturePerM, powerInRel: p.powerInRel, powerOutRel: p.powerOutRel,
  };
}

/**
 * Power inside the circle r ≤ a of the field Collins' integral gives from prepared source nodes (as `hop` takes them),
 * without the field itself: 2π∫₀^a |u'(r)|² r dr = 2π(2π/λB)² Σₙ Σₘ gₙ gₘ* ∫₀^a J₀(αₙr) J₀(αₘr) r dr, αₙ = 2πρₙ/(λ|B|),
 * and the inner integral in closed form (Lommel; Watson, Treatise on the Theory of Bessel Functions, 2nd ed., §5.11):
 *   a[αₙ J₁(αₙa) J₀(αₘa) − αₘ J₀(αₙa) J₁(αₘa)] / (αₙ² − αₘ²),  and (a²/2)[J₀(αₙa)² + J₁(αₙa)²] when n = m.
 * Two Bessel values per node instead of one per node pair and target point, and no target grid: the sum is over node
 * pairs only (a Hermitian form, so half of them). The same sampling rule as a hop out to r = a; the tabulated J₀ and J₁
 * (≤ 1.5e-8) unless exactBessel.
 */
export function powerInsideCircle(source: NodeField, matrix: AbcdMatrix, wavelengthM: number, radiusM: number, exactBessel = false): number {
  const n = source.rho.length;
  const beta = (2 * Math.PI) / (wavelengthM * Math.abs(matrix.b));
  const a = radiusM;
  const j0 = exactBessel ? besselJ0 : fastJ0;
  const j1 = exactBessel ? besselJ1 : fastJ1;
  if (!exactBessel && n > 0) {
    prepareFastJ0(beta * source.rho[n - 1] * a);
    prepareFastJ1(beta * source.rho[n - 1] * a);
  }
  const x = new Float64Array(n);
  const pA = new Float64Array(n); // Re g · J₀(αa)
  const pB = new Float64Array(n); // Im g · J₀(αa)
  const pC = new Float64Array(n); // Re g · α J₁(αa)
  const pD = new Float64Array(n); // Im g · α J₁(αa)
  let diagonal = 0;
  for (let k = 0; k < n; k++) {
    const alpha = beta * source.rho[k];
    const u = j0(alpha * a);
    const v = j1(alpha * a);
    const gr = source.re[k];
    const gi = source.im[k];
    x[k] = alpha * alpha;
    pA[k] = gr * u;
    pB[k] = gi * u;
    pC[k] = gr * alpha * v;
    pD[k] = gi * alpha * v;
    diagonal += (gr * gr + gi * gi) * ((a * a) / 2) * (u * u + v * v);
  }
  // Σ_{n<m} Re(gₙ gₘ*) a (sₙuₘ − uₙsₘ)/(xₙ − xₘ), with u = J₀(αa), s = αJ₁(αa), is half the sum over n ≠ m; there the
  // −uₙsₘ terms are the sₙuₘ terms with n and m swapped (the kernel is odd), so it is Σₙ sₙ Σ_{m≠n} uₘ/(xₙ − xₘ): two
  // Cauchy sums, by the fast multipole method (lib/optics/cauchy-sum.ts; the direct loop below 200 nodes)
  const sums = [new Float64Array(n), new Float64Array(n)];
  cauchySums(x, [pA, pB], sums);
  const [sA, sB] = sums;
  let pairs = 0; // the sum over n < m
  for (let i = 0; i < n; i++) pairs += pC[i] * sA[i] + pD[i] * sB[i];
  return 2 * Math.PI * beta * beta * (diagonal + 2 * a * pairs);
}

/** Collins' integral from prepared source nodes to radii r: (2π/(iλB))·e^{iπDr²/(λB)}·Σ g_n J₀(2πρ_n r/(λB)). */
export function hop(source: NodeField, matrix: AbcdMatrix, wavelengthM: number, radii: ArrayLike<number>, exactBessel: boolean): { re: Float64Array; im: Float64Array } {
  const n = radii.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  const b = matrix.b;
  const kScale = (2 * Math.PI) / (wavelengthM * b);
  let argMax = 0;
  const count = source.rho.length;
  const rhoMax = count > 0 ? source.rho[count - 1] : 0;
  for (let i = 0; i < n; i++) argMax = Math.max(argMax, Math.abs(kScale * radii[i] * rhoMax));
  if (!exactBessel) prepareFastJ0(argMax);
  const { rho, re: gr, im: gi } = source;
  for (let i = 0; i < n; i++) {
    const v = Math.abs(kScale * radii[i]);
    let sr = 0;
    let si = 0;
    if (v === 0) {
      for (let k = 0; k < count; k++) {
        sr += gr[k];
        si += gi[k];
      }
    } else if (exactBessel) {
      for (let k = 0; k < count; k++) {
        const j = besselJ0(v * rho[k]);
        sr += gr[k] * j;
        si += gi[k] * j;
      }
    } else {
      for (let k = 0; k < count; k++) {
        const j = fastJ0(v * rho[k]);
        sr += gr[k] * j;
        si += gi[k] * j;
      }
    }
    // × 2π/(iλB) = −i·kScale, then × e^{iπDr²/(λB)}
    const ar = kScale * si;
    const ai = -kScale * sr;
    const [c, s] = cisPi((matrix.d * radii[i] * radii[i]) / (wavelengthM * b));
    re[i] = ar * c - ai * s;
    im[i] = ar * s + ai * c;
  }
  return { re, im };
}
