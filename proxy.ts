// Next.js proxy (the renamed middleware): sets the Content-Security-Policy of every response, with a
// fresh nonce per page for Next's own scripts. It only sets headers; authorization is lib/server's.
import { NextResponse, type NextRequest } from "next/server";

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

/** API answers are data, never documents: nothing may run, load or frame them. */
const API_POLICY = "default-src 'none'; frame-ancestors 'none'";

export function proxy(request: NextRequest): NextResponse {
  if (request.nextUrl.pathname.startsWith("/api/")) {
    const response = NextResponse.next();
    response.headers.set("content-security-policy", API_POLICY);
    return response;
  }
  const nonce = Buffer.from(crypto.randomUUID()).toString("base64");
  const policy = pagePolicy(nonce);
  // Next.js reads the policy from the request to put the nonce on the scripts it renders.
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set("x-nonce", nonce);
  requestHeaders.set("content-security-policy", policy);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set("content-security-policy", policy);
  return response;
}

export const config = {
  // Static files get their headers from next.config.mjs.
  matcher: ["/((?!_next/static|_next/image|favicon.ico).*)"],
};
