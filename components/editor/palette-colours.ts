// Colours of the drawing, from the theme tokens in app/globals.css (canvas code cannot read CSS variables cheaply).
// Colour only reinforces: every kind also has its own outline and a written label.
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
