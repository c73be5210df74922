// The origins the app answers as: APP_URL, and on a loopback APP_URL its 127.0.0.1/localhost twins.
// better-auth's trustedOrigins and apiRoute's Origin check both read this one list.
import { env } from "@/lib/env";

const LOOPBACK = new Set(["127.0.0.1", "localhost", "[::1]"]);

export function appOrigins(): string[] {
  const url = new URL(env().APP_URL);
  const origins = [url.origin];
  if (LOOPBACK.has(url.hostname)) {
    for (const host of LOOPBACK) origins.push(`${url.protocol}//${host}${url.port ? `:${url.port}` : ""}`);
  }
  return [...new Set(origins)];
}

const STATE_CHANGING = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/**
 * Why a state-changing request must be refused as cross-site, or null when it may go on: a foreign
 * or "null" Origin, or (a browser that sent no Origin) Sec-Fetch-Site saying another site sent it.
 * Requests with neither header do not come from a browser page and carry no ambient authority risk.
 */
export function crossSiteRefusal(method: string, headers: Headers): string | null {
  if (!STATE_CHANGING.has(method.toUpperCase())) return null;
  const origin = headers.get("origin");
  if (origin !== null) return appOrigins().includes(origin) ? null : `The request came from another site (${origin.slice(0, 80)}); Benchwarden accepts changes only from its own pages.`;
  const site = headers.get("sec-fetch-site");
  if (site === "cross-site" || site === "same-site") return "The request came from another site; Benchwarden accepts changes only from its own pages.";
  return null;
}
