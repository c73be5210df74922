// The review state machine as data: every state is reachable or a start, every move's sentence reads right.
import { describe, expect, it } from "vitest";
import { REVIEW_STATES, DECISION_OUTCOMES } from "@/db/schema";
import { canMove, COMMENTS_OPEN, DECISIONS, ONCE_APPROVED, refusal, stateSentence, TRANSITIONS, type ReviewMove } from "@/lib/review/transitions";
import { addMonths, MAX_VALIDITY_MONTHS, validityEnd } from "@/lib/review/validity";
import { AppError } from "@/lib/errors";

const MOVES = Object.keys(TRANSITIONS) as ReviewMove[];

describe("the review transition table", () => {
  it("uses only known states, and every state but draft is the target of some move", () => {
    for (const move of MOVES) {
      for (const s of TRANSITIONS[move].from) expect(REVIEW_STATES).toContain(s);
      expect(REVIEW_STATES).toContain(TRANSITIONS[move].to);
    }
    const targets = new Set(MOVES.map((m) => TRANSITIONS[m].to));
    expect(REVIEW_STATES.filter((s) => !targets.has(s))).toEqual(["draft"]);
  });

  it("allows exactly the moves the workflow describes", () => {
    const allowed = (state: (typeof REVIEW_STATES)[number]) => MOVES.filter((m) => canMove(m, state)).sort();
    expect(allowed("draft")).toEqual(["submit"]);
    expect(allowed("withdrawn")).toEqual(["submit"]);
    expect(allowed("submitted")).toEqual(["approve", "reject", "request-changes", "withdraw"]);
    expect(allowed("approved")).toEqual(["expire", "supersede"]);
    for (const end of ["changes-requested", "rejected", "expired", "superseded"] as const) expect(allowed(end)).toEqual([]);
  });

  it("explains a refused move with the state's sentence and the move's rule", () => {
    expect(refusal("submit", { number: 3, state: "draft" })).toBeNull();
    expect(refusal("withdraw", { number: 3, state: "approved" })).toBe("Revision 3 has already been signed off. Only a revision waiting for review can be withdrawn.");
    expect(refusal("approve", { number: 2, state: "rejected" })).toMatch(/^Revision 2 has already been turned down; .* Only a revision waiting for review can be decided\.$/);
    for (const state of REVIEW_STATES) expect(stateSentence({ number: 7, state })).toMatch(/^Revision 7 /);
  });

  it("records each decision as a known outcome with its own meaning", () => {
    const outcomes = Object.values(DECISIONS).map((d) => d.outcome);
    expect([...outcomes].sort()).toEqual([...DECISION_OUTCOMES].sort());
    for (const [move, d] of Object.entries(DECISIONS)) expect(TRANSITIONS[move as ReviewMove].to).toBe(d.outcome);
    expect(new Set(Object.values(DECISIONS).map((d) => d.meaning)).size).toBe(3);
  });

  it("counts expired and replaced sign-offs as once approved, and keeps comments closed on drafts", () => {
    expect([...ONCE_APPROVED].sort()).toEqual(["approved", "expired", "superseded"]);
    expect(COMMENTS_OPEN("draft")).toBe(false);
    expect(COMMENTS_OPEN("submitted")).toBe(true);
  });
});

describe("how long a sign-off holds", () => {
  const now = new Date("2026-03-15T10:00:00Z");
  it("defaults to twelve months and ends a chosen day at its last millisecond in the lab's time zone", () => {
    expect(validityEnd(now, undefined).toISOString()).toBe("2027-03-15T10:00:00.000Z");
    // Europe/London keeps summer time (UTC+1) on 30 June: the day ends at 22:59:59.999 UTC (IANA time zone database)
    expect(validityEnd(now, "2026-06-30").toISOString()).toBe("2026-06-30T22:59:59.999Z");
    expect(validityEnd(now, "2026-06-30", "UTC").toISOString()).toBe("2026-06-30T23:59:59.999Z");
  });
  it("refuses today, the past and more than the longest validity, naming the field", () => {
    for (const day of ["2026-03-14", "2020-01-01"]) {
      const error = (() => {
        try {
          validityEnd(now, day);
        } catch (e) {
          return e;
        }
      })();
      expect(error).toBeInstanceOf(AppError);
      expect((error as AppError).fields[0]?.path).toBe("validUntil");
    }
    const last = addMonths(now, MAX_VALIDITY_MONTHS).toISOString().slice(0, 10);
    expect(() => validityEnd(now, last)).toThrow(/at most 5 years/);
  });
});
