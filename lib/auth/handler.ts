// The one door to better-auth over HTTP: only the endpoints the product uses (lib/auth/endpoints.ts),
// the client address decided here (never by the client), and sign-in attempts counted per account
// and per address in PostgreSQL before the password is checked.
import "server-only";
import { toNextJsHandler } from "better-auth/next-js";
import { NextResponse } from "next/server";
import { getDb } from "@/db";
import { AppError } from "@/lib/errors";
import { errorResponse, readBodyLimited } from "@/lib/server/api";
import { getAuth } from "./auth";
import { CLIENT_ADDRESS_HEADER, clientAddress } from "./client-address";
import { isOpenAuthEndpoint } from "./endpoints";
import { crossSiteRefusal } from "./origins";
import { safeCallbackPath } from "@/components/auth/safe-callback";
import { SSO_CALLBACK_PATH, SSO_PROVIDER_ID, ssoSettings } from "./sso";
import { reserveAttempt } from "./rate-limit";

const MAX_AUTH_BODY_BYTES = 16 * 1024;

function closed(): Response {
  return NextResponse.json({ error: { code: "not-found", message: "Benchwarden does not offer this sign-in endpoint.", fields: [] } }, { status: 404 });
}

function accountOf(body: Uint8Array): string | null {
  try {
    const parsed = JSON.parse(new TextDecoder().decode(body)) as { email?: unknown };
    return typeof parsed.email === "string" && parsed.email.trim() ? parsed.email : null;
  } catch {
    return null;
  }
}

export async function handleAuthRequest(request: Request): Promise<Response> {
  try {
    const url = new URL(request.url);
    const path = url.pathname.replace(/^\/api\/auth/, "") || "/";
    const method = request.method.toUpperCase();
    if (!isOpenAuthEndpoint(method, path)) return closed();
    const foreign = crossSiteRefusal(method, request.headers);
    if (foreign) throw new AppError("forbidden", foreign);

    const headers = new Headers(request.headers);
    headers.delete(CLIENT_ADDRESS_HEADER);
    const address = clientAddress(request.headers);
    if (address) headers.set(CLIENT_ADDRESS_HEADER, address);
    const body = method === "POST" ? await readBodyLimited(request, MAX_AUTH_BODY_BYTES) : undefined;
    const forwarded = new Request(request.url, { method, headers, body: body as BodyInit | undefined });
    const handler = toNextJsHandler(getAuth());

    if (path === "/sign-in/sso") return await startInstitutionSignIn(handler, request.url, headers, body);
    if (path === SSO_CALLBACK_PATH) return await finishInstitutionSignIn(handler, forwarded);
    if (path !== "/sign-in/email") return method === "POST" ? handler.POST(forwarded) : handler.GET(forwarded);

    const attempt = await reserveAttempt(getDb(), "sign-in", { account: body ? accountOf(body) : null, address });
    if (!attempt.allowed) throw new AppError("rate-limited", attempt.refusal ?? "Too many attempts; wait, then try again.");
    const response = await handler.POST(forwarded);
    // Only a wrong e-mail or password (401) tried a secret; anything else does not count.
    if (response.status !== 401) await attempt.release();
    return response;
  } catch (error) {
    return errorResponse(error);
  }
}

type Handler = ReturnType<typeof toNextJsHandler>;

/**
 * The start of institutional sign-in. The body the browser sent says only where to go afterwards;
 * the provider, the error page and the other fields are Benchwarden's own, so no caller can pick
 * another provider or send people to another site.
 */
async function startInstitutionSignIn(handler: Handler, url: string, headers: Headers, body: Uint8Array | undefined): Promise<Response> {
  if (!ssoSettings()) throw new AppError("not-found", "This installation has no institutional sign-in; sign in with your e-mail and password.");
  let requested: unknown = null;
  try {
    const parsed: unknown = body && body.length ? JSON.parse(new TextDecoder().decode(body)) : null;
    if (parsed && typeof parsed === "object" && "callbackURL" in parsed) requested = parsed.callbackURL;
  } catch {
    throw new AppError("bad-request", "The request body must be JSON, e.g. {\"callbackURL\": \"/\"}.", [{ path: "callbackURL", message: "send JSON" }]);
  }
  const callbackURL = safeCallbackPath(typeof requested === "string" ? requested : null);
  const own = new Headers(headers);
  own.set("content-type", "application/json");
  own.delete("content-length");
  const payload = JSON.stringify({ providerId: SSO_PROVIDER_ID, callbackURL, errorCallbackURL: "/sign-in" });
  const response = await handler.POST(new Request(url, { method: "POST", headers: own, body: payload }));
  if (response.status >= 500) throw new AppError("unavailable", "Your institution's sign-in service did not answer. Try again in a minute, or sign in with your e-mail and password.");
  return response;
}

/** The provider's redirect back: a session and the page asked for, or the sign-in page with the reason. */
async function finishInstitutionSignIn(handler: Handler, forwarded: Request): Promise<Response> {
  const back = (code: string) => NextResponse.redirect(new URL(`/sign-in?error=${encodeURIComponent(code)}`, forwarded.url), 303);
  if (!ssoSettings()) return back("failed");
  const response = await handler.GET(forwarded);
  if (response.status >= 500) return back("failed");
  // A callback without a valid state goes to the library's own error page; ours says it in words.
  const location = response.headers.get("location");
  if (location && new URL(location, forwarded.url).pathname === "/api/auth/error") return back("failed");
  return response;
}
