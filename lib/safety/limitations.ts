// What the laser hazard engine does not cover, as data shown beside every result.
// Scope follows the point-source, single-wavelength parts of ANSI Z136.1-2014 and IEC 60825-1:2014.

export type Limitation = { id: string; text: string };

export const LIMITATIONS: readonly Limitation[] = [
  {
    id: "unchecked-values",
    text: "Every table value (MPEs, class limits, measurement conditions, correction factors) is not yet checked against the standard's text — confirm with your laser safety officer. Each figure names the standard and table it comes from.",
  },
  { id: "point-source", text: "Intrabeam figures are for point sources (α ≤ 1.5 mrad, C_E = 1). Only the diffuse spot on a screen or beam block is treated as an extended source (C_E from the angle it subtends at 10 cm); diffusers, fibre bundles and arrays are not assessed." },
  { id: "lines", text: "Further emission lines share the main line's beam size, divergence and pulse timing; along the bench each line is taken with the main line's beam radius. Lines acting on the same tissue are added by the sum-of-fractions rule; every UV and far-IR line is counted as acting on the cornea and lens together, which may add more than the standards' tables do (stricter)." },
  { id: "scanning", text: "Scanning and moving beams are not covered; treat them as stationary (stricter) or ask the safety officer." },
  { id: "mirrors", text: "Specular reflections from mirrors, windows and lens surfaces are not traced; a reflection can carry most of the beam in a new direction." },
  { id: "corneal-1200-1400", text: "In 1200–1400 nm the 2014 editions' corneal/lens dual limit is stood in for by the 1400–1500 nm corneal values over their own aperture; Directive 2006/25/EC's C_C = 8.0 (stricter) is mentioned in a note, not applied." },
  { id: "skin-large-area", text: "The lower skin limits for beams larger than 100 cm² beyond 1400 nm are not applied." },
  {
    id: "pulsed-simplified",
    text: "Pulsed lasers: the three repetitive-pulse rules are applied with C_P = N^−0.25 everywhere (the conservative reading; a note says where a 2014 edition relaxes it). Regular bursts (a fixed number of evenly spaced pulses per burst) are assessed pulse by pulse and also with each burst as one pulse of its energy and length; irregular trains are not modelled: enter one as a train at its highest pulse rate. Pulses overlapping (duration × rate ≥ 1) are refused.",
  },
  { id: "class-conditions", text: "The class check uses the stated power, energy, diameter and divergence with the waist at the laser; it is no substitute for the manufacturer's classification, which rests on measurement under the standard's conditions. Class 1C is not assessed. Class 3B vs 4 uses the total emission (no aperture)." },
  { id: "atmosphere", text: "Atmospheric attenuation, and the beam passing through windows or viewports, are ignored (stricter)." },
  { id: "ir-eyewear", text: "Eyewear damage thresholds (EN 207 ratings) are not checked; only the optical density needed to bring the exposure to the MPE is computed." },
];
