// Number and time formatting shared by the review components: three significant figures, units named by the caller.
import { KIND_NAMES } from "@/lib/bench/kinds";

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

/** Heading names of the element kinds, from the one record in lib/bench/kinds.ts. */
export const KIND_WORDS: Record<string, string> = Object.fromEntries(Object.entries(KIND_NAMES).map(([kind, n]) => [kind, n.title]));
