// Route-handler plumbing: read a bounded JSON body, parse it with zod, resolve the actor, and turn
// every AppError into a JSON response with a sentence and field list. Never a stack trace.
import "server-only";
import { NextResponse } from "next/server";
import type { z } from "zod";
import type { Permission } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
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

export async function readJson(request: Request): Promise<unknown> {
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > MAX_BODY_BYTES) throw tooLarge();
  const buffer = await request.arrayBuffer();
  if (buffer.byteLength > MAX_BODY_BYTES) throw tooLarge();
  const text = new TextDecoder().decode(buffer);
  if (text.trim() === "") throw new AppError("bad-request", "The request body is empty; send a JSON document.");
  try {
    return JSON.parse(text);
  } catch {
    throw new AppError("bad-request", "The request body is not valid JSON.");
  }
}

function tooLarge() {
  return new AppError("payload-too-large", `The request body is larger than ${MAX_BODY_BYTES / 1024} kB.`);
}

export function parseWith<S extends z.ZodType>(schema: S, value: unknown, what = "The request"): z.infer<S> {
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  const fields = result.error.issues.map((i) => ({ path: i.path.map(String).join(".") || "(body)", message: i.message }));
  throw new AppError("bad-request", `${what} has ${fields.length === 1 ? "a problem" : `${fields.length} problems`}: ${fields[0]?.message ?? "invalid"}.`, fields);
}

type Handler<P> = (input: { request: Request; actor: Actor; params: P }) => Promise<Response | unknown>;

/** Wraps a route handler: the permission is checked before the body runs. */
export function apiRoute<P = Record<string, string>>(permission: Permission | null, handler: Handler<P>) {
  return async (request: Request, context: { params: Promise<P> }): Promise<Response> => {
    const requestId = requestIdOf(request);
    let actor: Actor | null = null;
    try {
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
      const result = await handler({ request });
      return result instanceof Response ? result : NextResponse.json(result);
    } catch (error) {
      return errorResponse(error, { request, requestId: requestIdOf(request) });
    }
  };
}
