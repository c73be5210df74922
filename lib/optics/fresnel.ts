// Fresnel zones at a circular aperture: Fresnel number, exposed half-period zones, regime, centre intensity, zone radii.
// Sources: Born & Wolf, Principles of Optics (7th ed.) §8.2 (half-period zones) and §8.8 (on-axis intensity of a circular aperture); Hecht, Optics (5th ed.) §10.3 (zone radii r_n = √(nλab/(a+b))); Goodman, Introduction to Fourier Optics (3rd ed.) §4.2–4.3 (regimes); Siegman, Lasers (1986) ch. 17 (power through an aperture).
//
// Lengths are metres. The aperture (radius R) is lit by a Gaussian of 1/e² radius w and wavefront radius ρ; the
// screen sits behind a paraxial system of matrix [[A, B], [C, D]] (free space: A = 1, B = b). By the Collins
// integral the on-axis field is ∝ ∫₀^R exp(−ρ'²/w²) exp(iπρ'²(1/ρ + A/B)/λ) 2πρ' dρ', so the quadratic phase
// is set by the "zone curvature" κ = 1/ρ + A/B (= 1/ρ + 1/b in free space; 1/b = 0 with no screen) and
// N = R²κ/λ. Integrating in u = ρ'² gives the closed form of the bench document contract: ratio = |1 − exp(−R²/w² − iπN)|².

/** N = R²κ/λ with κ = 1/ρ + A/B in 1/m. Negative when the beam converges to a focus before the screen. */
export const fresnelNumber = (apertureRadiusM: number, wavelengthM: number, zoneCurvaturePerM: number): number =>
  (apertureRadiusM * apertureRadiusM * zoneCurvaturePerM) / wavelengthM;

/** cos(πN) with N reduced mod 2 first, so large N keeps its phase. */
function cosPiN(n: number): number {
  const r = n - 2 * Math.floor(n / 2);
  return Math.cos(Math.PI * r);
}

/**
 * On-axis intensity with the aperture divided by that without it, for a Gaussian of R²/w² = a:
 * |1 − e^{−a} e^{−iπN}|² = 1 − 2e^{−a}cos(πN) + e^{−2a}. It lies in [(1 − e^{−a})², (1 + e^{−a})²].
 */
export function centreIntensityRatio(radiusRatioSquared: number, fresnelNumber_: number): number {
  const e = Math.exp(-radiusRatioSquared);
  return Math.max(0, 1 - 2 * e * cosPiN(fresnelNumber_) + e * e);
}

/** The uniform-wave (w ≫ R) limit 4 sin²(πN/2) = 2 − 2cos(πN) (Born & Wolf §8.8, from memory). */
export const uniformWaveRatio = (fresnelNumber_: number): number => Math.max(0, 2 - 2 * cosPiN(fresnelNumber_));

/** Fraction of a Gaussian's power inside radius R: 1 − exp(−2R²/w²) (Siegman ch. 17). */
export const transmittedFraction = (apertureRadiusM: number, beamRadiusM: number): number =>
  -Math.expm1((-2 * apertureRadiusM * apertureRadiusM) / (beamRadiusM * beamRadiusM));

export type CentreAppearance = "bright" | "dark" | "between";

/** The bench document contract thresholds: bright when the ratio is ≥ 2, dark when ≤ 0.5. */
export const centreAppearance = (ratio: number): CentreAppearance => (ratio >= 2 ? "bright" : ratio <= 0.5 ? "dark" : "between");

export type DiffractionRegime = "fraunhofer" | "fresnel" | "geometric";

/**
 * Thresholds (our choice, stated so they can be argued with): Fraunhofer when |N| < 0.1 (the far-field condition
 * N ≪ 1, Goodman §4.3; at N = 0.1 the edge zone's phase error is π/10 and the centre is within 3 % of Airy),
 * geometric when |N| > 100 (the shadow edge then holds the diffraction within ~1/√N ≈ 10 % of R), Fresnel between.
 */
export const FRAUNHOFER_MAX_FRESNEL_NUMBER = 0.1;
export const GEOMETRIC_MIN_FRESNEL_NUMBER = 100;

export function diffractionRegime(fresnelNumber_: number): DiffractionRegime {
  const n = Math.abs(fresnelNumber_);
  if (n < FRAUNHOFER_MAX_FRESNEL_NUMBER) return "fraunhofer";
  if (n > GEOMETRIC_MIN_FRESNEL_NUMBER) return "geometric";
  return "fresnel";
}

/**
 * Outer radii of the first `count` half-period zones in the aperture plane: πr_n²κ/λ = nπ ⇒ r_n = √(nλ/|κ|),
 * which is √(nλab/(a+b)) for a point source at a (κ = 1/a + 1/b, Hecht §10.3) and √(nλb) for a plane wave.
 * Empty when κ = 0 (screen at the geometric focus: the zones are infinitely wide).
 */
export function zoneRadiiM(wavelengthM: number, zoneCurvaturePerM: number, count = 5): number[] {
  const k = Math.abs(zoneCurvaturePerM);
  if (!(k > 0) || !Number.isFinite(k)) return [];
  const out: number[] = [];
  for (let n = 1; n <= count; n++) {
    const radiusM = Math.sqrt((n * wavelengthM) / k);
    // A vanishing net curvature (|k| near the smallest doubles) puts the outer zones at infinity:
    // list only the zones that have a finite radius.
    if (!Number.isFinite(radiusM)) break;
    out.push(radiusM);
  }
  return out;
}
