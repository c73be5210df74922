// HTTP helpers for tests against the running server (scripts/test.ts sets APP_URL and MAIL_CATCHER_URL).
export const APP_URL = process.env.APP_URL ?? "http://127.0.0.1:3100";
export const CATCHER_URL = process.env.MAIL_CATCHER_URL ?? "http://127.0.0.1:1081";
export const DEMO_PASSWORD = "northmere-demo-2026";

export const DEMO = {
  researcher: "researcher@northmere.example.edu",
  officer: "officer@northmere.example.edu",
  technician: "technician@northmere.example.edu",
  auditor: "auditor@northmere.example.edu",
  admin: "admin@northmere.example.edu",
  student: "student@northmere.example.edu",
} as const;

export type DemoKey = keyof typeof DEMO;

let testClientCounter = 0;

/** A distinct documentation-range client address (RFC 5737) per sign-in, so the sign-in rate
 *  limit (per client address) counts each test's attempts on their own. */
function nextTestClientAddress(): string {
  testClientCounter += 1;
  return `198.51.100.${(process.pid + testClientCounter) % 250 + 1}`;
}

/** Signs in through better-auth's endpoint and returns the session cookie. */
export async function signIn(email: string, password = DEMO_PASSWORD, forwardedFor = nextTestClientAddress()): Promise<{ status: number; cookie: string }> {
  const res = await fetch(`${APP_URL}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: APP_URL, "x-forwarded-for": forwardedFor },
    body: JSON.stringify({ email, password }),
  });
  const cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
  return { status: res.status, cookie };
}

export async function call(method: string, path: string, cookie?: string, body?: unknown, extraHeaders: Record<string, string> = {}) {
  const res = await fetch(`${APP_URL}${path}`, {
    method,
    headers: { origin: APP_URL, ...(cookie ? { cookie } : {}), ...(body !== undefined ? { "content-type": "application/json" } : {}), ...extraHeaders },
    body: body === undefined ? undefined : typeof body === "string" ? body : JSON.stringify(body),
  });
  const text = await res.text();
  let json: unknown = null;
  try {
    json = JSON.parse(text);
  } catch {
    /* not JSON */
  }
  return { status: res.status, json: json as Record<string, unknown> | null, text };
}

export type CaughtMail = { id: string; to: string[]; subject: string; messageId: string; text: string; html: string; receivedAt: string };

/** Waits until the mail catcher holds a message for `to` matching `subject`. */
export async function waitForMail(to: string, subject: RegExp, timeoutMs = 15_000): Promise<CaughtMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await fetch(`${CATCHER_URL}/api/messages?to=${encodeURIComponent(to)}`);
    const messages = (await res.json()) as CaughtMail[];
    const found = messages.find((m) => subject.test(m.subject));
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no mail to ${to} matching ${subject} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 250));
  }
}
