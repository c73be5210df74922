// Number and time formatting shared by the review components: three significant figures, units named by the caller.
export function fmt(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || Number.isNaN(value)) return "—";
  if (!Number.isFinite(value)) return value > 0 ? "unbounded" : "—";
  if (value === 0) return "0";
  const abs = Math.abs(value);
  if (abs >= 1e5 || abs < 1e-3) return value.toExponential(digits - 1).replace("e", "×10^").replace("+", "");
  return String(Number(value.toPrecision(digits)));
}

export function utc(iso: string): string {
  return `${iso.slice(0, 16).replace("T", " ")} UTC`;
}

export function day(iso: string): string {
  return iso.slice(0, 10);
}

export const KIND_WORDS: Record<string, string> = {
  laser: "Laser",
  lens: "Lens",
  aperture: "Aperture (iris)",
  filter: "Filter",
  "beam-block": "Beam block",
  screen: "Screen",
};
