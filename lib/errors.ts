// Typed errors: a code, an HTTP status and a sentence a user can read. Turned into a response in
// one place (lib/server/api.ts); details for the log stay out of the response.
export type ErrorCode =
  | "bad-request"
  | "unauthenticated"
  | "forbidden"
  | "not-found"
  | "conflict"
  | "payload-too-large"
  | "rate-limited"
  | "unavailable"
  | "internal";

const STATUS: Record<ErrorCode, number> = {
  "bad-request": 400,
  unauthenticated: 401,
  forbidden: 403,
  "not-found": 404,
  conflict: 409,
  "payload-too-large": 400, // the API contract lists an oversized body among the 400s
  "rate-limited": 429,
  unavailable: 503, // a service of the institution's (its sign-in) did not answer
  internal: 500,
};

export type FieldProblem = { path: string; message: string };

export class AppError extends Error {
  readonly status: number;
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields: FieldProblem[] = [],
    /** Data the client needs beside the sentence, sent at the top level of the body (a 409 sends the server's `current` copy). */
    readonly extra: Record<string, unknown> = {},
    /** Only where one code has two answers: a body cut off while streaming is a 413, not a 400. */
    status?: number,
  ) {
    super(message);
    this.status = status ?? STATUS[code];
  }
}

export const notFound = (what: string) => new AppError("not-found", `${what} was not found, or you may not see it.`);
export const forbidden = (why: string) => new AppError("forbidden", why);
