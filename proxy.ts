// Next.js proxy (the renamed middleware): sets the Content-Security-Policy of every page, with a fresh
// nonce per request for Next's own scripts, and passes the page's own path on to server components so
// a signed-out visitor sent to sign in comes back to it (lib/server/page-guard.ts). It only sets
// headers; it is never a security check.
import { NextResponse, type NextRequest } from "next/server";

export const PATH_HEADER = "x-benchwarden-path";

function pagePolicy(nonce: string): string {
  const dev = process.env.NODE_ENV !== "production";
  return [
    "default-src 'self'",
    // Next.js puts the nonce on its own inline and chunk scripts; 'strict-dynamic' lets those load the rest.
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ""}`,
    // React renders style attributes (the editor's canvas, the print sheet); styles cannot run code.
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' blob: data:",
    "font-src 'self' data:",
    `connect-src 'self'${dev ? " ws: wss:" : ""}`,
    "worker-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

export function proxy(request: NextRequest): NextResponse {
  const nonce = Buffer.from(crypto.randomUUID()).toString("base64");
  const policy = pagePolicy(nonce);
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set(PATH_HEADER, `${request.nextUrl.pathname}${request.nextUrl.search}`);
  // Next.js reads the policy from the request to put the nonce on the scripts it renders.
  requestHeaders.set("x-nonce", nonce);
  requestHeaders.set("content-security-policy", policy);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set("content-security-policy", policy);
  return response;
}

export const config = {
  // Pages (and public files) only. API routes and Next's own files get their fixed policy from
  // next.config.mjs: a proxy in front of an API route would make Next.js buffer (and past 10 MB cut)
  // the request body, which the routes instead count while it streams (lib/server/api.ts).
  matcher: ["/((?!api/|_next/|favicon.ico).*)"],
};
