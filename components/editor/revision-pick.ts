// Which revision the working drawing is compared with: the newest one that left the draft state (sent for review,
// whatever happened to it since — approved, returned, withdrawn, expired or superseded).

export type RevisionLike = { number: number; state: string };

export function lastSentRevision<T extends RevisionLike>(revisions: readonly T[]): T | null {
  let best: T | null = null;
  for (const r of revisions) if (r.state !== "draft" && (best === null || r.number > best.number)) best = r;
  return best;
}
