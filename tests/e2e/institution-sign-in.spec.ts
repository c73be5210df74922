// Sign-in through the institution's OpenID Connect provider: `npm test` runs the local stand-in
// (scripts/identity-provider.ts, oidc-provider) and points the app at it. A person with an account
// lands on their own home with the roles and labs an administrator gave them; someone the
// institution knows but Benchwarden does not, or whose address the institution did not confirm, is
// sent back to the sign-in page with a sentence saying why, and no session.
import { expect, test, type Page } from "@playwright/test";
import { DEMO_LAB_NAME } from "../support/demo";

const APP_URL = process.env.APP_URL ?? "http://127.0.0.1:3100";
const ISSUER = process.env.SSO_ISSUER ?? "http://127.0.0.1:3190";
const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

async function throughInstitution(page: Page, login: string) {
  await page.goto("/sign-in");
  await page.waitForLoadState("networkidle");
  await page.getByRole("button", { name: "Continue with Northmere University login" }).click();
  // The provider's own sign-in page (another origin): any password, the address is the login.
  await expect(page).toHaveURL(new RegExp(`^${escape(ISSUER)}/`), { timeout: 20_000 });
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
