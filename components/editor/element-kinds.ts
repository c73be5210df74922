// What the editor knows about each element kind: its name, the id prefix, a new element's values and the
// editable fields with their units. Validation itself is the shared zod schema (lib/bench/schema.ts).
import { laserPowerText } from "@/lib/bench/laser-power";
import {
  apertureSchema,
  beamBlockSchema,
  filterSchema,
  laserSchema,
  lensSchema,
  screenSchema,
  ELEMENT_KINDS,
  type BenchElement,
  type ElementKind,
} from "@/lib/bench/schema";
import { ELEMENT_KIND_RECORDS } from "@/lib/bench/element-kinds";

export type NumericField = {
  key: string;
  label: string;
  unit: string;
  hint?: string;
  optional?: boolean;
  allowEmpty?: boolean;
  step?: number;
};

type KindInfo = {
  label: string;
  idPrefix: string;
  fields: NumericField[];
  defaults: Record<string, number>;
};

const position: NumericField = { key: "positionMm", label: "Position on the rail", unit: "mm", step: 1 };

/** The editor's view of each rail kind, from the one record per kind (lib/bench/element-kinds.ts) plus the rail position. */
export const KIND_INFO: Record<ElementKind, KindInfo> = Object.fromEntries(
  ELEMENT_KINDS.map((kind) => {
    const record = ELEMENT_KIND_RECORDS[kind];
    return [kind, { label: record.label, idPrefix: record.idPrefix, defaults: record.defaults, fields: [position, ...record.fields] }];
  }),
) as Record<ElementKind, KindInfo>;

export const ELEMENT_SCHEMAS = {
  laser: laserSchema,
  lens: lensSchema,
  aperture: apertureSchema,
  filter: filterSchema,
  "beam-block": beamBlockSchema,
  screen: screenSchema,
} as const;

/** A short label for the drawing and lists: the kind and its main value. */
export function shortLabel(e: BenchElement): string {
  switch (e.kind) {
    case "laser":
      return `${e.wavelengthNm} nm · ${laserPowerText(e)}`;
    case "lens":
      return `f ${e.focalLengthMm > 0 ? "+" : "−"}${Math.abs(e.focalLengthMm)} mm`;
    case "aperture":
      return `⌀ ${e.diameterMm} mm`;
    case "filter":
      return `OD ${e.opticalDensity}`;
    default:
      return "";
  }
}

export function nextId(kind: ElementKind, elements: readonly BenchElement[]): string {
  const prefix = KIND_INFO[kind].idPrefix;
  let max = 0;
  for (const e of elements) {
    const m = new RegExp(`^${prefix}-(\\d+)$`).exec(e.id);
    if (m) max = Math.max(max, Number(m[1]));
  }
  return `${prefix}-${max + 1}`;
}

export function newElement(kind: ElementKind, positionMm: number, elements: readonly BenchElement[]): BenchElement {
  return { id: nextId(kind, elements), kind, positionMm: roundMm(positionMm), ...KIND_INFO[kind].defaults } as BenchElement;
}

/** Positions are kept to the micrometre so repeated moves do not accumulate float noise. */
export const roundMm = (mm: number): number => Math.round(mm * 1000) / 1000;

export const SNAP_CHOICES = [
  { value: 0, label: "Off" },
  { value: 1, label: "1 mm" },
  { value: 25, label: "25 mm holes" },
  { value: 25.4, label: "1 inch (25.4 mm)" },
] as const;

export const snapMm = (mm: number, stepMm: number): number => (stepMm > 0 ? roundMm(Math.round(mm / stepMm) * stepMm) : roundMm(mm));

export const formatMm = (mm: number): string => `${Number(mm.toFixed(3))} mm`;
