// Partial coherence for M² > 1: the beam as a Gaussian Schell-model source of the same size and divergence, and its Fresnel pattern behind one circular aperture.
// Sources: Friberg & Sudol, Opt. Commun. 41, 383 (1982) and Mandel & Wolf, Optical Coherence and Quantum Optics (1995) §5.6 (Gaussian Schell-model: M² = √(1 + 4σ_S²/σ_g²)); Weber's second integral ∫₀^∞ e^{−p²x²}J₀(αx)J₀(βx)x dx = e^{−(α²+β²)/4p²}I₀(αβ/2p²)/(2p²) (Watson §13.31, from memory; checked numerically in tests).
//
// A GSM beam of 1/e² radius W (σ_S = W/2) and beam quality M² has the coherence width σ_g = W/√(M⁴ − 1) — at every plane, as both
// widths scale alike under paraxial propagation and a thin lens changes neither. Its cross-spectral density is a
// Gaussian mixture of tilted coherent beams (tilt wavenumbers with standard deviation 1/σ_g per axis), so behind a
// centred aperture the screen intensity is the coherent pattern I_coh(v) blurred by a 2-D Gaussian of standard
// deviation t = R/σ_g = √a·√(M⁴ − 1) in the normalised radius v = 2πrR/(λ|B|):
//   I(v_r) = ∫₀^∞ I_coh(v) (1/t²) e^{−(v − v_r)²/(2t²)} Ĩ₀(v·v_r/t²) v dv,   Ĩ₀(x) = e^{−x} I₀(x).
// The reference (no aperture) is the same blur of the coherent Gaussian e^{−v²/(2σ_v²)}, σ_v = πR·w_s/(λ|B|), whose
// centre is σ_v²/(σ_v² + t²). On axis, I(0) is evaluated as the equivalent double integral over the aperture
//   I(0) = 4|β|² ∫₀¹∫₀¹ g(s₁) g*(s₂) e^{−t²(s₁−s₂)²/2} Ĩ₀(t²s₁s₂) s₁s₂ ds₁ds₂,  g(s) = e^{−βs²}, β = a − iπN,
// by Gauss–Legendre panels resolving both the zones and the coherence width 1/t (≤ 16 nodes per 2/t).
import { fresnelRadialIntensity, panelsFor } from "./profile";
import { gaussLegendre } from "./quadrature";

const GL_ORDER = 16;
/** Above this many nodes per axis the incoherent (large-t) limit is used for the centre. */
const MAX_NODES = 1600;

const GL = gaussLegendre(GL_ORDER);

/** cos(πN) with N reduced mod 2 first, so large N keeps its phase. */
function cosPiN(n: number): number {
  const r = n - 2 * Math.floor(n / 2);
  return Math.cos(Math.PI * r);
}

/** e^{−x} I₀(x) for x ≥ 0: power series below 30 (all terms positive), Hankel's asymptotic series above (A&S 9.7.1, 9.8.1). */
export function scaledBesselI0(x: number): number {
  if (x < 30) {
    const y = 0.25 * x * x;
    let term = 1;
    let sum = 1;
    for (let k = 1; k < 200; k++) {
      term *= y / (k * k);
      sum += term;
      if (term < 1e-17 * sum) break;
    }
    return sum * Math.exp(-x);
  }
  let term = 1;
  let sum = 1;
  for (let k = 1; k < 20; k++) {
    term *= ((2 * k - 1) * (2 * k - 1)) / (k * 8 * x);
    sum += term;
    if (term < 1e-17) break;
  }
  return sum / Math.sqrt(2 * Math.PI * x);
}

/** t = R/σ_g for a GSM beam of R²/W² = a and beam quality m2 = M² (so M⁴ = m2²). */
export const gsmBlurWidth = (radiusRatioSquared: number, m2: number): number => Math.sqrt(radiusRatioSquared) * Math.sqrt(Math.max(0, m2 * m2 - 1));

function nodes(sMax: number, panels: number): { s: Float64Array; w: Float64Array } {
  const count = panels * GL_ORDER;
  const s = new Float64Array(count);
  const w = new Float64Array(count);
  const h = sMax / panels;
  let k = 0;
  for (let p = 0; p < panels; p++) {
    const mid = (p + 0.5) * h;
    for (let j = 0; j < GL_ORDER; j++) {
      s[k] = mid + 0.5 * h * GL.x[j];
      w[k] = 0.5 * h * GL.w[j];
      k++;
    }
  }
  return { s, w };
}

/**
 * Centre ratio of a GSM beam behind one aperture: I(0) ÷ the unobstructed GSM centre. a = R²/W², n = Fresnel number,
 * t = R/σ_g, sigmaV = πR·w_s/(λ|B|). Reduces to |1 − e^{−β}|² as t → 0.
 */
export function gsmCentreRatio(a: number, n: number, t: number, sigmaV: number, refinement = 1): number {
  const reference = (sigmaV * sigmaV) / (sigmaV * sigmaV + t * t);
  // an edge at e^{−a} < 2e-9 of the peak amplitude cannot change the centre: the closed form, coherent or not
  if (a > 20 || t === 0) return Math.max(0, 1 - 2 * Math.exp(-a) * cosPiN(n) + Math.exp(-2 * a));
  const br = a;
  const bi = -Math.PI * n;
  const beta2 = br * br + bi * bi;
  const sMax = Math.min(1, Math.sqrt(40 / a));
  const panels = Math.ceil(Math.max(panelsFor(a, n, 0, 1), Math.ceil((t * sMax) / 2) + 2) * refinement);
  if (panels * GL_ORDER > MAX_NODES * refinement) {
    if (t * t < 0.01 * beta2) {
      // many zones, short blur: the boundary-wave picture (Born & Wolf §8.9), the field near the axis being the
      // geometric beam minus e^{−β}J₀(v); blurring J₀ gives e^{−t²/2} and J₀² gives e^{−t²}I₀(t²)
      return Math.max(0, 1 - 2 * Math.exp(-a) * cosPiN(n) * Math.exp(-0.5 * t * t) + Math.exp(-2 * a) * scaledBesselI0(t * t));
    }
    // incoherent limit (t → ∞): the kernel tends to δ(s₁ − s₂)/(t²s₁), so I(0) → |β|²(1 − e^{−2a})/(a·t²)
    const limit = (beta2 * -Math.expm1(-2 * a)) / (a * t * t);
    return limit / reference;
  }
  const { s, w } = nodes(sMax, panels);
  const count = s.length;
  const gr = new Float64Array(count);
  const gi = new Float64Array(count);
  for (let k = 0; k < count; k++) {
    const s2 = s[k] * s[k];
    const m = Math.exp(-a * s2) * s[k] * w[k];
    const ph = n * s2;
    const red = ph - 2 * Math.floor(ph / 2);
    // g(s) = e^{−βs²} = e^{−as²} e^{+iπNs²}
    gr[k] = m * Math.cos(Math.PI * red);
    gi[k] = m * Math.sin(Math.PI * red);
  }
  const t2 = t * t;
  let sum = 0;
  for (let i = 0; i < count; i++) {
    // diagonal once, off-diagonal twice (the kernel is symmetric, g g* + g* g = 2 Re)
    sum += (gr[i] * gr[i] + gi[i] * gi[i]) * scaledBesselI0(t2 * s[i] * s[i]);
    const cut = 9 / t;
    for (let j = i + 1; j < count; j++) {
      const d = s[i] - s[j];
      if (-d > cut) break; // nodes ascend: e^{−t²d²/2} < e^{−40} from here on
      const k = Math.exp(-0.5 * t2 * d * d) * scaledBesselI0(t2 * s[i] * s[j]);
      sum += 2 * k * (gr[i] * gr[j] + gi[i] * gi[j]);
    }
  }
  const centre = 4 * beta2 * sum;
  return Math.max(0, centre) / reference;
}

/**
 * The GSM pattern at normalised radii v (v = 2πrR/(λ|B|)) ÷ the unobstructed GSM centre: the coherent pattern blurred
 * as in the header. The value at v = 0 is left to the caller (gsmCentreRatio).
 */
export function gsmRadialIntensity(a: number, n: number, t: number, sigmaV: number, vs: ArrayLike<number>): Float64Array {
  const reference = (sigmaV * sigmaV) / (sigmaV * sigmaV + t * t);
  const out = new Float64Array(vs.length);
  const reach = 9 * t;
  // the coherent pattern is band-limited to 1/π cycles per unit v; 4 cycles per panel
  const all: number[] = [];
  const plan: { from: number; count: number; nodes: { s: Float64Array; w: Float64Array }; lo: number }[] = [];
  for (let i = 0; i < vs.length; i++) {
    const vr = Math.abs(vs[i]);
    const lo = Math.max(0, vr - reach);
    const hi = vr + reach;
    const panels = Math.ceil((hi - lo) / Math.PI / 4 + 2);
    const nd = nodes(hi - lo, panels);
    plan.push({ from: all.length, count: nd.s.length, nodes: nd, lo });
    for (let k = 0; k < nd.s.length; k++) all.push(lo + nd.s[k]);
  }
  const coherent = fresnelRadialIntensity(a, n, all);
  const t2 = t * t;
  for (let i = 0; i < vs.length; i++) {
    const vr = Math.abs(vs[i]);
    const p = plan[i];
    let sum = 0;
    for (let k = 0; k < p.count; k++) {
      const v = p.lo + p.nodes.s[k];
      const d = v - vr;
      sum += p.nodes.w[k] * coherent[p.from + k] * v * Math.exp((-0.5 * d * d) / t2) * scaledBesselI0((v * vr) / t2);
    }
    out[i] = Math.max(0, sum / t2) / reference;
  }
  return out;
}
