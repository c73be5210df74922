// Browser-side fetch helpers and the one query-key factory. Errors come back as ApiError with the
// server's sentence and field list, ready to show beside the fields.
export type FieldProblem = { path: string; message: string };

export class ApiError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly fields: FieldProblem[],
  ) {
    super(message);
  }
}

export async function apiFetch<T>(url: string, init?: RequestInit): Promise<T> {
  let response: Response;
  try {
    response = await fetch(url, { ...init, headers: { "content-type": "application/json", ...init?.headers } });
  } catch {
    throw new ApiError("The server cannot be reached. Check the connection and try again.", 0, []);
  }
  const body = (await response.json().catch(() => null)) as { error?: { message: string; fields?: FieldProblem[] } } | null;
  if (!response.ok) throw new ApiError(body?.error?.message ?? `The server answered ${response.status}.`, response.status, body?.error?.fields ?? []);
  return body as T;
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
};
