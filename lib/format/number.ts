// Numbers for people, one formatter for every screen, e-mail and sheet: significant figures through Intl,
// thousands separators, and powers of ten written with superscript exponents (3.2 × 10⁻⁴) when a plain figure would be unreadable.

const SUPERSCRIPT: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹" };

/** The language of every figure: British English (the demo institution's), thousands separated by commas. */
export const NUMBER_LOCALE = "en-GB";

export type NumberOptions = {
  /** Significant figures, 3 unless said. */
  digits?: number;
  /** Below this magnitude (and at or above `large`) the figure is written with a power of ten. */
  small?: number;
  large?: number;
};

function superscript(exponent: number): string {
  return String(exponent)
    .split("")
    .map((c) => SUPERSCRIPT[c] ?? c)
    .join("");
}

/** A figure with `digits` significant figures; "—" for a missing value. */
export function formatNumber(value: number | null | undefined, options: NumberOptions = {}): string {
  if (value === null || value === undefined || Number.isNaN(value)) return "—";
  if (!Number.isFinite(value)) return value > 0 ? "unbounded" : "—";
  const digits = options.digits ?? 3;
  if (value === 0) return "0";
  const abs = Math.abs(value);
  const small = options.small ?? 1e-3;
  const large = options.large ?? 1e7;
  if (abs < small || abs >= large) {
    const [mantissa, exp] = value.toExponential(digits - 1).split("e");
    const m = Number(mantissa);
    const mText = new Intl.NumberFormat(NUMBER_LOCALE, { maximumSignificantDigits: digits }).format(m);
    return `${mText} × 10${superscript(Number(exp))}`;
  }
  return new Intl.NumberFormat(NUMBER_LOCALE, { maximumSignificantDigits: digits }).format(value);
}

/** A whole count with thousands separators (1,234). */
export function formatCount(value: number): string {
  return new Intl.NumberFormat(NUMBER_LOCALE, { maximumFractionDigits: 0 }).format(value);
}

/** A length, position or other figure with a fixed number of decimals at most (positions on the bench: 0.1 mm). */
export function formatFixed(value: number | null | undefined, maxDecimals: number): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "—";
  return new Intl.NumberFormat(NUMBER_LOCALE, { maximumFractionDigits: maxDecimals }).format(value);
}

/** A percentage of a fraction (0.25 → "25 %"). */
export function formatPercent(fraction: number | null | undefined, digits = 3): string {
  if (fraction === null || fraction === undefined || !Number.isFinite(fraction)) return "—";
  return `${formatNumber(fraction * 100, { digits, small: 1e-4 })} %`;
}
