"use client";
// The "waiting for you" counts: one query shared by every badge and the menu, polled every 30 s and on
// window focus. The key comes from the one factory in lib/api/client.ts.
import { useQuery } from "@tanstack/react-query";
import { apiFetch, queryKeys } from "@/lib/api/client";
import type { Inbox } from "@/lib/server/inbox";

export const INBOX_POLL_MS = 30_000;
export const inboxQueryKey = queryKeys.inbox();

export function inboxQuery() {
  return {
    queryKey: inboxQueryKey,
    queryFn: () => apiFetch<Inbox>("/api/inbox"),
    refetchInterval: INBOX_POLL_MS,
    refetchOnWindowFocus: "always" as const,
    staleTime: 5_000,
  };
}

export function useInbox() {
  return useQuery(inboxQuery());
}

/** "1 waiting", "3 waiting". */
export const waitingWords = (count: number) => `${count} waiting`;
