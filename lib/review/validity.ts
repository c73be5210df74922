// The review rules for how long a sign-off holds: the default and longest validity and the last
// moment of the chosen day. Pure; our own rules (the institution's officer may choose shorter).
import { AppError } from "@/lib/errors";
import { endOfDayInZone } from "@/lib/format/date";

export const DEFAULT_VALIDITY_MONTHS = 12;
export const MAX_VALIDITY_MONTHS = 60;

export function addMonths(date: Date, months: number): Date {
  const d = new Date(date);
  d.setUTCMonth(d.getUTCMonth() + months);
  return d;
}

/**
 * The end of the given day in the lab's time zone (lib/format/date), checked to lie in the future and within the
 * longest validity; 12 months from now when no day is given.
 */
export function validityEnd(now: Date, day: string | undefined, timeZone?: string): Date {
  if (!day) return addMonths(now, DEFAULT_VALIDITY_MONTHS);
  let end: Date;
  try {
    end = endOfDayInZone(day, timeZone);
  } catch {
    end = new Date(Number.NaN);
  }
  if (Number.isNaN(end.getTime()) || end.getTime() <= now.getTime()) {
    throw new AppError("bad-request", "The sign-off must hold until a day after today.", [{ path: "validUntil", message: "Choose a day after today" }]);
  }
  if (end.getTime() > addMonths(now, MAX_VALIDITY_MONTHS).getTime()) {
    throw new AppError("bad-request", `A sign-off may hold for at most ${MAX_VALIDITY_MONTHS / 12} years.`, [{ path: "validUntil", message: `At most ${MAX_VALIDITY_MONTHS / 12} years from today` }]);
  }
  return end;
}
