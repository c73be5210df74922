// The review rules: the states a bench revision passes through and the moves between them, as one
// table with the sentences a person reads when a move is refused. Pure data and functions; our own rules.
import type { DecisionOutcome, ReviewState } from "@/db/schema";

/** Every move a revision can make, and who makes it. */
export type ReviewMove = "submit" | "withdraw" | "approve" | "request-changes" | "reject" | "expire" | "supersede";

export type Transition = {
  /** The states the move starts from. */
  from: readonly ReviewState[];
  to: ReviewState;
  /** Who makes the move. */
  by: "author" | "officer" | "review clock";
  /** The audit action written for the move. */
  auditAction: string;
  /** Said after the state's own sentence when the move is refused. */
  refusal: string;
};

/** The review state machine. Any move not in this table is refused with a 409 and a sentence. */
export const TRANSITIONS: Record<ReviewMove, Transition> = {
  submit: {
    from: ["draft", "withdrawn"],
    to: "submitted",
    by: "author",
    auditAction: "review-submitted",
    refusal: "Only a draft or a withdrawn revision can be sent for review.",
  },
  withdraw: { from: ["submitted"], to: "withdrawn", by: "author", auditAction: "review-withdrawn", refusal: "Only a revision waiting for review can be withdrawn." },
  approve: { from: ["submitted"], to: "approved", by: "officer", auditAction: "review-approved", refusal: "Only a revision waiting for review can be decided." },
  "request-changes": {
    from: ["submitted"],
    to: "changes-requested",
    by: "officer",
    auditAction: "review-changes-requested",
    refusal: "Only a revision waiting for review can be decided.",
  },
  reject: { from: ["submitted"], to: "rejected", by: "officer", auditAction: "review-rejected", refusal: "Only a revision waiting for review can be decided." },
  // When the sign-off's last day has passed (the mail worker's round).
  expire: { from: ["approved"], to: "expired", by: "review clock", auditAction: "review-expired", refusal: "Only a signed-off revision can expire." },
  // When a newer revision of the same bench is signed off.
  supersede: { from: ["approved"], to: "superseded", by: "officer", auditAction: "review-superseded", refusal: "Only a signed-off revision can be replaced." },
};

/** The officer's three decisions: the outcome each records and the sentence kept with the signature. */
export const DECISIONS = {
  approve: { outcome: "approved", meaning: "Approved for operation as drawn, with the conditions listed." },
  "request-changes": { outcome: "changes-requested", meaning: "Not approved: changes are asked for before this bench may be operated." },
  reject: { outcome: "rejected", meaning: "Not approved: this bench must not be operated as drawn." },
} as const satisfies Record<"approve" | "request-changes" | "reject", { outcome: DecisionOutcome; meaning: string }>;

export type DecisionMove = keyof typeof DECISIONS;
export const SIGN_OFF_MEANING = DECISIONS.approve.meaning;

/** States in which a revision has been signed off at some time (it may be built, or was). */
export const ONCE_APPROVED: readonly ReviewState[] = ["approved", "expired", "superseded"];

/** A draft is private to its author: comments open once it has been sent for review. */
export const COMMENTS_OPEN = (state: ReviewState): boolean => state !== "draft";

const STATE_SENTENCES: Record<ReviewState, (n: string) => string> = {
  draft: (n) => `${n} is still a draft; it has not been sent for review.`,
  submitted: (n) => `${n} is already waiting for review.`,
  approved: (n) => `${n} has already been signed off.`,
  "changes-requested": (n) => `${n} has already been sent back with changes asked for; a changed drawing makes a new revision.`,
  rejected: (n) => `${n} has already been turned down; a changed drawing makes a new revision.`,
  withdrawn: (n) => `${n} was withdrawn by its author.`,
  expired: (n) => `${n} had a sign-off that has expired.`,
  superseded: (n) => `${n} had a sign-off that a newer revision has replaced.`,
};

/** Where a revision stands, in a sentence. */
export function stateSentence(r: { number: number; state: ReviewState }): string {
  return STATE_SENTENCES[r.state](`Revision ${r.number}`);
}

export function canMove(move: ReviewMove, state: ReviewState): boolean {
  return TRANSITIONS[move].from.includes(state);
}

/** Why the move is refused from the revision's state, or null when the table allows it. */
export function refusal(move: ReviewMove, r: { number: number; state: ReviewState }): string | null {
  return canMove(move, r.state) ? null : `${stateSentence(r)} ${TRANSITIONS[move].refusal}`;
}

