// Where to go after signing in: only a path on this site (never another origin, never the sign-in pages again).

/** The given callback when it is a same-origin path, else "/". */
export function safeCallbackPath(raw: string | null | undefined): string {
  if (!raw) return "/";
  if (!raw.startsWith("/") || raw.startsWith("//") || raw.startsWith("/\\")) return "/";
  if (/[\u0000-\u001f\\]/.test(raw)) return "/";
  try {
    const url = new URL(raw, "http://benchwarden.invalid");
    if (url.origin !== "http://benchwarden.invalid") return "/";
    if (url.pathname.startsWith("/sign-in") || url.pathname.startsWith("/api/")) return "/";
    return `${url.pathname}${url.search}${url.hash}`;
  } catch {
    return "/";
  }
}
