// Structured logs (pino, JSON lines on stdout): one logger for the server, with the request id and the
// actor on every line written about a request. Secrets (cookies, passwords, tokens) are redacted.
import { randomUUID } from "node:crypto";
import pino from "pino";

export const log = pino({
  name: "benchwarden",
  level: process.env.LOG_LEVEL ?? (process.env.NODE_ENV === "test" ? "warn" : "info"),
  redact: { paths: ["*.cookie", "*.password", "*.token", "*.authorization", "req.headers.cookie", "req.headers.authorization"], censor: "[redacted]" },
});

/** The request's id: the one a proxy sent in x-request-id (if it looks like one), otherwise a new one. */
export function requestIdOf(request: Request): string {
  const sent = request.headers.get("x-request-id");
  return sent && /^[A-Za-z0-9._-]{8,100}$/.test(sent) ? sent : randomUUID();
}

/** The fields that say who asked for what, for a log line about one request. */
export function requestFields(request: Request, requestId: string, actor?: { userId: string; roles: readonly string[] } | null) {
  let path = request.url;
  try {
    path = new URL(request.url).pathname;
  } catch {
    // keep the raw value
  }
  return { requestId, method: request.method, path, actorId: actor?.userId ?? null, actorRoles: actor?.roles.join(",") ?? null };
}
