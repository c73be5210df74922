// Numbers for people through the one formatter (lib/format): three significant figures, superscript powers of ten.
import { formatNumber } from "@/lib/format";

export function sig(v: number | null | undefined, digits = 3): string {
  return formatNumber(v, { digits });
}

export const REGIME_WORDS: Record<string, string> = {
  fraunhofer: "far field (Fraunhofer)",
  fresnel: "near field (Fresnel)",
  geometric: "geometric shadow",
};
