// Plain sentences naming the laser safety standard a lab's hazard figures follow (the lab's choice, and what the
// hazard engine reports it used), shared by the editor, review screen, build checklist and build sheet.

export type StandardName = "ANSI Z136.1-2014" | "IEC 60825-1:2014";

/** The standard the hazard engine says it applied, when its answer names one. */
export function engineStandard(safety: unknown): string | null {
  if (!safety || typeof safety !== "object") return null;
  const s = (safety as { standard?: unknown }).standard;
  if (typeof s === "string") return s;
  if (s && typeof s === "object") {
    const named = (s as { name?: unknown; id?: unknown }).name ?? (s as { id?: unknown }).id;
    if (typeof named === "string") return named;
  }
  return null;
}

/** One sentence for screens and the sheet: which standard the figures follow, and the lab's choice where it differs. */
export function standardSentence(labStandard: StandardName, safety: unknown): string {
  const used = engineStandard(safety);
  const classNote = "the laser class always from IEC 60825-1:2014's class limits";
  if (used && used === labStandard) return `MPE, hazard distance and OD follow ${used}, the standard this lab chose (${classNote}).`;
  if (used) return `MPE, hazard distance and OD here follow ${used}; this lab chose ${labStandard} — ask the laser safety officer which applies (${classNote}).`;
  if (labStandard === "ANSI Z136.1-2014") return `MPE, hazard distance and OD follow ANSI Z136.1-2014, the standard this lab chose (${classNote}).`;
  return "This lab chose IEC 60825-1:2014. The laser class follows it; MPE, hazard distance and OD shown here follow ANSI Z136.1-2014 — confirm with your laser safety officer where the two differ.";
}

/** The engine's "where the other standard differs" notes about the laser, when its answer carries them. */
export function otherStandardNotes(safety: unknown): string[] {
  if (!safety || typeof safety !== "object") return [];
  const laser = (safety as { laser?: { notes?: unknown } }).laser;
  const notes = Array.isArray(laser?.notes) ? laser.notes : [];
  return notes.filter((n): n is string => typeof n === "string" && n.startsWith("Where the other standard differs"));
}
