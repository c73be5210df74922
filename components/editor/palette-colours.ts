// Colours of the drawing, from the theme tokens in app/globals.css (canvas code cannot read CSS variables cheaply).
// Colour only reinforces: every kind also has its own outline and a written label.
import type { HazardBandId } from "./hazard-bands";

export const THEME = {
  ink: "#0e1316",
  panel: "#161e23",
  raised: "#1e2a30",
  line: "#33444d",
  text: "#eef3f1",
  muted: "#a9bac0",
  accent: "#6fd6c8",
  accentStrong: "#9ef0e4",
  warn: "#ffcf5c",
  danger: "#ff8a7a",
  ok: "#8fe39a",
} as const;

export const SYMBOL_COLOURS = {
  laser: THEME.danger,
  laserFill: "#3a2320",
  lens: THEME.accentStrong,
  lensFill: "rgba(111, 214, 200, 0.18)",
  aperture: THEME.text,
  filter: THEME.warn,
  filterFill: "rgba(255, 207, 92, 0.12)",
  block: THEME.muted,
  blockMark: THEME.ink,
  screen: THEME.text,
} as const;

export type HatchKind = "none" | "single" | "cross";
export type BandStyle = { fill: string; edge: string; edgeWidth: number; dash?: number[]; hatch: HatchKind };

/**
 * The beam by required eyewear OD (hazard-bands.ts): fill, hatching and edge dash differ per band, so the band
 * reads without colour; colour (calm teal → amber → coral) only reinforces it.
 */
export const BAND_STYLES: Record<HazardBandId, BandStyle> = {
  low: { fill: "rgba(111, 214, 200, 0.16)", edge: THEME.accent, edgeWidth: 1.5, hatch: "none" },
  medium: { fill: "rgba(255, 207, 92, 0.18)", edge: THEME.warn, edgeWidth: 2, dash: [9, 4], hatch: "single" },
  high: { fill: "rgba(255, 138, 122, 0.24)", edge: THEME.danger, edgeWidth: 3, dash: [2, 3], hatch: "cross" },
};
