// The one way every screen, e-mail, checklist and sheet words an eyewear optical density: the computed need shown as
// such ("computed need OD 1.33", rounded up so it is never below the need) and the eyewear to wear as a whole OD rounded up.
// OD = log10(E/MPE) as lib/safety computes it; eyewear is marked in whole ODs, so the need is rounded up (common practice).

/** The computed need, rounded up to two decimals (never below the need). */
export function computedOdText(odRequired: number): string {
  const up = Math.ceil(odRequired * 100 - 1e-9) / 100;
  return up.toFixed(2);
}

/** The whole OD to wear: the need rounded up to the next whole number; 0 when the direct beam is below the MPE. */
export function wholeOdToWear(odRequired: number): number {
  if (!(odRequired > 0)) return 0;
  return Math.ceil(odRequired - 1e-12);
}

export type EyewearWords = {
  /** "Wear eyewear of OD 2 or more at 532 nm" or "No eyewear needed for the direct beam". */
  wear: string;
  /** "computed need OD 1.33" or "computed need OD 0 — the direct beam is below the MPE". */
  need: string;
  /** The two together, as one line. */
  line: string;
  wholeOd: number;
  /** What to check on each pair (empty when no eyewear is needed). */
  check: string;
};

export const NO_EYEWEAR = "No eyewear needed for the direct beam";

/** One rule for every place an eyewear OD appears. */
export function eyewearWords(odRequired: number | null | undefined, wavelengthNm?: number | null): EyewearWords {
  const od = odRequired ?? 0;
  const whole = wholeOdToWear(od);
  const at = wavelengthNm ? ` at ${wavelengthNm} nm` : "";
  if (whole === 0) {
    const need = "computed need OD 0 — the direct beam is below the MPE";
    return { wear: NO_EYEWEAR, need, line: `${NO_EYEWEAR} (${need})`, wholeOd: 0, check: "" };
  }
  const wear = `Wear eyewear of OD ${whole} or more${at}`;
  const need = `computed need OD ${computedOdText(od)}`;
  const check = `Check the marking on each pair${wavelengthNm ? ` for ${wavelengthNm} nm` : ""}; eyewear made for another laser may offer no protection at all.`;
  return { wear, need, line: `${wear} (${need})`, wholeOd: whole, check };
}
