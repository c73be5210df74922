// Every page as each role sees it, at 1440 px (a desktop) and 390 px (a phone): an accessibility check with axe
// (no serious or critical violations) and a full-page screenshot in test-results/screenshots/pages-*.png to look at.
// Also: the header keeps its navigation on one line at 1440 px and stays short on a phone; a signed-out visitor's
// link keeps its target through sign-in; a page a role may not open answers 403, a bench of another lab 404.
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Browser, type Page } from "@playwright/test";
import { DEMO, DEMO_PASSWORD } from "../support/http";

test.describe.configure({ mode: "serial" });
test.setTimeout(600_000);

const shots = "test-results/screenshots";
const WIDTHS = [
  { name: "desktop", width: 1440, height: 900 },
  { name: "phone", width: 390, height: 844 },
] as const;

async function signedIn(browser: Browser, email: string, width: number, height: number): Promise<Page> {
  const context = await browser.newContext({ viewport: { width, height } });
  const page = await context.newPage();
  await page.goto("/sign-in", { timeout: 120_000 });
  await page.waitForLoadState("networkidle");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"), { timeout: 60_000 });
  return page;
}

/** The first link on a list page whose path matches, e.g. the first bench of the list. */
async function firstLink(page: Page, listPath: string, pattern: RegExp): Promise<string | null> {
  await page.goto(listPath);
  const hrefs = await page.locator("a[href]").evaluateAll((as) => as.map((a) => a.getAttribute("href") ?? ""));
  return hrefs.find((h) => pattern.test(h)) ?? null;
}

async function axeAndShoot(page: Page, path: string, label: string) {
  const response = await page.goto(path);
  expect(response?.status(), `${path} answers`).toBeLessThan(400);
  await page.waitForLoadState("networkidle");
  await page.screenshot({ path: `${shots}/pages-${label}.png`, fullPage: true });
  const results = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  const bad = results.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(bad.map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(" ")).join(" | ")}`), `${path} at ${label}`).toEqual([]);
}

const ROLES = [
  { key: "researcher", lists: ["/", "/benches", "/benches/new", "/lasers", "/verify"], details: [{ list: "/benches", pattern: /^\/benches\/[0-9a-f-]{36}$/ }] },
  { key: "officer", lists: ["/", "/reviews", "/lasers", "/eyewear"], details: [{ list: "/reviews", pattern: /^\/reviews\/[0-9a-f-]{36}$/ }, { list: "/lasers", pattern: /^\/lasers\/[0-9a-f-]{36}$/ }] },
  { key: "technician", lists: ["/", "/builds"], details: [] },
  { key: "auditor", lists: ["/", "/desk"], details: [{ list: "/desk", pattern: /^\/desk\/benches\/[0-9a-f-]{36}/ }] },
  { key: "admin", lists: ["/admin/people", "/admin/labs"], details: [] },
] as const;

for (const size of WIDTHS) {
  for (const role of ROLES) {
    test(`${role.key}'s pages at ${size.width} px: no serious accessibility problems`, async ({ browser }) => {
      const page = await signedIn(browser, DEMO[role.key], size.width, size.height);
      for (const path of role.lists) await axeAndShoot(page, path, `${role.key}-${path.replace(/\W+/g, "-").replace(/^-|-$/g, "") || "home"}-${size.width}`);
      for (const d of role.details) {
        const href = await firstLink(page, d.list, d.pattern);
        if (href) await axeAndShoot(page, href, `${role.key}-${d.list.replace(/\W+/g, "")}-detail-${size.width}`);
      }
      // the header: one line of navigation on a desktop, a short header on a phone
      await page.goto("/");
      const header = page.locator("header").first();
      const box = (await header.boundingBox())!;
      if (size.width >= 1440) {
        const nav = page.getByRole("navigation", { name: "Main" });
        await expect(nav).toBeVisible();
        const navBox = (await nav.boundingBox())!;
        expect(navBox.height, "the navigation is one line").toBeLessThan(60);
      } else expect(box.height, "the phone header stays short").toBeLessThan(size.height / 4);
      await page.context().close();
    });
  }
}

test("the sign-in page passes the accessibility check at both widths", async ({ browser }) => {
  for (const size of WIDTHS) {
    const context = await browser.newContext({ viewport: { width: size.width, height: size.height } });
    const page = await context.newPage();
    await axeAndShoot(page, "/sign-in", `sign-in-${size.width}`);
    await context.close();
  }
});

test("a signed-out visitor's link keeps its target through sign-in; another origin is never followed", async ({ browser }) => {
  const context = await browser.newContext();
  const page = await context.newPage();
  await page.goto("/lasers", { timeout: 120_000 });
  await expect(page).toHaveURL(/\/sign-in\?callbackURL=%2Flasers/);
  await page.waitForLoadState("networkidle");
  await page.getByLabel("E-mail").fill(DEMO.officer);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => u.pathname === "/lasers", { timeout: 60_000 });
  await context.close();

  const other = await browser.newContext();
  const page2 = await other.newPage();
  await page2.goto("/sign-in?callbackURL=%2F%2Fevil.example%2Fphish");
  await page2.waitForLoadState("networkidle");
  await page2.getByLabel("E-mail").fill(DEMO.officer);
  await page2.getByLabel("Password").fill(DEMO_PASSWORD);
  await page2.getByRole("button", { name: "Sign in" }).click();
  await page2.waitForURL((u) => !u.pathname.startsWith("/sign-in"), { timeout: 60_000 });
  expect(page2.url()).not.toContain("evil.example");
  expect(new URL(page2.url()).pathname).toBe("/");
  await other.close();
});

test("pages answer 403 for a role that may not open them and 404 for things that are not there", async ({ browser }) => {
  const technician = await signedIn(browser, DEMO.technician, 1280, 860);
  expect((await technician.goto("/admin/people"))?.status()).toBe(403);
  await expect(technician.getByRole("heading", { name: "Not open to your role" })).toBeVisible();
  await technician.context().close();
  const officer = await signedIn(browser, DEMO.officer, 1280, 860);
  expect((await officer.goto("/benches/00000000-0000-4000-8000-000000000000"))?.status()).toBe(404);
  expect((await officer.goto("/reviews/00000000-0000-4000-8000-000000000000"))?.status()).toBe(404);
  await officer.context().close();
});
