// Fitting a measured radial profile with the predicted screen pattern as the aperture-to-screen distance varies.
// Sources: Born & Wolf, Principles of Optics (7th ed.) §8.2 (half-period zones) and §8.8 (the circular aperture's Fresnel pattern, computed by screenProfile); Press et al., Numerical Recipes (3rd ed.) §10.2 (golden-section search), §15.2 (straight-line fit).
//
// The model of one annulus's median level: level = offset + gain · (blur_σ * I_d)(r·mmPerPixel)^γ, where I_d is
// screenProfile for the drawn bench with its screen moved to distance d behind the aperture, σ the photo's blur and γ
// the camera's tone curve (an 8-bit photo stores roughly linear^(1/2.2)). Offset and gain are solved in closed form;
// saturated annuli are left out (they only say "at least this bright"). The pattern's scale is carried by the shadow
// edge: I_d is tabulated against r / S_d (S_d = shadowRadiusMm) and the photo's edge radius in pixels is a fit variable,
// so the zone count and the scale are fitted together. The distance drawn is never used as a starting point.
import type { BenchDocument, BenchElement } from "@/lib/bench/schema";
import { screenProfile } from "./profile";

export type FitSample = { radiusPx: Float64Array; level: Float64Array; weight: Float64Array; binPx: number };

export type PatternModel = {
  distanceMm: number;
  zoneCount: number;
  shadowRadiusMm: number;
  /** Relative intensity on a uniform grid of t = r / shadowRadius from 0 to T_MAX. */
  values: Float64Array;
  centreRatio: number;
};

export const T_MAX = 1.75;

/** The drawn bench with its screen `distanceMm` behind the aperture, every other element as drawn. */
export function withScreenAt(doc: BenchDocument, apertureId: string, screenId: string, distanceMm: number): BenchDocument {
  const aperture = doc.elements.find((e) => e.id === apertureId);
  if (aperture === undefined) return doc;
  const elements = doc.elements.map((e): BenchElement => (e.id === screenId ? { ...e, positionMm: aperture.positionMm + distanceMm } : e));
  return { ...doc, elements };
}

/** |N| at distance d, or null where the bench gives no pattern there. */
export function zoneCountAt(doc: BenchDocument, apertureId: string, screenId: string, distanceMm: number): { zoneCount: number; shadowRadiusMm: number } | null {
  try {
    const p = screenProfile(withScreenAt(doc, apertureId, screenId, distanceMm), apertureId, { radiiMm: [0] });
    if (!Number.isFinite(p.fresnelNumber) || !(p.shadowRadiusMm > 0)) return null;
    return { zoneCount: Math.abs(p.fresnelNumber), shadowRadiusMm: p.shadowRadiusMm };
  } catch {
    return null;
  }
}

export function patternModel(doc: BenchDocument, apertureId: string, screenId: string, distanceMm: number): PatternModel | null {
  const head = zoneCountAt(doc, apertureId, screenId, distanceMm);
  if (head === null) return null;
  // ≥ 16 samples per finest ring period (≈ S/(2N) near the edge), so linear interpolation keeps the rings
  const points = Math.min(4000, Math.max(400, Math.ceil(16 * T_MAX * head.zoneCount + 300)));
  const radiiMm = Array.from({ length: points }, (_, i) => (head.shadowRadiusMm * T_MAX * i) / (points - 1));
  try {
    const p = screenProfile(withScreenAt(doc, apertureId, screenId, distanceMm), apertureId, { radiiMm });
    return {
      distanceMm,
      zoneCount: Math.abs(p.fresnelNumber),
      shadowRadiusMm: p.shadowRadiusMm,
      values: Float64Array.from(p.relativeIntensity, (v) => Math.max(0, v)),
      centreRatio: p.relativeIntensity[0],
    };
  } catch {
    return null;
  }
}

/** Model value at t (linear interpolation on the uniform grid; 0 beyond). */
function sampleModel(values: Float64Array, t: number): number {
  const u = (t / T_MAX) * (values.length - 1);
  if (u >= values.length - 1) return values[values.length - 1];
  const i = u | 0;
  const f = u - i;
  return values[i] * (1 - f) + values[i + 1] * f;
}

export type FitParams = { edgePx: number; gamma: number; blurPx: number };
export type FitResult = FitParams & { rss: number; offset: number; gain: number };

/** Weighted straight-line fit level ≈ offset + gain·x; a non-positive gain scores as "no fit" (the total sum of squares). */
function lineFit(x: Float64Array, y: Float64Array, w: Float64Array): { rss: number; offset: number; gain: number } {
  let sw = 0;
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let k = 0; k < x.length; k++) {
    const wk = w[k];
    if (wk === 0) continue;
    sw += wk;
    sx += wk * x[k];
    sy += wk * y[k];
    sxx += wk * x[k] * x[k];
    sxy += wk * x[k] * y[k];
    syy += wk * y[k] * y[k];
  }
  const tss = syy - (sy * sy) / sw;
  const vxx = sxx - (sx * sx) / sw;
  const vxy = sxy - (sx * sy) / sw;
  if (!(vxx > 0) || !(vxy > 0)) return { rss: tss, offset: sy / sw, gain: 0 };
  const gain = vxy / vxx;
  return { rss: Math.max(0, tss - gain * vxy), offset: (sy - gain * sx) / sw, gain };
}

export function totalSumOfSquares(s: FitSample): number {
  let sw = 0;
  let sy = 0;
  let syy = 0;
  for (let k = 0; k < s.level.length; k++) {
    sw += s.weight[k];
    sy += s.weight[k] * s.level[k];
    syy += s.weight[k] * s.level[k] * s.level[k];
  }
  return syy - (sy * sy) / sw;
}

/** Evaluates one (model, edge, γ, σ) against the sample; buffers are reused between calls. */
export class ProfileScorer {
  private readonly lin: Float64Array;
  private readonly blurred: Float64Array;
  private readonly x: Float64Array;
  private readonly kernels = new Map<number, Float64Array>();
  constructor(private readonly sample: FitSample) {
    const n = sample.level.length;
    this.lin = new Float64Array(n);
    this.blurred = new Float64Array(n);
    this.x = new Float64Array(n);
  }

  score(model: PatternModel, p: FitParams): FitResult {
    const { radiusPx, level, weight, binPx } = this.sample;
    const n = level.length;
    const invEdge = 1 / p.edgePx;
    for (let k = 0; k < n; k++) this.lin[k] = sampleModel(model.values, radiusPx[k] * invEdge);
    let src = this.lin;
    const sigmaBins = p.blurPx / binPx;
    if (sigmaBins > 0.25) {
      let kernel = this.kernels.get(sigmaBins);
      if (kernel === undefined) {
        const h = Math.ceil(3 * sigmaBins);
        kernel = new Float64Array(2 * h + 1);
        let sum = 0;
        for (let i = -h; i <= h; i++) sum += kernel[i + h] = Math.exp((-0.5 * i * i) / (sigmaBins * sigmaBins));
        for (let i = 0; i < kernel.length; i++) kernel[i] /= sum;
        this.kernels.set(sigmaBins, kernel);
      }
      const half = (kernel.length - 1) / 2;
      for (let k = 0; k < n; k++) {
        let acc = 0;
        for (let i = -half; i <= half; i++) {
          let j = k + i;
          if (j < 0) j = -j - 1; // the profile is even in r: reflect about the centre
          if (j >= n) j = n - 1;
          acc += kernel[i + half] * this.lin[j];
        }
        this.blurred[k] = acc;
      }
      src = this.blurred;
    }
    for (let k = 0; k < n; k++) this.x[k] = Math.pow(src[k], p.gamma);
    const fit = lineFit(this.x, level, weight);
    return { ...p, ...fit };
  }

  /** Quick score for the sweep: no blur, the model already raised to γ (`powered` = values^γ). */
  sweepScore(powered: Float64Array, edgePx: number): number {
    const { radiusPx, level, weight } = this.sample;
    const invEdge = 1 / edgePx;
    for (let k = 0; k < level.length; k++) this.x[k] = sampleModel(powered, radiusPx[k] * invEdge);
    return lineFit(this.x, level, weight).rss;
  }

  /** The fitted levels offset + gain·x for plotting (after a score with the same parameters). */
  curve(model: PatternModel, fit: FitResult): Float64Array {
    this.score(model, fit);
    return Float64Array.from(this.x, (v) => fit.offset + fit.gain * v);
  }

  /** Best γ, σ and edge for this model, by coordinate search from `start`. */
  polish(model: PatternModel, start: FitParams): FitResult {
    let best = this.score(model, start);
    const gammas = [0.3, 0.35, 0.4, 0.45, 0.5, 0.55, 0.6, 0.7, 0.8, 0.9, 1];
    const blurs = [0, 0.5, 1, 1.5, 2, 3, 4, 6];
    for (let cycle = 0; cycle < 2; cycle++) {
      for (const gamma of gammas) {
        const r = this.score(model, { ...best, gamma });
        if (r.rss < best.rss) best = r;
      }
      for (const blurPx of blurs) {
        const r = this.score(model, { ...best, blurPx });
        if (r.rss < best.rss) best = r;
      }
      const span = cycle === 0 ? 0.04 : 0.01;
      const edge = goldenMin((e) => this.score(model, { ...best, edgePx: e }).rss, best.edgePx * (1 - span), best.edgePx * (1 + span), 14);
      const r = this.score(model, { ...best, edgePx: edge });
      if (r.rss < best.rss) best = r;
    }
    return best;
  }
}

/** Golden-section minimum of f on [lo, hi] (Numerical Recipes §10.2). */
export function goldenMin(f: (x: number) => number, lo: number, hi: number, iterations: number): number {
  const g = (Math.sqrt(5) - 1) / 2;
  let a = lo;
  let b = hi;
  let c = b - g * (b - a);
  let d = a + g * (b - a);
  let fc = f(c);
  let fd = f(d);
  for (let i = 0; i < iterations; i++) {
    if (fc < fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - g * (b - a);
      fc = f(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + g * (b - a);
      fd = f(d);
    }
  }
  return fc < fd ? c : d;
}

/**
 * Distances at which |N| takes the values lo, lo + step(N), … hi, found on a logarithmic sweep of the screen from
 * minMm to maxMm and refined by bisection. Works for any bench between aperture and screen (|N| need not be monotonic).
 */
export function distancesForZoneCounts(
  doc: BenchDocument,
  apertureId: string,
  screenId: string,
  range: { minMm: number; maxMm: number; zonesLo: number; zonesHi: number },
  step: (zones: number) => number,
): number[] {
  const sweep = 360;
  const ds: number[] = [];
  const ns: (number | null)[] = [];
  const ratio = Math.log(range.maxMm / range.minMm);
  for (let i = 0; i < sweep; i++) {
    const d = range.minMm * Math.exp((ratio * i) / (sweep - 1));
    ds.push(d);
    ns.push(zoneCountAt(doc, apertureId, screenId, d)?.zoneCount ?? null);
  }
  const targets: number[] = [];
  for (let z = range.zonesLo; z <= range.zonesHi; z += step(z)) targets.push(z);
  const out: number[] = [];
  for (let i = 0; i + 1 < sweep; i++) {
    const n0 = ns[i];
    const n1 = ns[i + 1];
    if (n0 === null || n1 === null || n0 === n1) continue;
    const lo = Math.min(n0, n1);
    const hi = Math.max(n0, n1);
    // N is smooth in log d, and the sweep is dense (Δln d ≈ 0.03), so linear interpolation in ln d is enough:
    // the model computed at that distance carries its own exact N
    for (const z of targets) {
      if (z < lo || z >= hi) continue;
      const f = (z - n0) / (n1 - n0);
      out.push(Math.exp(Math.log(ds[i]) * (1 - f) + Math.log(ds[i + 1]) * f));
    }
  }
  return out.sort((x, y) => x - y);
}
