// Gaussian beams: the complex beam parameter q, ABCD matrices, thin-lens focusing and the M² embedded-Gaussian rule.
// Sources: Siegman, Lasers (1986), ch. 17 (q, 1/q = 1/R − iλ/πw²) and ch. 20 (ABCD, q' = (Aq + B)/(Cq + D)); Self, Applied Optics 22, 658 (1983) (thin-lens focusing); ISO 11146 / Siegman's embedded Gaussian (λ → M²λ).
//
// Lengths here are metres. q = z + i·zR at distance z downstream of a waist, so Re(1/q) = 1/R is > 0 for a
// diverging wavefront and < 0 for a converging one (the sign convention of the bench document contract). A beam of quality M²
// is carried as its embedded Gaussian with λ_eff = M²·λ: the real 1/e² radius W and wavefront radius R then
// follow the ordinary formulas (Siegman ch. 17.7 "embedded Gaussian"), so radius and curvature are the real beam's.

/** Complex beam parameter q in metres. */
export type BeamParameter = { readonly re: number; readonly im: number };

/** Ray-transfer matrix [[A, B], [C, D]]; B in metres, C in 1/metre. */
export type AbcdMatrix = { readonly a: number; readonly b: number; readonly c: number; readonly d: number };

export const IDENTITY: AbcdMatrix = { a: 1, b: 0, c: 0, d: 1 };

export const freeSpace = (lengthM: number): AbcdMatrix => ({ a: 1, b: lengthM, c: 0, d: 1 });

/** Thin lens of focal length f (f < 0 diverging). */
export const thinLens = (focalLengthM: number): AbcdMatrix => ({ a: 1, b: 0, c: -1 / focalLengthM, d: 1 });

/** second ∘ first: the matrix of `first` followed by `second`. */
export function compose(second: AbcdMatrix, first: AbcdMatrix): AbcdMatrix {
  return {
    a: second.a * first.a + second.b * first.c,
    b: second.a * first.b + second.b * first.d,
    c: second.c * first.a + second.d * first.c,
    d: second.c * first.b + second.d * first.d,
  };
}

/** Rayleigh range zR = π w0² / (M² λ). */
export const rayleighRangeM = (waistRadiusM: number, wavelengthM: number, m2 = 1): number =>
  (Math.PI * waistRadiusM * waistRadiusM) / (m2 * wavelengthM);

/** q at a waist of radius w0: q = i·zR. */
export const qAtWaist = (waistRadiusM: number, effectiveWavelengthM: number): BeamParameter => ({
  re: 0,
  im: rayleighRangeM(waistRadiusM, effectiveWavelengthM),
});

/** q → q + d (free space). */
export const propagateQ = (q: BeamParameter, lengthM: number): BeamParameter => ({ re: q.re + lengthM, im: q.im });

/** Thin lens: 1/q' = 1/q − 1/f. */
export function lensQ(q: BeamParameter, focalLengthM: number): BeamParameter {
  const den = q.re * q.re + q.im * q.im;
  const ir = q.re / den - 1 / focalLengthM; // Re(1/q')
  const ii = -q.im / den; // Im(1/q')
  const den2 = ir * ir + ii * ii;
  return { re: ir / den2, im: -ii / den2 };
}

/** q' = (Aq + B)/(Cq + D). */
export function applyAbcd(m: AbcdMatrix, q: BeamParameter): BeamParameter {
  const nr = m.a * q.re + m.b;
  const ni = m.a * q.im;
  const dr = m.c * q.re + m.d;
  const di = m.c * q.im;
  const den = dr * dr + di * di;
  return { re: (nr * dr + ni * di) / den, im: (ni * dr - nr * di) / den };
}

/** 1/e² radius w from q: Im(1/q) = −λ/(πw²) ⇒ w² = |q|² λ/(π Im q). */
export function beamRadiusM(q: BeamParameter, effectiveWavelengthM: number): number {
  return Math.sqrt(((q.re * q.re + q.im * q.im) * effectiveWavelengthM) / (Math.PI * q.im));
}

/**
 * 1/Re(1/q) = (re² + im²)/re, the wavefront radius; null for a flat wavefront (|Re(1/q)| below 1e-12 of |Im(1/q)|,
 * i.e. a radius beyond 10¹² Rayleigh ranges, which is flat to rounding).
 */
export function wavefrontRadiusM(q: BeamParameter): number | null {
  if (q.re === 0 || Math.abs(q.re) <= 1e-12 * Math.abs(q.im)) return null;
  return (q.re * q.re + q.im * q.im) / q.re;
}

/** Wavefront curvature 1/R in 1/m (0 for flat). */
export const curvaturePerM = (q: BeamParameter): number => q.re / (q.re * q.re + q.im * q.im);

/** The waist of the beam described by q: its offset downstream of the current plane (negative: virtual, upstream), radius and zR. */
export function waistOf(q: BeamParameter, effectiveWavelengthM: number): { offsetM: number; radiusM: number; rayleighRangeM: number } {
  return { offsetM: -q.re, radiusM: Math.sqrt((q.im * effectiveWavelengthM) / Math.PI), rayleighRangeM: q.im };
}

/** q from a measured radius and wavefront radius (null = flat) — the inverse of beamRadiusM/wavefrontRadiusM. */
export function qFromBeam(radiusM: number, wavefrontRadius: number | null, effectiveWavelengthM: number): BeamParameter {
  const ir = wavefrontRadius === null ? 0 : 1 / wavefrontRadius;
  const ii = -effectiveWavelengthM / (Math.PI * radiusM * radiusM);
  const den = ir * ir + ii * ii;
  return { re: ir / den, im: -ii / den };
}

/**
 * Self's thin-lens equation for Gaussian beams (Self 1983, eq. 5 in the ordinary sign convention):
 * 1/(s + zR²/(s − f)) + 1/s'' = 1/f, s the distance of the input waist in front of the lens, s'' the output
 * waist behind it; and the magnification m = w0''/w0 = 1/√((1 − s/f)² + (zR/f)²) (Self eq. 6).
 */
export function selfThinLens(objectDistanceM: number, rayleighRangeM_: number, focalLengthM: number): { imageDistanceM: number; magnification: number } {
  const s = objectDistanceM;
  const f = focalLengthM;
  const zr = rayleighRangeM_;
  const imageDistanceM = 1 / (1 / f - 1 / (s + (zr * zr) / (s - f)));
  const magnification = 1 / Math.sqrt((1 - s / f) ** 2 + (zr / f) ** 2);
  return { imageDistanceM, magnification };
}
