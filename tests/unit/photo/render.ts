// Test support: synthetic screen photos rendered by a method independent of lib/optics (Lommel series, own Bessel, own beam).
// Sources: Born & Wolf, Principles of Optics (7th ed.) §8.8.1 (Lommel functions U_n, V_n for the circular aperture) and §8.2
// (half-period zones); Siegman, Lasers (1986) §17.1–17.4 (q parameter, ABCD through a thin lens); Numerical Recipes (3rd ed.)
// §6.5 (Miller's backward recurrence for J_n, normalised by J₀ + 2ΣJ₂ₖ = 1, A&S 9.1.46).
//
// The reader in lib/optics/photo*.ts integrates the Fresnel integral by Gauss–Legendre quadrature (lib/optics/profile.ts);
// these photos are made from the two Lommel-type series instead, derived by repeated integration by parts of
//   F(u, v) = ∫₀¹ J₀(vρ) e^{iuρ²/2} ρ dρ:
//   U form (|v| ≥ |u|): F = e^{iu/2}/v · Σ_{n≥0} (−iu/v)^n J_{n+1}(v)
//   V form (|v| < |u|): F = [e^{iu/2} Σ_{n≥0} (−iv/u)^n J_n(v) − e^{−iv²/(2u)}] / (iu)
// (the complex-u generalisation of Born & Wolf's U₁, U₂ and V₀, V₁). For a Gaussian of radius w and wavefront radius ρ_c on
// an aperture of radius R, a free-space distance b before the screen: u = 2πN + 2i·R²/w², N = (R²/λ)(1/ρ_c + 1/b),
// v = 2π r R/(λ b), and the intensity relative to the unobstructed on-axis intensity is |2β F|² with β = −iu/2.
import type { BenchDocument, BenchElement } from "@/lib/bench/schema";
import { seededRandom } from "@/lib/seeded-random";

type Complex = { re: number; im: number };
const cmul = (a: Complex, b: Complex): Complex => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const cdiv = (a: Complex, b: Complex): Complex => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};
const cexp = (z: Complex): Complex => {
  const m = Math.exp(z.re);
  return { re: m * Math.cos(z.im), im: m * Math.sin(z.im) };
};

/** J_0 … J_nMax at x ≥ 0 by Miller's backward recurrence (Numerical Recipes §6.5), our own code, not lib/optics/bessel.ts. */
export function besselSeries(nMax: number, x: number): Float64Array {
  const out = new Float64Array(nMax + 1);
  if (x === 0) {
    out[0] = 1;
    return out;
  }
  let start = Math.max(nMax, Math.ceil(x)) + 30 + Math.ceil(12 * Math.cbrt(x));
  if (start % 2) start++;
  let jp = 0;
  let j = 1e-300;
  let norm = 0;
  const tmp = new Float64Array(start + 2);
  tmp[start] = j;
  for (let k = start; k >= 1; k--) {
    const jm = ((2 * k) / x) * j - jp;
    jp = j;
    j = jm;
    tmp[k - 1] = j;
    if (Math.abs(j) > 1e250) {
      for (let i = k - 1; i <= start; i++) tmp[i] *= 1e-250;
      j *= 1e-250;
      jp *= 1e-250;
    }
  }
  norm = tmp[0];
  for (let k = 2; k <= start; k += 2) norm += 2 * tmp[k];
  for (let k = 0; k <= nMax; k++) out[k] = tmp[k] / norm;
  return out;
}

/** |2βF|² by the Lommel-type series above; `a` = R²/w², `n` = Fresnel number, `v` = 2πrR/(λb). */
export function lommelRelativeIntensity(a: number, n: number, v: number): number {
  const u: Complex = { re: 2 * Math.PI * n, im: 2 * a };
  const uAbs = Math.hypot(u.re, u.im);
  const halfIu = cmul({ re: 0, im: 0.5 }, u); // iu/2
  const eHalf = cexp(halfIu);
  const terms = Math.ceil(v + 30 + 10 * Math.cbrt(v + 1));
  let f: Complex;
  if (v >= uAbs && v > 0) {
    const j = besselSeries(terms + 1, v);
    const ratio = cdiv(cmul({ re: 0, im: -1 }, u), { re: v, im: 0 }); // −iu/v
    let p: Complex = { re: 1, im: 0 };
    let s: Complex = { re: 0, im: 0 };
    for (let k = 0; k <= terms; k++) {
      s = { re: s.re + p.re * j[k + 1], im: s.im + p.im * j[k + 1] };
      p = cmul(p, ratio);
    }
    f = cdiv(cmul(eHalf, s), { re: v, im: 0 });
  } else {
    const j = besselSeries(terms, v);
    const ratio = cdiv({ re: 0, im: -v }, u); // −iv/u
    let p: Complex = { re: 1, im: 0 };
    let s: Complex = { re: 0, im: 0 };
    for (let k = 0; k <= terms; k++) {
      s = { re: s.re + p.re * j[k], im: s.im + p.im * j[k] };
      p = cmul(p, ratio);
    }
    const tail = cexp(cdiv({ re: 0, im: -v * v }, { re: 2 * u.re, im: 2 * u.im })); // e^{−iv²/(2u)}
    const num = cmul(eHalf, s);
    f = cdiv({ re: num.re - tail.re, im: num.im - tail.im }, cmul({ re: 0, im: 1 }, u));
  }
  const beta = cmul({ re: 0, im: -0.5 }, u);
  const g = cmul({ re: 2 * beta.re, im: 2 * beta.im }, f);
  return g.re * g.re + g.im * g.im;
}

/** A straight bench: laser, optional lenses before the aperture, the aperture, and the screen at a known distance. */
export type SyntheticBench = {
  wavelengthNm: number;
  /** 1/e² diameter of the waist, at position 0. */
  beamDiameterMm: number;
  lenses: { positionMm: number; focalLengthMm: number }[];
  aperturePositionMm: number;
  apertureDiameterMm: number;
  /** The true aperture-to-screen distance (free space). */
  screenDistanceMm: number;
};

/** The beam on the aperture by Siegman's q parameter (own code): 1/e² radius and wavefront curvature (1/ρ, 0 when flat). */
export function beamOnAperture(b: SyntheticBench): { radiusM: number; curvaturePerM: number; wavelengthM: number } {
  const lambda = b.wavelengthNm * 1e-9;
  const w0 = (b.beamDiameterMm / 2) * 1e-3;
  let q: Complex = { re: 0, im: (Math.PI * w0 * w0) / lambda };
  let z = 0;
  for (const lens of [...b.lenses].sort((x, y) => x.positionMm - y.positionMm)) {
    if (lens.positionMm >= b.aperturePositionMm) continue;
    q = { re: q.re + (lens.positionMm - z) * 1e-3, im: q.im };
    z = lens.positionMm;
    const inv = cdiv({ re: 1, im: 0 }, q);
    q = cdiv({ re: 1, im: 0 }, { re: inv.re - 1 / (lens.focalLengthMm * 1e-3), im: inv.im });
  }
  q = { re: q.re + (b.aperturePositionMm - z) * 1e-3, im: q.im };
  const inv = cdiv({ re: 1, im: 0 }, q);
  // 1/q = 1/ρ − iλ/(πw²)
  return { radiusM: Math.sqrt(-lambda / (Math.PI * inv.im)), curvaturePerM: inv.re, wavelengthM: lambda };
}

export type TruePattern = { fresnelNumber: number; radiusRatioSquared: number; shadowRadiusMm: number; vPerMm: number };

export function truePattern(b: SyntheticBench): TruePattern {
  const { radiusM, curvaturePerM, wavelengthM } = beamOnAperture(b);
  const R = (b.apertureDiameterMm / 2) * 1e-3;
  const dist = b.screenDistanceMm * 1e-3;
  return {
    fresnelNumber: ((R * R) / wavelengthM) * (curvaturePerM + 1 / dist),
    radiusRatioSquared: (R * R) / (radiusM * radiusM),
    shadowRadiusMm: R * Math.abs(1 + dist * curvaturePerM) * 1e3,
    vPerMm: (2 * Math.PI * R) / (wavelengthM * dist) * 1e-3,
  };
}

/** Relative intensity at each radius (mm) on the screen. */
export function syntheticProfile(b: SyntheticBench, radiiMm: ArrayLike<number>): Float64Array {
  const p = truePattern(b);
  const out = new Float64Array(radiiMm.length);
  for (let i = 0; i < radiiMm.length; i++) out[i] = lommelRelativeIntensity(p.radiusRatioSquared, p.fresnelNumber, radiiMm[i] * p.vPerMm);
  return out;
}

/** The bench document as drawn, with the screen `drawnScreenDistanceMm` behind the aperture. */
export function benchDocument(b: SyntheticBench, drawnScreenDistanceMm: number): BenchDocument {
  const elements: BenchElement[] = [
    { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: b.wavelengthNm, powerMw: 1, beamDiameterMm: b.beamDiameterMm },
    ...b.lenses.map((l, i): BenchElement => ({ id: `lens${i + 1}`, kind: "lens", positionMm: l.positionMm, focalLengthMm: l.focalLengthMm })),
    { id: "iris", kind: "aperture", positionMm: b.aperturePositionMm, diameterMm: b.apertureDiameterMm },
    { id: "screen", kind: "screen", positionMm: b.aperturePositionMm + drawnScreenDistanceMm },
  ];
  return { version: 1, title: "synthetic photo bench", elements };
}

/** Deterministic numbers (lib/seeded-random.ts) so photos repeat from a seed, and normal deviates from them. */
export function randomSource(seed: number): { next: () => number; normal: () => number } {
  const next = seededRandom(seed);
  const normal = () => {
    const u = Math.max(next(), 1e-12);
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * next());
  };
  return { next, normal };
}

export type PhotoOptions = {
  widthPx: number;
  heightPx: number;
  centrePx: { x: number; y: number };
  mmPerPixel: number;
  /** Gaussian blur of the linear image, σ in pixels. */
  blurPx: number;
  /** Camera gamma: stored value = linear^(1/gamma). */
  gamma: number;
  /** The pattern's brightest linear value in units of the sensor's full scale (> 1 saturates the core). */
  exposure: number;
  /** Uniform room light and its gradient across the photo, in units of full scale (linear). */
  roomLight: number;
  roomLightGradient: number;
  /** Read noise, σ in 8-bit levels after gamma. */
  noiseLevels: number;
  /** Fraction of pixels stuck at full scale. */
  hotPixelFraction: number;
  /** Laser colour weights for R, G, B. */
  colour: [number, number, number];
  seed: number;
};

export const defaultPhoto = (over: Partial<PhotoOptions> = {}): PhotoOptions => ({
  widthPx: 640,
  heightPx: 480,
  centrePx: { x: 300.3, y: 250.7 },
  mmPerPixel: 0.01,
  blurPx: 1,
  gamma: 2.2,
  exposure: 1.3,
  roomLight: 0.03,
  roomLightGradient: 0.04,
  noiseLevels: 2,
  hotPixelFraction: 3e-4,
  colour: [1, 0.25, 0.15],
  seed: 1,
  ...over,
});

export type Photo = { widthPx: number; heightPx: number; data: Uint8ClampedArray };

function blurInPlace(img: Float32Array, w: number, h: number, sigma: number): void {
  if (!(sigma > 0.05)) return; // below a twentieth of a pixel the blur does nothing (and σ² could underflow)
  const half = Math.ceil(3 * sigma);
  const k = new Float32Array(2 * half + 1);
  let sum = 0;
  for (let i = -half; i <= half; i++) sum += k[i + half] = Math.exp((-0.5 * i * i) / (sigma * sigma));
  for (let i = 0; i < k.length; i++) k[i] /= sum;
  const line = new Float32Array(Math.max(w, h));
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      let acc = 0;
      for (let i = -half; i <= half; i++) acc += k[i + half] * img[y * w + Math.min(w - 1, Math.max(0, x + i))];
      line[x] = acc;
    }
    img.set(line.subarray(0, w), y * w);
  }
  for (let x = 0; x < w; x++) {
    for (let y = 0; y < h; y++) {
      let acc = 0;
      for (let i = -half; i <= half; i++) acc += k[i + half] * img[Math.min(h - 1, Math.max(0, y + i)) * w + x];
      line[y] = acc;
    }
    for (let y = 0; y < h; y++) img[y * w + x] = line[y];
  }
}

/** A photo of the pattern taken square-on: linear intensity → blur → room light → clip → gamma → noise, hot pixels → 8 bits. */
export function renderPhoto(b: SyntheticBench, o: PhotoOptions): Photo {
  const { widthPx: w, heightPx: h } = o;
  const rng = randomSource(o.seed);
  const cornerPx = Math.hypot(Math.max(o.centrePx.x, w - o.centrePx.x), Math.max(o.centrePx.y, h - o.centrePx.y));
  const stepPx = 0.25;
  const count = Math.ceil(cornerPx / stepPx) + 2;
  const radii = Float64Array.from({ length: count }, (_, i) => i * stepPx * o.mmPerPixel);
  const prof = syntheticProfile(b, radii);
  let peak = 0;
  for (const v of prof) peak = Math.max(peak, v);
  const lin = new Float32Array(w * h);
  for (let y = 0; y < h; y++) {
    const dy = y + 0.5 - o.centrePx.y;
    for (let x = 0; x < w; x++) {
      const u = Math.hypot(x + 0.5 - o.centrePx.x, dy) / stepPx;
      const i = Math.floor(u);
      const t = u - i;
      lin[y * w + x] = ((prof[i] * (1 - t) + prof[i + 1] * t) / peak) * o.exposure;
    }
  }
  blurInPlace(lin, w, h, o.blurPx);
  const data = new Uint8ClampedArray(w * h * 4);
  const angle = rng.next() * 2 * Math.PI;
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      const ramp = ((x / w - 0.5) * Math.cos(angle) + (y / h - 0.5) * Math.sin(angle)) * o.roomLightGradient;
      const v = Math.min(1, Math.max(0, lin[y * w + x] + o.roomLight + ramp));
      const g = Math.pow(v, 1 / o.gamma);
      const p = (y * w + x) * 4;
      const hot = rng.next() < o.hotPixelFraction;
      for (let c = 0; c < 3; c++) {
        data[p + c] = hot ? 255 : Math.round(255 * g * o.colour[c] + o.noiseLevels * rng.normal());
      }
      data[p + 3] = 255;
    }
  }
  return { widthPx: w, heightPx: h, data };
}

/** Grey noise with no pattern at all. */
export function noisePhoto(w: number, h: number, meanLevel: number, noiseLevels: number, seed: number): Photo {
  const rng = randomSource(seed);
  const data = new Uint8ClampedArray(w * h * 4);
  for (let p = 0; p < w * h; p++) {
    const v = Math.round(meanLevel + noiseLevels * rng.normal());
    data[4 * p] = data[4 * p + 1] = data[4 * p + 2] = v;
    data[4 * p + 3] = 255;
  }
  return { widthPx: w, heightPx: h, data };
}
