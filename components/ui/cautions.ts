// The cautions as screens and the sheet show them: the eyewear caution is replaced by the one eyewear line (lib/format
// eyewearWords), so an OD is never worded two ways; references and texts in plain words.
import { plainText } from "@/lib/format";

type CautionLike = { id: string; title: string; text: string; reference: string };

export function displayedCautions<T extends CautionLike>(cautions: readonly T[]): T[] {
  return cautions
    .filter((c) => c.id !== "eyewear-od")
    .map((c) => ({ ...c, title: plainText(c.title), text: plainText(c.text), reference: plainText(c.reference) }));
}
