// Accounts end to end over HTTP and SMTP: an admin's invitation is e-mailed through the outbox
// and the mail catcher, accepted, signed in; a password reset goes the same way; wrong passwords
// get one sentence and repeated failures are rate-limited.
import { beforeAll, describe, expect, it } from "vitest";
import { APP_URL, call, DEMO, signIn, waitForMail } from "../support/http";

const email = `new-tech-${Date.now()}@northmere.example.edu`;
let adminCookie = "";

beforeAll(async () => {
  adminCookie = (await signIn(DEMO.admin)).cookie;
});

describe("invitation → account", () => {
  it("e-mails a link with a text and an HTML part, which sets the password", async () => {
    const labs = await call("GET", "/api/labs", adminCookie);
    const imaging = (labs.json!.labs as { id: string; name: string }[]).find((l) => l.name === "Wrenfield Imaging Lab")!;
    const invited = await call("POST", "/api/invitations", adminCookie, { email, name: "Nell Orrin", roles: ["technician"], labIds: [imaging.id] });
    expect(invited.status).toBe(201);

    const mail = await waitForMail(email, /invitation/i);
    expect(mail.text).toContain("Nell Orrin");
    expect(mail.html).toContain("<a href=");
    const token = mail.text.match(/accept-invitation\?token=([\w-]+)/)![1];

    const weak = await call("POST", "/api/invitations/accept", undefined, { token, password: "short" });
    expect(weak.status).toBe(400);
    expect((weak.json!.error as { fields: { path: string }[] }).fields[0].path).toBe("password");

    const accepted = await call("POST", "/api/invitations/accept", undefined, { token, password: "a-long-enough-secret" });
    expect(accepted.status).toBe(200);
    const again = await call("POST", "/api/invitations/accept", undefined, { token, password: "a-long-enough-secret" });
    expect(again.status).toBe(404);

    const session = await signIn(email, "a-long-enough-secret");
    expect(session.status).toBe(200);
    const benches = await call("GET", "/api/benches", session.cookie);
    expect(benches.status).toBe(200);
    expect((benches.json!.benches as { labName: string }[]).every((b) => b.labName === "Wrenfield Imaging Lab")).toBe(true);
  });

  it("refuses a second invitation for an address that has an account", async () => {
    const res = await call("POST", "/api/invitations", adminCookie, { email: DEMO.researcher, name: "Dup Licate", roles: ["researcher"] });
    expect(res.status).toBe(409);
  });
});

describe("password reset by e-mail", () => {
  it("sends a one-hour link that sets a new password", async () => {
    const requested = await call("POST", "/api/auth/request-password-reset", undefined, { email, redirectTo: "/reset-password" });
    expect(requested.status).toBe(200);
    const mail = await waitForMail(email, /reset/i);
    const link = mail.text.match(/https?:\/\/\S+/)![0];
    expect(link.startsWith(APP_URL)).toBe(true);
    const follow = await fetch(link, { redirect: "manual" });
    const location = follow.headers.get("location")!;
    const token = new URL(location, APP_URL).searchParams.get("token")!;
    expect(token).toBeTruthy();
    const reset = await call("POST", "/api/auth/reset-password", undefined, { newPassword: "another-long-secret", token });
    expect(reset.status).toBe(200);
    expect((await signIn(email, "a-long-enough-secret")).status).toBe(401);
    expect((await signIn(email, "another-long-secret")).status).toBe(200);
  });
});

describe("sign-in failures", () => {
  it("say the same thing for an unknown account and a wrong password", async () => {
    const unknown = await call("POST", "/api/auth/sign-in/email", undefined, { email: "nobody@northmere.example.edu", password: "whatever-long" }, { "x-forwarded-for": "203.0.113.7" });
    const wrong = await call("POST", "/api/auth/sign-in/email", undefined, { email: DEMO.researcher, password: "whatever-long" }, { "x-forwarded-for": "203.0.113.7" });
    expect(unknown.status).toBe(wrong.status);
    expect(unknown.json).toEqual(wrong.json);
  });

  it("are rate-limited after repeated attempts from one address", async () => {
    // Many accounts guessed from one address (a demo account would be locked by its own limit,
    // tests/integration/security-limits.test.ts covers that one).
    const statuses: number[] = [];
    for (let i = 0; i < 70; i++) statuses.push((await signIn(`nobody-${i}@northmere.example.edu`, "wrong-password-x", "203.0.113.99")).status);
    expect(statuses.slice(0, 5).every((s) => s === 401)).toBe(true);
    expect(statuses).toContain(429);
    // Another address is not affected.
    expect((await signIn(DEMO.researcher, undefined, "203.0.113.100")).status).toBe(200);
  });
});
