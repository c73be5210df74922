// Irradiance of a Gaussian beam (peak, and averaged over a limiting aperture) and the eyewear optical density it calls for.
// Formulas: the bench document contract (E = P·(1 − exp(−2r²/w²))/(π r²), OD = log10(E/MPE)); Gaussian power through a centred aperture (Siegman, Lasers, ch. 17).

import { SOURCE } from "./types";

/** Peak (on-axis) irradiance 2P/(π w²) of a Gaussian beam, w the 1/e² radius. */
export function peakIrradianceWPerCm2(powerMw: number, radiusMm: number): number {
  if (powerMw <= 0) return 0;
  const powerW = powerMw / 1000;
  const wCm = radiusMm / 10;
  return (2 * powerW) / (Math.PI * wCm * wCm);
}

/** Irradiance averaged over a centred circular aperture of diameter d: P·(1 − exp(−2r²/w²))/(π r²), r = d/2. */
export function apertureAveragedIrradianceWPerCm2(powerMw: number, radiusMm: number, apertureDiameterMm: number): number {
  if (powerMw <= 0) return 0;
  const powerW = powerMw / 1000;
  const rCm = apertureDiameterMm / 20;
  const ratio = (2 * (apertureDiameterMm / 2) ** 2) / (radiusMm * radiusMm);
  // -expm1(-x) = 1 − exp(−x) without cancellation for very large beams.
  return (powerW * -Math.expm1(-ratio)) / (Math.PI * rCm * rCm);
}

export type OpticalDensity = {
  /** log10(E/MPE); null when no light arrives. Negative means the exposure is below the MPE. */
  raw: number | null;
  /** The eyewear OD required: the raw value floored at 0 (a negative OD is never "required"). */
  required: number;
  source: string;
};

export function opticalDensity(irradianceWPerCm2: number, mpeWPerCm2: number): OpticalDensity {
  const raw = irradianceWPerCm2 > 0 ? Math.log10(irradianceWPerCm2 / mpeWPerCm2) : null;
  return { raw, required: raw === null ? 0 : Math.max(0, raw), source: SOURCE.productOd };
}
