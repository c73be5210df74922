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
