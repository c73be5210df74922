// One record per element kind: its name, symbol geometry, new-element defaults, editable fields and how it acts on the beam.
// Shares follow the Fresnel/energy bookkeeping of the bench document contract "The table in two dimensions" (mirror R, splitter R / 1 − R, window r, r(1−r)², (1−r)²).
import type { TableElement, TableElementKind } from "./schema-v2";
import { DEFAULT_CLEAR_APERTURE_MM } from "./schema-v2";

/** An editable number of an element, with its unit (the editor and the sheets print it). */
export type KindField = {
  key: string;
  label: string;
  unit: string;
  hint?: string;
  optional?: boolean;
  /**
   * The field may be left empty although the label does not say "optional": whether empty is acceptable depends on
   * other fields (a laser's power may be empty only for a single pulse given by its energy), and the schema says so.
   */
  allowEmpty?: boolean;
  step?: number;
};

/**
 * How the element acts on a beam whose axis meets its face:
 * source — emits; transmit — the beam goes on (the straight-rail engine changes it: lens, aperture, filter);
 * stop — ends the beam; turn — the beam leaves as the branches listed by `branchesOf`.
 */
export type BeamAction = "source" | "transmit" | "stop" | "turn";

/** The symbol drawn for the element, in mm on the table (true scale) or as proportions on a rail drawing. */
export type SymbolGeometry = {
  shape: "box" | "lens" | "iris" | "slab" | "block" | "bar" | "mirror" | "cube" | "plate";
  /** Along the face (the clear aperture's direction), mm. */
  faceMm: number;
  /** Along the normal (thickness), mm. */
  depthMm: number;
};

export type ElementKindRecord = {
  kind: TableElementKind;
  /** What people call it, as a heading: lists, drawings and sheets. */
  label: string;
  /** The lower-case noun for sentences ("beam block"). */
  noun: string;
  /** The id prefix of a new element ("lens" → "lens-3"). */
  idPrefix: string;
  /** Whether a version 1 (straight rail) document may hold it. */
  onRail: boolean;
  action: BeamAction;
  symbol: SymbolGeometry;
  /** Values a new element starts with (beside id, kind and its place). */
  defaults: Record<string, number>;
  /** Kind-specific fields, in the order the editor shows them (place and clear aperture are common to all). */
  fields: KindField[];
  /** One line on what it does to the light, for legends and the build sheet. */
  effect: string;
};

const clearApertureField: KindField = {
  key: "clearApertureMm",
  label: "Clear aperture",
  unit: "mm",
  optional: true,
  hint: "Length of the optic's face; a beam whose axis misses it passes by. Empty means 25.4 mm.",
  step: 0.1,
};

export const ELEMENT_KIND_RECORDS: Record<TableElementKind, ElementKindRecord> = {
  laser: {
    kind: "laser",
    noun: "laser",
    label: "Laser",
    idPrefix: "laser",
    onRail: true,
    action: "source",
    symbol: { shape: "box", faceMm: 40, depthMm: 120 },
    defaults: { wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 },
    fields: [
      { key: "wavelengthNm", label: "Wavelength", unit: "nm", step: 0.1 },
      { key: "powerMw", label: "Power", unit: "mW", allowEmpty: true, hint: "Average power for a pulse train. For a single pulse given by its energy, leave it empty.", step: 0.1 },
      { key: "beamDiameterMm", label: "Beam diameter (1/e², at the waist)", unit: "mm", step: 0.1 },
      { key: "m2", label: "Beam quality M²", unit: "", optional: true, hint: "Leave empty for an ideal beam (M² = 1).", step: 0.1 },
      { key: "pulseEnergyJ", label: "Pulse energy", unit: "J", optional: true, hint: "Pulsed lasers: energy of one pulse (e.g. 1e-3 for 1 mJ). Leave empty for a continuous laser." },
      { key: "pulseDurationS", label: "Pulse duration", unit: "s", optional: true, hint: "Pulsed lasers: e.g. 1e-8 for 10 ns, 1e-13 for 100 fs." },
      { key: "pulseRepetitionRateHz", label: "Repetition rate", unit: "Hz", optional: true, hint: "Pulse trains only: pulses per second on average (for bursts, pulses per burst × bursts per second); empty for a single pulse." },
      { key: "pulsesPerBurst", label: "Pulses per burst", unit: "", optional: true, hint: "Trains in bursts only: how many pulses each burst holds." },
      { key: "burstPulseRateHz", label: "Pulse rate inside a burst", unit: "Hz", optional: true, hint: "Trains in bursts only: the rate of the pulses within one burst." },
    ],
    effect: "Emits the beam along its direction.",
  },
  lens: {
    kind: "lens",
    noun: "lens",
    label: "Lens",
    idPrefix: "lens",
    onRail: true,
    action: "transmit",
    symbol: { shape: "lens", faceMm: 25.4, depthMm: 6 },
    defaults: { focalLengthMm: 100 },
    fields: [{ key: "focalLengthMm", label: "Focal length", unit: "mm", hint: "Negative for a diverging lens.", step: 1 }],
    effect: "Focuses (or spreads) the beam; the direction stays.",
  },
  aperture: {
    kind: "aperture",
    noun: "aperture",
    label: "Aperture (iris)",
    idPrefix: "iris",
    onRail: true,
    action: "transmit",
    symbol: { shape: "iris", faceMm: 25.4, depthMm: 3 },
    defaults: { diameterMm: 2 },
    fields: [{ key: "diameterMm", label: "Diameter", unit: "mm", step: 0.1 }],
    effect: "Passes the light inside its opening and diffracts it.",
  },
  filter: {
    kind: "filter",
    noun: "filter",
    label: "Filter",
    idPrefix: "filter",
    onRail: true,
    action: "transmit",
    symbol: { shape: "slab", faceMm: 25.4, depthMm: 4 },
    defaults: { opticalDensity: 1 },
    fields: [{ key: "opticalDensity", label: "Optical density", unit: "OD", hint: "Transmits 10^−OD of the power.", step: 0.1 }],
    effect: "Transmits 10^−OD of the power.",
  },
  "beam-block": {
    kind: "beam-block",
    noun: "beam block",
    label: "Beam block",
    idPrefix: "block",
    onRail: true,
    action: "stop",
    symbol: { shape: "block", faceMm: 25.4, depthMm: 12 },
    defaults: {},
    fields: [],
    effect: "Stops the beam.",
  },
  screen: {
    kind: "screen",
    noun: "screen",
    label: "Screen",
    idPrefix: "screen",
    onRail: true,
    action: "stop",
    symbol: { shape: "bar", faceMm: 25.4, depthMm: 3 },
    defaults: {},
    fields: [],
    effect: "Shows the pattern and stops the beam.",
  },
  mirror: {
    kind: "mirror",
    noun: "mirror",
    label: "Mirror",
    idPrefix: "mirror",
    onRail: false,
    action: "turn",
    symbol: { shape: "mirror", faceMm: 25.4, depthMm: 6 },
    defaults: { reflectance: 0.99 },
    fields: [{ key: "reflectance", label: "Reflectance", unit: "", optional: true, hint: "Reflected share, 0–1; empty means 0.99. The rest is absorbed.", step: 0.01 }],
    effect: "Reflects the beam about its normal; the missing share is absorbed.",
  },
  "beam-splitter": {
    kind: "beam-splitter",
    noun: "beam splitter",
    label: "Beam splitter",
    idPrefix: "splitter",
    onRail: false,
    action: "turn",
    symbol: { shape: "cube", faceMm: 25.4, depthMm: 25.4 },
    defaults: { reflectance: 0.5 },
    fields: [{ key: "reflectance", label: "Reflectance", unit: "", hint: "Reflected share, 0–1; the rest goes straight on.", step: 0.01 }],
    effect: "Reflects a share about its normal; the rest goes straight on.",
  },
  window: {
    kind: "window",
    noun: "window",
    label: "Window",
    idPrefix: "window",
    onRail: false,
    action: "turn",
    symbol: { shape: "plate", faceMm: 25.4, depthMm: 3 },
    defaults: { reflectancePerSurface: 0.04 },
    fields: [
      { key: "reflectancePerSurface", label: "Reflectance per surface", unit: "", optional: true, hint: "Empty means 0.04 (uncoated glass).", step: 0.01 },
    ],
    effect: "Transmits (1 − r)² and sends two ghost beams back about its normal.",
  },
};

export const kindRecord = (kind: string): ElementKindRecord | undefined =>
  (ELEMENT_KIND_RECORDS as Record<string, ElementKindRecord | undefined>)[kind];

/** The label of a kind ("beam-block" → "Beam block"); unknown kinds read as given. */
export const kindLabel = (kind: string): string => kindRecord(kind)?.label ?? kind;

/** The kind in running text ("beam block", "beam splitter"); unknown kinds read as given. */
export const kindWord = (kind: string): string => kindRecord(kind)?.noun ?? kind;

/** Editable fields of a kind, with the clear aperture for every optical element on a table. */
export function tableFieldsOf(kind: TableElementKind): KindField[] {
  const record = ELEMENT_KIND_RECORDS[kind];
  return record.action === "source" ? record.fields : [...record.fields, clearApertureField];
}

export const clearApertureOf = (e: TableElement): number =>
  e.kind === "laser" ? 0 : (e.clearApertureMm ?? DEFAULT_CLEAR_APERTURE_MM);

/** One light run leaving a turning element: straight on or reflected about the normal, with its share of the incident power. */
export type Branch = { direction: "straight" | "reflected"; share: number; role: "reflected" | "transmitted" | "front-ghost" | "rear-ghost" };

export const DEFAULT_MIRROR_REFLECTANCE = 0.99;
export const DEFAULT_WINDOW_REFLECTANCE = 0.04;

/** The runs a turning element sends on (empty for other kinds). Shares of zero are left out. */
export function branchesOf(e: TableElement): Branch[] {
  let out: Branch[] = [];
  switch (e.kind) {
    case "mirror":
      out = [{ direction: "reflected", share: e.reflectance ?? DEFAULT_MIRROR_REFLECTANCE, role: "reflected" }];
      break;
    case "beam-splitter":
      out = [
        { direction: "reflected", share: e.reflectance, role: "reflected" },
        { direction: "straight", share: 1 - e.reflectance, role: "transmitted" },
      ];
      break;
    case "window": {
      const r = e.reflectancePerSurface ?? DEFAULT_WINDOW_REFLECTANCE;
      out = [
        { direction: "straight", share: (1 - r) * (1 - r), role: "transmitted" },
        { direction: "reflected", share: r, role: "front-ghost" },
        { direction: "reflected", share: r * (1 - r) * (1 - r), role: "rear-ghost" },
      ];
      break;
    }
    default:
      out = [];
  }
  return out.filter((b) => b.share > 0);
}
