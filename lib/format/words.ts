// The product's vocabulary: one name per thing on every screen, e-mail, CSV and sheet.

/** The three centre states of a pattern (the engine's "bright" | "dark" | "between"). */
export type CentreState = "bright" | "dark" | "between";

export const CENTRE_WORDS: Record<CentreState, string> = {
  bright: "bright centre",
  dark: "dark centre",
  between: "centre between bright and dark",
};

/** With a shape so the state never rests on colour alone. */
export const CENTRE_MARKS: Record<CentreState, string> = { bright: "●", dark: "○", between: "◐" };

export function centreWords(centre: string | null | undefined): string {
  if (!centre) return "—";
  return CENTRE_WORDS[centre as CentreState] ?? (centre === "unclear" ? "could not tell" : centre);
}

export function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** The technician's verb for the end of a build (the officer "signs off" a revision; the technician "completes" a build). */
export const BUILD_DONE = { verb: "Complete the build", done: "Build completed", past: "completed" } as const;

/** The one name for checking a printed sheet against the record. */
export const SHEET_CHECK = "Check a sheet";

/** The one name for the drawing's vertical scale of the beam radius. */
export const VERTICAL_EXAGGERATION = "Vertical exaggeration of the beam";

/** The hazard figures' names, the same on every screen and the sheet. */
export const HAZARD_LABELS = {
  hazardClass: "Laser class (estimated)",
  mpe: "MPE for the eye",
  nohd: "NOHD of the free beam",
  eyewear: "Eyewear (highest need on the bench)",
} as const;

/** A hazard distance in metres, or "none — below the MPE" when the beam never exceeds the MPE. */
export function nohdWords(nohdM: number | null | undefined, format: (v: number) => string): string {
  if (nohdM === null || nohdM === undefined || !Number.isFinite(nohdM)) return nohdM === Infinity ? "unbounded" : "—";
  if (nohdM <= 0) return "none — below the MPE";
  return `${format(nohdM)} m`;
}

/** Said wherever a formula takes 1/e values and the inputs were 1/e² (ANSI Z136.1 uses 1/e; datasheets give 1/e²). */
export const ONE_OVER_E_NOTE =
  "The beam diameter and divergence are entered as 1/e² values; where a formula uses 1/e values (the NOHD), they were converted (1/e = 1/e² ÷ √2).";

/** The sentence shown for any value not yet checked against the standard's own text. */
export const UNCHECKED = "not yet checked against the standard's text — confirm with your laser safety officer";

/**
 * Text from the engines as a lab user should read it: no file names in references and no "recalled"/"from memory"
 * (replaced by UNCHECKED). The engines are meant to say it this way already; this keeps screens safe if one does not.
 */
export function plainText(text: string): string {
  return text
    .replace(/\b(?:recalled )?from memory\b/gi, UNCHECKED)
    .replace(/,\s*recalled\)/gi, `; ${UNCHECKED})`)
    .replace(/\(recalled[^)]*\)/gi, `(${UNCHECKED})`)
    .replace(/\brecalled\b/gi, "not yet checked")
    .replace(/\bso its zone count and centre prediction are moot\b/g, "so its zone count and centre prediction do not apply")
    .replace(/\bare moot\b/g, "do not apply")
    .replace(/\bis moot\b/g, "does not apply")
    .replace(/\b(?:this|the) engine(?:'s)? estimates\b/gi, "Benchwarden estimates")
    .replace(/\bby this engine\b/gi, "by Benchwarden")
    .replace(/\bthe engine's\b/gi, "Benchwarden's")
    .replace(/\bPRODUCT\.md[,:;]?\s*/g, "")
    .replace(/\s*\(\s*\)/g, "")
    .replace(/\b[\w./-]+\.(?:tsx?|md|json|mjs)\b[,:;]?\s*/g, "")
    .replace(/\s{2,}/g, " ")
    .trim();
}

/** The trail's events in words (the audit action codes stay in the CSV beside them). */
export const ACTION_WORDS: Record<string, string> = {
  "bench-created": "Bench created",
  "draft-saved": "Draft saved",
  "draft-revision-started": "New draft revision started",
  "revision-made": "Revision made",
  "review-submitted": "Sent for review",
  "review-withdrawn": "Withdrawn from review",
  "review-approved": "Signed off",
  "review-changes-requested": "Changes asked",
  "review-rejected": "Turned down",
  "review-superseded": "Sign-off replaced by a newer one",
  "review-expired": "Sign-off expired",
  "review-comment": "Comment written",
  "sign-off-password-refused": "Signing refused: wrong password",
  "build-sheet-requested": "Build sheet requested",
  "build-sheet-exported": "Build sheet downloaded",
  "sheet-verified": "Sheet checked against its hash",
  "build-started": "Build started",
  "build-check-recorded": "Checklist line recorded",
  "build-observation-recorded": "Observation recorded",
  "build-upload-stored": "Photo or file uploaded",
  "build-photo-read": "Screen photo read",
  "build-signed-off": "Build completed",
  "desk-exported-trail": "Trail exported",
};

/** A revision's review state in words, the same as the state badges. */
export const REVIEW_STATE_WORDS: Record<string, string> = {
  draft: "Draft",
  submitted: "Waiting for review",
  approved: "Signed off",
  "changes-requested": "Changes asked",
  rejected: "Turned down",
  withdrawn: "Withdrawn",
  expired: "Sign-off expired",
  superseded: "Replaced by a newer sign-off",
};

/** A decision's outcome in words. */
export const OUTCOME_WORDS: Record<string, string> = { approved: "Signed off", "changes-requested": "Changes asked", rejected: "Turned down" };

/** A scope limit of the hazard engine as a lab user reads it (the "values not yet checked" entry in our words). */
export function limitationText(limitation: { id: string; text: string }): string {
  if (limitation.id === "from-memory") {
    return `Some table values of the standards are ${UNCHECKED}. The correction factors C_A, C_B, C_C, T1, T2 and the repetitive-pulse rules were checked against Directive 2006/25/EC Annex II.`;
  }
  return plainText(limitation.text);
}
