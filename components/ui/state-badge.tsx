import type { ReviewState } from "@/db/schema";

// Each state has a word and a shape, never colour alone.
const LOOK: Record<ReviewState, { label: string; shape: string; className: string }> = {
  draft: { label: "Draft", shape: "○", className: "border-line text-muted" },
  submitted: { label: "Waiting for review", shape: "◔", className: "border-warn text-warn" },
  approved: { label: "Signed off", shape: "●", className: "border-ok text-ok" },
  "changes-requested": { label: "Changes asked", shape: "◑", className: "border-warn text-warn" },
  rejected: { label: "Turned down", shape: "✕", className: "border-danger text-danger" },
  withdrawn: { label: "Withdrawn", shape: "↩", className: "border-line text-muted" },
  expired: { label: "Sign-off expired", shape: "⊘", className: "border-danger text-danger" },
  superseded: { label: "Replaced by a newer sign-off", shape: "⇢", className: "border-line text-muted" },
};

export function StateBadge({ state }: { state: ReviewState }) {
  const look = LOOK[state];
  return (
    <span className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-sm ${look.className}`}>
      <span aria-hidden="true">{look.shape}</span>
      {look.label}
    </span>
  );
}
