// Numbers for people: three significant figures, exponent only when it would be unreadable.
export function sig(v: number | null | undefined, digits = 3): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return "—";
  const a = Math.abs(v);
  if (a !== 0 && (a >= 1e5 || a < 1e-3)) return v.toExponential(digits - 1).replace("e", "×10^").replace("^+", "^");
  return String(Number(v.toPrecision(digits)));
}

export const REGIME_WORDS: Record<string, string> = {
  fraunhofer: "far field (Fraunhofer)",
  fresnel: "near field (Fresnel)",
  geometric: "geometric shadow",
};
