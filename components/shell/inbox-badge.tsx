"use client";
// The count beside a navigation link: the number for the eye, "3 waiting" for screen readers (the link
// points at it with aria-describedby, so the link's own name stays "Reviews"); nothing at 0.
import type { InboxRole } from "@/lib/server/inbox";
import { inboxBadgeId } from "./inbox-ids";
import { useInbox, waitingWords } from "./use-inbox";

export function CountBadge({ count, words, id, testId, className = "" }: { count: number; words: string; id?: string; testId?: string; className?: string }) {
  return (
    <span id={id} className={`inline-flex min-w-6 items-center justify-center rounded-full bg-warn px-1.5 text-sm font-semibold leading-6 text-ink ${className}`} title={waitingWords(count)} data-testid={testId}>
      <span aria-hidden="true">{count > 99 ? "99+" : count}</span>
      <span className="sr-only">{words}</span>
    </span>
  );
}

export function InboxBadge({ role }: { role: InboxRole }) {
  const { data } = useInbox();
  const count = data?.sections.find((s) => s.role === role)?.count ?? 0;
  if (count === 0) return null;
  return <CountBadge count={count} words={waitingWords(count)} id={inboxBadgeId(role)} testId={`inbox-badge-${role}`} className="-ml-2 mr-1" />;
}
