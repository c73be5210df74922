// What a person types into a number field, read as a number: a minus sign or a decimal comma is accepted.

/** Text → number: undefined for an empty optional field; a sentence when it is not a number. */
export function parseNumber(text: string, optional: boolean): { value: number | undefined } | { error: string } {
  const t = text.trim().replace(/\u2212/g, "-").replace(",", ".");
  if (t === "") return optional ? { value: undefined } : { error: "Enter a number." };
  const n = Number(t);
  if (!Number.isFinite(n)) return { error: `“${text.trim()}” is not a number; write it like 2.5 or -25.` };
  return { value: n };
}
