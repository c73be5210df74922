// The client's network address, for rate limits and the trail. X-Forwarded-For counts only when
// TRUSTED_PROXY_COUNT says how many proxies of ours append to it; otherwise the socket's peer.
import { env } from "@/lib/env";

/**
 * The header instrumentation.ts (lib/auth/peer-address.ts) stamps on every incoming request with the socket's peer
 * address, overwriting whatever a client sent under that name. Next.js route handlers see no socket,
 * and Next itself only fills X-Forwarded-For with the peer when the client sent none.
 */
export const PEER_ADDRESS_HEADER = "x-benchwarden-peer-address";

/** The header better-auth reads the client address from: set by lib/auth/handler.ts, a client's own dropped. */
export const CLIENT_ADDRESS_HEADER = "x-benchwarden-client-address";

function normalise(address: string | null | undefined): string | null {
  const a = address?.trim();
  if (!a) return null;
  // IPv4 clients of a dual-stack socket appear as ::ffff:a.b.c.d.
  return (a.startsWith("::ffff:") && a.includes(".") ? a.slice(7) : a).slice(0, 64);
}

/** The client address for a request's headers, or null when it cannot be known. */
export function clientAddress(headers: Headers, trustedProxyCount = env().TRUSTED_PROXY_COUNT): string | null {
  if (trustedProxyCount > 0) {
    const hops = (headers.get("x-forwarded-for") ?? "")
      .split(",")
      .map((h) => h.trim())
      .filter(Boolean);
    if (hops.length > 0) return normalise(hops[Math.max(0, hops.length - trustedProxyCount)]);
  }
  return normalise(headers.get(PEER_ADDRESS_HEADER));
}
