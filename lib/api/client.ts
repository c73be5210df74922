// The browser's one fetch helper and the one query-key factory. Every error answer — a 409 conflict included —
// comes back as ApiError with the server's sentence, its field list and any data sent beside them (`extra`).
export type FieldProblem = { path: string; message: string };

export class ApiError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly fields: FieldProblem[],
    /** What the server sent beside the error (e.g. `current`, its copy, with a 409). */
    readonly extra: Record<string, unknown> = {},
  ) {
    super(message);
  }
}

type ErrorBody = { error?: { message?: string; fields?: FieldProblem[] } } & Record<string, unknown>;

/**
 * Calls a route and returns its JSON; any non-2xx answer throws ApiError (status 0 when the server cannot be
 * reached, with `offlineMessage`). A JSON body is sent with its content type; a FormData body as multipart.
 */
export async function apiFetch<T>(url: string, init?: RequestInit & { offlineMessage?: string; timeoutMs?: number }): Promise<T> {
  const { offlineMessage, timeoutMs, ...rest } = init ?? {};
  const isForm = typeof FormData !== "undefined" && rest.body instanceof FormData;
  // A request that never answers (a dead connection) counts as "cannot be reached" after timeoutMs, so the caller
  // can keep the change and try again rather than wait for ever.
  const signal = timeoutMs && !rest.signal ? AbortSignal.timeout(timeoutMs) : rest.signal;
  let response: Response;
  try {
    response = await fetch(url, { ...rest, signal, headers: isForm ? rest.headers : { "content-type": "application/json", ...rest.headers } });
  } catch (error) {
    if (error instanceof DOMException && error.name === "AbortError" && !(timeoutMs && signal?.aborted)) throw error;
    throw new ApiError(offlineMessage ?? "The server cannot be reached. Check the connection and try again.", 0, []);
  }
  const body = (await response.json().catch(() => null)) as ErrorBody | null;
  if (!response.ok) {
    const { error, ...extra } = body ?? {};
    throw new ApiError(error?.message ?? `The server answered ${response.status}.`, response.status, error?.fields ?? [], extra);
  }
  return body as T;
}

/**
 * The body a form is about to send, checked in the browser with the same shared schema the route uses (lib/api/
 * contracts): a problem comes back as the ApiError the server would have answered, with the same field names and
 * sentences, before anything is sent. Returns the body as the schema reads it.
 */
export function checkBeforeSending<T>(schema: { safeParse: (value: unknown) => { success: true; data: T } | { success: false; error: { issues: { path: PropertyKey[]; message: string }[] } } }, value: unknown): T {
  const parsed = schema.safeParse(value);
  if (parsed.success) return parsed.data;
  const fields = parsed.error.issues.map((i) => ({ path: i.path.map(String).join(".") || "(body)", message: i.message }));
  throw new ApiError(fields[0]?.message ?? "The form is not complete.", 400, fields);
}

/** The server's copy sent with a 409, when there is one. */
export function conflictCurrent<T>(error: unknown): T | null {
  return error instanceof ApiError && error.status === 409 && error.extra.current ? (error.extra.current as T) : null;
}

export function fieldError(error: unknown, path: string): string | undefined {
  return error instanceof ApiError ? error.fields.find((f) => f.path === path || f.path.startsWith(`${path}.`))?.message : undefined;
}

export const queryKeys = {
  people: () => ["people"] as const,
  labs: () => ["labs"] as const,
  benches: () => ["benches"] as const,
  bench: (id: string) => ["benches", id] as const,
  analysis: (hash: string) => ["analysis", hash] as const,
  revision: (revisionId: string) => ["revisions", revisionId] as const,
  inbox: () => ["inbox"] as const,
  draft: (benchId: string) => ["benches", benchId, "draft"] as const,
  profile: (hash: string, apertureId: string) => ["analysis", hash, "profile", apertureId] as const,
  build: (buildId: string) => ["builds", buildId] as const,
  builds: () => ["builds"] as const,
  sheet: (revisionId: string, paper: string) => ["sheets", revisionId, paper] as const,
};
