// Route-handler plumbing: refuse cross-site changes, read a bounded JSON body (counted while it
// streams), parse it with zod, resolve the actor, and turn every AppError into a JSON response with a
// sentence and field list. Never a stack trace.
import "server-only";
import { NextResponse } from "next/server";
import type { z } from "zod";
import { crossSiteRefusal } from "@/lib/auth/origins";
import type { Permission } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { findUnsafeText } from "@/lib/validation/text";
import { log, requestFields, requestIdOf } from "@/lib/log";
import { requireActor, type Actor } from "./authorize";

export const MAX_BODY_BYTES = 256 * 1024;

/** Where an error happened, for the log: the request and, once known, the actor. */
type ErrorContext = { request: Request; requestId: string; actor?: Actor | null };

export function errorResponse(error: unknown, context?: ErrorContext): NextResponse {
  if (error instanceof AppError) {
    return NextResponse.json(
      { ...error.extra, error: { code: error.code, message: error.message, fields: error.fields } },
      { status: error.status },
    );
  }
  const requestId = context?.requestId ?? null;
  log.error({ err: error, ...(context ? requestFields(context.request, context.requestId, context.actor) : {}) }, "unexpected error in a route handler");
  const reference = requestId ? ` If it keeps happening, give your administrator this reference: ${requestId}.` : "";
  return NextResponse.json(
    { error: { code: "internal", message: `Something went wrong on the server; nothing was changed. Please try again.${reference}`, fields: [] } },
    { status: 500, headers: requestId ? { "x-request-id": requestId } : undefined },
  );
}

/**
 * Reads at most maxBytes of the body. A declared Content-Length over the limit is refused before
 * reading (400, as the API has always answered); a body without one (chunked) is counted while it
 * streams and cut off at the limit with a 413, so a 60 MB upload never sits in memory.
 */
export async function readBodyLimited(request: Request, maxBytes: number, tooLarge: () => AppError = () => tooLargeError(maxBytes)): Promise<Uint8Array> {
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > maxBytes) throw tooLarge();
  if (!request.body) return new Uint8Array(0);
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel().catch(() => undefined);
      const refused = tooLarge();
      throw new AppError(refused.code, refused.message, refused.fields, refused.extra, 413);
    }
    chunks.push(value);
  }
  const body = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    body.set(c, at);
    at += c.byteLength;
  }
  return body;
}

export async function readJson(request: Request): Promise<unknown> {
  const text = new TextDecoder().decode(await readBodyLimited(request, MAX_BODY_BYTES));
  if (text.trim() === "") throw new AppError("bad-request", "The request body is empty; send a JSON document.");
  try {
    return JSON.parse(text);
  } catch {
    throw new AppError("bad-request", "The request body is not valid JSON.");
  }
}

function tooLargeError(maxBytes: number) {
  return new AppError("payload-too-large", `The request body is larger than ${maxBytes / 1024} kB.`);
}

/** Refuses text that cannot be stored (NUL, lone surrogates) anywhere in the value, naming each field. */
export function assertStorableText(value: unknown, what = "The request"): void {
  const fields = findUnsafeText(value);
  if (fields.length === 0) return;
  throw new AppError("bad-request", `${what} has ${fields.length === 1 ? "a field" : `${fields.length} fields`} with text that cannot be stored: ${fields[0].path} ${fields[0].message.replace(/^This text /, "")}.`, fields);
}

export function parseWith<S extends z.ZodType>(schema: S, value: unknown, what = "The request"): z.infer<S> {
  assertStorableText(value, what);
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  const fields = result.error.issues.map((i) => ({ path: i.path.map(String).join(".") || "(body)", message: i.message }));
  throw new AppError("bad-request", `${what} has ${fields.length === 1 ? "a problem" : `${fields.length} problems`}: ${fields[0]?.message ?? "invalid"}.`, fields);
}

/** A state-changing request from another site's page is refused before anything else runs. */
function refuseCrossSite(request: Request): void {
  const why = crossSiteRefusal(request.method, request.headers);
  if (why) throw new AppError("forbidden", why);
}

type Handler<P> = (input: { request: Request; actor: Actor; params: P }) => Promise<Response | unknown>;

/** Wraps a route handler: the permission is checked before the body runs. */
export function apiRoute<P = Record<string, string>>(permission: Permission | null, handler: Handler<P>) {
  return async (request: Request, context: { params: Promise<P> }): Promise<Response> => {
    const requestId = requestIdOf(request);
    let actor: Actor | null = null;
    try {
      refuseCrossSite(request);
      actor = await requireActor(permission ?? undefined, request.headers);
      const params = context?.params ? await context.params : ({} as P);
      const result = await handler({ request, actor, params });
      return result instanceof Response ? result : NextResponse.json(result);
    } catch (error) {
      return errorResponse(error, { request, requestId, actor });
    }
  };
}

/** A route anyone may call (the request itself carries its authority, e.g. an invitation token). */
export function publicRoute(handler: (input: { request: Request }) => Promise<Response | unknown>) {
  return async (request: Request): Promise<Response> => {
    try {
      refuseCrossSite(request);
      const result = await handler({ request });
      return result instanceof Response ? result : NextResponse.json(result);
    } catch (error) {
      return errorResponse(error, { request, requestId: requestIdOf(request) });
    }
  };
}

/**
 * A Content-Disposition header that carries any file name (RFC 6266 §4.3): an ASCII stand-in in
 * filename= for old clients and the exact name in filename*=UTF-8'' (RFC 5987 §3.2 percent-encoding).
 */
export function contentDisposition(kind: "inline" | "attachment", fileName: string): string {
  const fallback = fileName.replace(/[^\x20-\x7e]|["\\%]/g, "_").slice(0, 200) || "download";
  const wellFormed = fileName.replace(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g, "\uFFFD");
  const encoded = encodeURIComponent(wellFormed).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
  return `${kind}; filename="${fallback}"; filename*=UTF-8''${encoded}`;
}
