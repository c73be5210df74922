// "Never a 500": every API route, every method, with junk ids and broken bodies, as several roles —
// the app's routes and the authentication library's endpoints alike. Whatever the request, the answer
// is a 4xx with a JSON sentence (or a 2xx), never a server error; the library's unused endpoints are
// closed (404) for every role.
import { readdirSync, statSync } from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { CLOSED_AUTH_PATHS, OPEN_AUTH_ENDPOINTS } from "../../lib/auth/endpoints";
import { call, DEMO, signIn } from "../support/http";

const apiDir = path.resolve(import.meta.dirname, "../../app/api");

function routes(dir: string, prefix = "/api"): string[] {
  const found: string[] = [];
  for (const entry of readdirSync(dir)) {
    const full = path.join(dir, entry);
    if (statSync(full).isDirectory()) found.push(...routes(full, `${prefix}/${entry}`));
    else if (entry === "route.ts") found.push(prefix);
  }
  return found;
}

// better-auth's own endpoints are its business; the health route has nothing to break.
const ROUTES = routes(apiDir).filter((r) => !r.startsWith("/api/auth") && r !== "/api/health");
const IDS = ["not-an-id", "00000000-0000-4000-8000-000000000000", "%2E%2E%2Fetc"];
const BODIES = ["", "{", "[]", "null", "{}", '{"a":1e999,"document":{"version":1,"elements":"x"}}', '{"title":"a\\u0000b","name":"\\ud800","document":{"version":1,"title":"\\udfff","elements":[]}}'];
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"];

const cookies: Record<string, string> = {};
beforeAll(async () => {
  for (const who of ["researcher", "officer", "admin"] as const) cookies[who] = (await signIn(DEMO[who])).cookie;
});

describe("no API route answers 500", () => {
  it(`found the routes (${ROUTES.length})`, () => expect(ROUTES.length).toBeGreaterThan(30));

  for (const route of ROUTES) {
    it(`${route}`, async () => {
      const failures: string[] = [];
      for (const id of IDS) {
        const url = route.replace(/\[[^\]]+\]/g, id);
        for (const who of Object.keys(cookies)) {
          for (const method of METHODS) {
            const bodies = method === "GET" || method === "DELETE" ? [undefined] : BODIES;
            for (const body of bodies) {
              const res = await call(method, url, cookies[who], body);
              if (res.status >= 500) failures.push(`${who} ${method} ${url} ${JSON.stringify(body)} → ${res.status} ${res.text.slice(0, 120)}`);
              if (res.status >= 400 && res.status !== 404 && res.status !== 405 && res.json) {
                const message = (res.json.error as { message?: string } | undefined)?.message ?? (res.json as { message?: string }).message;
                if (!message) failures.push(`${who} ${method} ${url} → ${res.status} without a sentence: ${res.text.slice(0, 120)}`);
              }
            }
          }
        }
      }
      expect(failures).toEqual([]);
    }, 120_000);
  }
});

// The authentication library's endpoints: the ones the product uses, the ones it closed, and a few
// guesses. Sent from a sweep-only client address (the harness trusts one proxy hop), so the sign-in
// limits of other tests' addresses are untouched. Sign-out is sent without a session only.
const AUTH_PATHS = [
  ...OPEN_AUTH_ENDPOINTS.map((e) => (typeof e.path === "string" ? e.path : "/reset-password/not-a-real-token")),
  ...CLOSED_AUTH_PATHS,
  "/callback/github",
  "/admin",
  "/../benches",
  "/%00",
];
const SWEEP_ADDRESS = { "x-forwarded-for": "192.0.2.250" };

describe("no authentication endpoint answers 500, and the unused ones are closed", () => {
  for (const authPath of AUTH_PATHS) {
    it(`/api/auth${authPath}`, async () => {
      const failures: string[] = [];
      const open = OPEN_AUTH_ENDPOINTS.some((e) => (typeof e.path === "string" ? e.path === authPath : e.path.test(authPath)));
      for (const who of [...Object.keys(cookies), "nobody"]) {
        if (authPath === "/sign-out" && who !== "nobody") continue;
        for (const method of ["GET", "POST"]) {
          const bodies = method === "GET" ? [undefined] : BODIES.slice(0, 5);
          for (const body of bodies) {
            const res = await call(method, `/api/auth${authPath}`, cookies[who], body, SWEEP_ADDRESS);
            if (res.status >= 500) failures.push(`${who} ${method} ${authPath} ${JSON.stringify(body)} → ${res.status} ${res.text.slice(0, 120)}`);
            if (!open && CLOSED_AUTH_PATHS.includes(authPath) && res.status !== 404) failures.push(`${who} ${method} ${authPath} → ${res.status}, expected 404 (closed)`);
          }
        }
      }
      expect(failures).toEqual([]);
    }, 120_000);
  }
});
