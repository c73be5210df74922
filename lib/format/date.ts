// Dates and times for people, one format everywhere, in the lab's time zone (the institution's, unless a lab says
// otherwise): "2 Dec 2026" and "2 Dec 2026, 14:05 GMT". Validity ends at the end of its last day in that zone.

/** The institution's time zone (Northmere University is in the United Kingdom); LAB_TIME_ZONE overrides it. */
export const LAB_TIME_ZONE: string =
  (typeof process !== "undefined" ? process.env.NEXT_PUBLIC_LAB_TIME_ZONE : undefined) || "Europe/London";

const LOCALE = "en-GB";

type DateInput = Date | string | number | null | undefined;

function toDate(value: DateInput): Date | null {
  if (value === null || value === undefined || value === "") return null;
  const d = value instanceof Date ? value : new Date(value);
  return Number.isNaN(d.getTime()) ? null : d;
}

/** "2 Dec 2026" in the lab's time zone; "—" when there is no date. */
export function formatDate(value: DateInput, timeZone: string = LAB_TIME_ZONE): string {
  const d = toDate(value);
  if (!d) return "—";
  return new Intl.DateTimeFormat(LOCALE, { day: "numeric", month: "short", year: "numeric", timeZone }).format(d);
}

/** "2 Dec 2026, 14:05 GMT" in the lab's time zone, with the zone's short name so the reader knows which clock. */
export function formatDateTime(value: DateInput, timeZone: string = LAB_TIME_ZONE): string {
  const d = toDate(value);
  if (!d) return "—";
  const parts = new Intl.DateTimeFormat(LOCALE, {
    day: "numeric",
    month: "short",
    year: "numeric",
    hour: "2-digit",
    minute: "2-digit",
    hourCycle: "h23",
    timeZone,
    timeZoneName: "short",
  }).formatToParts(d);
  const get = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? "";
  return `${get("day")} ${get("month")} ${get("year")}, ${get("hour")}:${get("minute")} ${get("timeZoneName")}`;
}

/** The offset of `timeZone` from UTC at instant `at`, in minutes (east positive). */
function offsetMinutes(at: Date, timeZone: string): number {
  const parts = new Intl.DateTimeFormat("en-US", {
    timeZone,
    hourCycle: "h23",
    year: "numeric",
    month: "2-digit",
    day: "2-digit",
    hour: "2-digit",
    minute: "2-digit",
    second: "2-digit",
  }).formatToParts(at);
  const n = (type: string) => Number(parts.find((p) => p.type === type)?.value);
  const asUtc = Date.UTC(n("year"), n("month") - 1, n("day"), n("hour"), n("minute"), n("second"));
  return Math.round((asUtc - at.getTime()) / 60_000);
}

/**
 * The last instant of a calendar day ("2027-03-31") in the lab's time zone: a sign-off "valid until 31 Mar 2027"
 * holds until 23:59:59.999 that day on the lab's clocks.
 */
export function endOfDayInZone(isoDay: string, timeZone: string = LAB_TIME_ZONE): Date {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(isoDay);
  if (!m) throw new Error(`Expected a calendar day as YYYY-MM-DD, got "${isoDay}"`);
  // midnight starting the next day, as UTC, then corrected by the zone's offset at that moment (twice: DST edges)
  const nextMidnightUtc = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]) + 1);
  let guess = nextMidnightUtc - offsetMinutes(new Date(nextMidnightUtc), timeZone) * 60_000;
  guess = nextMidnightUtc - offsetMinutes(new Date(guess), timeZone) * 60_000;
  return new Date(guess - 1);
}

/** The calendar day (YYYY-MM-DD) an instant falls on in the lab's time zone. */
export function dayInZone(value: DateInput, timeZone: string = LAB_TIME_ZONE): string {
  const d = toDate(value);
  if (!d) return "";
  const parts = new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).formatToParts(d);
  const get = (type: string) => parts.find((p) => p.type === type)?.value ?? "";
  return `${get("year")}-${get("month")}-${get("day")}`;
}
