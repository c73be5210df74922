// The proxy (Next 16's middleware) only passes the page's own path on to server components, so a signed-out visitor
// sent to sign in comes back to the page they asked for (lib/server/page-guard.ts). It is never a security check.
import { NextResponse, type NextRequest } from "next/server";

export const PATH_HEADER = "x-benchwarden-path";

export function proxy(request: NextRequest) {
  const headers = new Headers(request.headers);
  headers.set(PATH_HEADER, `${request.nextUrl.pathname}${request.nextUrl.search}`);
  return NextResponse.next({ request: { headers } });
}

export const config = {
  // pages only: not the API, Next's own files or static assets
  matcher: ["/((?!api/|_next/|favicon|icon|manifest|.*\\.[a-z0-9]+$).*)"],
};
