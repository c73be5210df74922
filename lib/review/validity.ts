// The review rules for how long a sign-off holds: the default and longest validity and the last
// moment of the chosen day. Pure; our own rules (the institution's officer may choose shorter).
import { AppError } from "@/lib/errors";

export const DEFAULT_VALIDITY_MONTHS = 12;
export const MAX_VALIDITY_MONTHS = 60;

export function addMonths(date: Date, months: number): Date {
  const d = new Date(date);
  d.setUTCMonth(d.getUTCMonth() + months);
  return d;
}

/** The end of the given day (UTC), checked to lie in the future and within the longest validity; 12 months from now when no day is given. */
export function validityEnd(now: Date, day: string | undefined): Date {
  if (!day) return addMonths(now, DEFAULT_VALIDITY_MONTHS);
  const end = new Date(`${day}T23:59:59.999Z`);
  if (Number.isNaN(end.getTime()) || end.getTime() <= now.getTime()) {
    throw new AppError("bad-request", "The sign-off must hold until a day after today.", [{ path: "validUntil", message: "Choose a day after today" }]);
  }
  if (end.getTime() > addMonths(now, MAX_VALIDITY_MONTHS).getTime()) {
    throw new AppError("bad-request", `A sign-off may hold for at most ${MAX_VALIDITY_MONTHS / 12} years.`, [{ path: "validUntil", message: `At most ${MAX_VALIDITY_MONTHS / 12} years from today` }]);
  }
  return end;
}
