// The review components' names for the shared formatters (lib/format): figures through the one Intl formatter,
// dates in the lab's time zone.
import { formatDate, formatDateTime, formatNumber } from "@/lib/format";
import { KIND_NAMES } from "@/lib/bench/kinds";

export function fmt(value: number | null | undefined, digits = 3): string {
  return formatNumber(value, { digits });
}

/** Date and time in the lab's time zone (the name is older than the rule). */
export function utc(iso: string): string {
  return formatDateTime(iso);
}

export function day(iso: string): string {
  return formatDate(iso);
}

/** Heading names of the element kinds, from the one record in lib/bench/kinds.ts. */
export const KIND_WORDS: Record<string, string> = Object.fromEntries(Object.entries(KIND_NAMES).map(([kind, n]) => [kind, n.title]));
