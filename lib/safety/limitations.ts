// What the laser hazard engine does not cover, as data shown beside every result.
// Scope follows the point-source, single-wavelength parts of ANSI Z136.1-2014 and IEC 60825-1:2014.

export type Limitation = { id: string; text: string };

export const LIMITATIONS: readonly Limitation[] = [
  {
    id: "from-memory",
    text: "The table values were recalled, not read from the standards' texts; the correction factors C_A, C_B, C_C, T1, T2 and the repetitive-pulse rules were checked against Directive 2006/25/EC Annex II. The tests mark which values are from memory.",
  },
  { id: "point-source", text: "Point sources only (α ≤ 1.5 mrad, C_E = 1). Extended sources — diffusers, fibre bundles, arrays, large diffuse spots — are not assessed; the point-source MPE used is the stricter one." },
  { id: "single-wavelength", text: "One wavelength per laser. Multi-line or broadband lasers and harmonics leaking from a converter need each line assessed and the exposures added." },
  { id: "scanning", text: "Scanning and moving beams are not covered; treat them as stationary (stricter) or ask the safety officer." },
  { id: "mirrors", text: "Specular reflections from mirrors, windows and lens surfaces are not traced; a reflection can carry most of the beam in a new direction." },
  { id: "corneal-1200-1400", text: "The additional corneal/lens limit for 1200–1400 nm (ANSI 2014; IEC uses the Class 3B limit as a dual limit there) is not applied." },
  { id: "skin-large-area", text: "The lower skin limits for beams larger than 100 cm² beyond 1400 nm are not applied." },
  {
    id: "pulsed-simplified",
    text: "Pulsed lasers: the eye MPE applies the three repetitive-pulse rules with C_P = N^−0.25 everywhere (the 2014 relaxations are not used). The class check of pulses is simplified: a per-pulse Class 1 limit derived from the MPE and the 7 mm aperture, and a recalled Class 3B per-pulse limit of 0.03·C_A J. Irregular pulse trains, bursts and pulses shorter than 1 ns outside 400–1400 nm are not covered.",
  },
  { id: "single-pulse-energy", text: "For a single pulse (no repetition rate), the stated power is taken as the power during the pulse, so the pulse energy is power × duration." },
  { id: "class-conditions", text: "The class check uses the stated power, diameter and divergence with the waist at the laser; it is no substitute for the manufacturer's classification, which rests on measurement under the standard's conditions. Class 1C is not assessed." },
  { id: "atmosphere", text: "Atmospheric attenuation, and the beam passing through windows or viewports, are ignored (stricter)." },
  { id: "ir-eyewear", text: "Eyewear damage thresholds (EN 207 ratings) are not checked; only the optical density needed to bring the exposure to the MPE is computed." },
];
