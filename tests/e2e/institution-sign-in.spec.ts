// Sign-in through the institution's OpenID Connect provider: `npm test` runs the local stand-in
// (scripts/identity-provider.ts, oidc-provider) and points the app at it. A person with an account
// lands on their own home with the roles and labs an administrator gave them; someone the
// institution knows but Benchwarden does not, or whose address the institution did not confirm, is
// sent back to the sign-in page with a sentence saying why, and no session.
import { expect, test, type Page } from "@playwright/test";
import pg from "pg";
import { DEMO_LAB_NAME } from "../support/demo";
import { call, DEMO, signIn } from "../support/http";
import { createAccount, databaseUrl, labIdByName } from "../support/review-fixtures";

const APP_URL = process.env.APP_URL ?? "http://127.0.0.1:3100";
const ISSUER = process.env.SSO_ISSUER ?? "http://127.0.0.1:3190";
const SECOND_APP_URL = process.env.SECOND_APP_URL;
const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

async function throughInstitution(page: Page, login: string) {
  await page.goto("/sign-in");
  await page.waitForLoadState("networkidle");
  await page.getByRole("button", { name: "Continue with Northmere University login" }).click();
  // The provider's own sign-in page (another origin): any password, the address is the login.
  await expect(page).toHaveURL(new RegExp(`^${escape(ISSUER)}/`), { timeout: 20_000 });
  await signInAtProvider(page, login);
}

async function signInAtProvider(page: Page, login: string) {
  await page.locator('input[name="login"]').fill(login);
  await page.locator('input[name="password"]').fill("anything");
  await page.locator('button[type="submit"]').click();
}

test("a researcher signs in through the institution and lands as themselves, in their lab", async ({ page }) => {
  await throughInstitution(page, "Researcher@northmere.example.edu");
  await expect(page).toHaveURL(`${APP_URL}/`);
  await expect(page.getByTestId("home-researcher")).toBeVisible();
  await expect(page.getByText("Dr. Alba Quennell").first()).toBeVisible();
  const nav = page.getByRole("navigation", { name: "Main" });
  await expect(nav.getByRole("link", { name: "Benches", exact: true })).toBeVisible();
  await expect(nav.getByRole("link", { name: "People", exact: true })).toHaveCount(0);
  // The session is the researcher's: the benches they may see are their lab's only (from the
  // database, not the provider), and the Spectroscopy lab's are not among them.
  const listed = (await (await page.request.get("/api/benches")).json()) as { benches: { labName: string }[] };
  expect(listed.benches.length).toBeGreaterThan(0);
  expect(new Set(listed.benches.map((b) => b.labName))).toEqual(new Set([DEMO_LAB_NAME]));
  await page.screenshot({ path: "test-results/screenshots/sso-researcher-home.png", fullPage: true });
});

test("an officer signs in through the institution and gets the officer's home", async ({ page }) => {
  await throughInstitution(page, "officer@northmere.example.edu");
  await expect(page.getByTestId("home-officer")).toBeVisible();
  await expect(page.getByText("Rafe Dunmore").first()).toBeVisible();
  await expect(page.getByTestId("home-researcher")).toHaveCount(0);
});

test("someone without a Benchwarden account is told to ask for an invitation, and is not signed in", async ({ page }) => {
  await throughInstitution(page, "visitor@northmere.example.edu");
  await expect(page).toHaveURL(/\/sign-in\?error=not-invited/);
  await expect(page.locator("form").getByRole("alert")).toContainText("Benchwarden has no account for your e-mail address");
  await expect(page.locator("form").getByRole("alert")).toContainText("invite you");
  await page.screenshot({ path: "test-results/screenshots/sso-not-invited.png", fullPage: true });
  const session = await page.request.get("/api/auth/get-session");
  expect(await session.json()).toBeNull();
  await page.goto("/");
  await expect(page).toHaveURL(/\/sign-in/);
});

test("an address the institution did not confirm is refused with a sentence", async ({ page }) => {
  await throughInstitution(page, "unconfirmed.researcher@northmere.example.edu");
  await expect(page).toHaveURL(/\/sign-in\?error=email-not-confirmed/);
  await expect(page.locator("form").getByRole("alert")).toContainText("did not confirm your e-mail address");
});

test("a made-up reason in the address shows only Benchwarden's own sentence", async ({ page }) => {
  await page.goto("/sign-in?error=%3Cscript%3Ealert(1)%3C%2Fscript%3E&error_description=Call%20this%20number");
  await expect(page.locator("form").getByRole("alert")).toHaveText("Signing in through your institution did not work. Try again, or sign in with your e-mail and password.");
  await expect(page.getByText("Call this number")).toHaveCount(0);
});

test("a person an admin deactivates loses their institutional session at once and cannot sign in through the institution again", async ({ page }) => {
  const pool = new pg.Pool({ connectionString: databaseUrl(), max: 1 });
  try {
    const admin = await signIn(DEMO.admin);
    const labId = await labIdByName(admin.cookie, DEMO_LAB_NAME);
    // An account of this test's own: the demo people must stay usable for every other test.
    const person = await createAccount(pool, { name: "Leaving Researcher", roles: ["researcher"], labIds: [labId], password: "leaving-researcher-pw" });
    await throughInstitution(page, person.email);
    await expect(page).toHaveURL(`${APP_URL}/`);
    await expect(page.getByTestId("home-researcher")).toBeVisible();
    await expect(page.getByText("Leaving Researcher").first()).toBeVisible();
    expect((await page.request.get("/api/benches")).status()).toBe(200);
    // The same session cookie works on the other app server (sessions live in PostgreSQL).
    const cookie = (await page.context().cookies(APP_URL)).map((c) => `${c.name}=${c.value}`).join("; ");
    if (SECOND_APP_URL) expect((await fetch(`${SECOND_APP_URL}/api/benches`, { headers: { cookie } })).status).toBe(200);

    const off = await call("POST", `/api/admin/people/${person.id}/deactivate`, admin.cookie, { reason: "Left the institute" });
    expect(off.status).toBe(200);
    expect(off.json).toMatchObject({ active: false, sessionsRevoked: 1 });

    // The very next request with the institutional session is refused, on both servers, and the
    // page sends them to the sign-in page.
    expect((await page.request.get("/api/benches")).status()).toBe(401);
    if (SECOND_APP_URL) expect((await fetch(`${SECOND_APP_URL}/api/benches`, { headers: { cookie } })).status).toBe(401);
    await page.goto("/");
    await expect(page).toHaveURL(/\/sign-in/);

    // Signing in through the institution again — the provider still knows them, and may not even
    // ask for the password — gives the deactivated sentence and no session.
    await page.waitForLoadState("networkidle");
    await page.getByRole("button", { name: "Continue with Northmere University login" }).click();
    await page.waitForURL((url) => url.href.startsWith(ISSUER) || (url.pathname === "/sign-in" && url.searchParams.has("error")), { timeout: 20_000 });
    if (page.url().startsWith(ISSUER)) await signInAtProvider(page, person.email);
    await expect(page).toHaveURL(/\/sign-in\?error=deactivated/);
    await expect(page.locator("form").getByRole("alert")).toHaveText("Your Benchwarden account is deactivated. If that is a mistake, ask an administrator to reactivate it.");
    await page.screenshot({ path: "test-results/screenshots/sso-deactivated.png", fullPage: true });
    expect(await (await page.request.get("/api/auth/get-session")).json()).toBeNull();
    expect((await page.request.get("/api/benches")).status()).toBe(401);
    const { rows } = await pool.query<{ n: number }>("select count(*)::int as n from session where user_id = $1", [person.id]);
    expect(rows[0].n).toBe(0);
  } finally {
    await pool.end();
  }
});
