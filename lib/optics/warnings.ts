// The optics warnings: stable kebab-case codes (never renamed; new ones may be added) and their plain sentences.
// Thresholds come from the modules that raise them (fresnel.ts regimes, analyze.ts clipping and focus rules); no formula here.

export const WARNING_CODES = {
  /** The document has no laser (the schema forbids this; analyzeBench still answers). */
  "no-laser": "There is no laser on the bench.",
  /** An element sits upstream of the laser (smaller positionMm): it gets no light and is ignored. */
  "element-upstream-of-laser": "An element upstream of the laser gets no light.",
  /** No screen anywhere downstream of the laser. */
  "no-screen": "No screen downstream of the laser.",
  /** A beam block stops the light before any screen: nothing reaches the screen. */
  "screen-not-reached": "Nothing reaches the screen.",
  /** An element lies beyond the first screen or beam block and gets no light. */
  "element-beyond-stop": "An element beyond the first screen or beam block gets no light.",
  /** An aperture beyond the stop: not reached, so it has no Fresnel analysis. */
  "aperture-not-reached": "An aperture is not reached by the light.",
  /** Two or more elements share a position; their order is taken by kind, then id. */
  "same-position": "Elements at the same position.",
  /** The aperture transmits more than 99 % of the power: the beam hardly touches its edge, so zone analysis is moot. */
  "aperture-clips-little": "The aperture clips less than 1 % of the beam.",
  /** The aperture transmits less than 1 % of the power. */
  "aperture-passes-little": "The aperture passes less than 1 % of the beam.",
  /** No screen receives the aperture's light: screenId is null and N uses 1/b = 0 (the far field). */
  "aperture-without-screen": "No screen receives this aperture's light; the Fresnel number is for the far field.",
  /** The screen is in (or imaged onto) the aperture plane (|B| < 1 nm): no diffraction pattern to speak of. */
  "screen-at-aperture": "The screen is at, or imaged onto, the aperture.",
  /** Lenses between aperture and screen: the pattern uses the Collins (ABCD) diffraction integral. */
  "lens-between-aperture-and-screen": "A lens lies between the aperture and its screen.",
  /** Another aperture between this one and its screen: its own figure has it and those upstream in place; screens[] has them all. */
  "apertures-in-series": "Apertures in series.",
  /** A positive lens inside the incoming Rayleigh range forms a small focus (Self 1983), not quite at f. */
  "lens-focus-in-rayleigh-range": "A lens inside the Rayleigh range makes a small-waist focus.",
  /** The focus is so tight (divergence > 0.1 rad) that paraxial Gaussian optics is only indicative. */
  "focus-beyond-paraxial": "A focus (or the laser waist) is too tight for paraxial optics.",
  /** M² > 1 behind more than one clipping edge: the field is carried as a coherent Gaussian, so those centres are "between". */
  "coherent-model-for-m2": "Fresnel patterns assume a coherent Gaussian beam (M² > 1).",
  /** M² > 1, one clipping edge: the pattern is a Gaussian Schell-model beam's (Friberg & Sudol 1982), with lower contrast. */
  "partially-coherent-beam": "The pattern is computed for a partially coherent beam (M² > 1).",
  /** The first non-paraxial term of the zone count exceeds 0.1 zone: the centre is shown as "between". */
  "zone-count-non-paraxial": "The paraxial zone count is uncertain by more than 0.1 zone.",
  /** A lens or filter mount (clearApertureMm) cuts off more than 0.1 % of the light: it acts as an aperture. */
  "clear-aperture-clips": "A lens or filter mount clips the beam.",
  /** The propagated field behind an edge is taken in the geometric limit (a hop too fine to integrate). */
  "field-geometric-limit": "The diffracted field is taken in the geometric limit.",
} as const;

export type WarningCode = keyof typeof WARNING_CODES;

export type OpticsWarning = { code: WarningCode; elementId?: string; message: string };

export function warning(code: WarningCode, message: string, elementId?: string): OpticsWarning {
  return elementId === undefined ? { code, message } : { code, elementId, message };
}

/** A number for a sentence: three significant figures, exponent only when it would be unreadable. */
export function formatNumber(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  const a = Math.abs(v);
  if (a !== 0 && (a >= 1e6 || a < 1e-3)) return v.toExponential(2);
  return String(Number(v.toPrecision(3)));
}

/** A length given in mm, shown in µm below 0.1 mm and in m from 10 m. */
export function formatLengthMm(mm: number): string {
  const a = Math.abs(mm);
  if (a < 0.1 && a !== 0) return `${formatNumber(mm * 1000)} µm`;
  if (a >= 10_000) return `${formatNumber(mm / 1000)} m`;
  return `${formatNumber(mm)} mm`;
}
