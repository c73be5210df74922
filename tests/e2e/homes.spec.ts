// Each demo role signs in through the sign-in page in chromium, lands on its own home, sees only
// the navigation its role may use, and a screenshot of each home is kept under test-results/.
import { expect, test } from "@playwright/test";

const PASSWORD = "northmere-demo-2026";

const roles = [
  { role: "researcher", email: "researcher@northmere.example.edu", heading: "My benches", section: "home-researcher", nav: ["Home", "Benches"], hidden: ["People", "Labs"] },
  { role: "officer", email: "officer@northmere.example.edu", heading: "Waiting for your review", section: "home-officer", nav: ["Home", "Benches"], hidden: ["People"] },
  { role: "technician", email: "technician@northmere.example.edu", heading: "Signed-off benches to build", section: "home-technician", nav: ["Home", "Benches"], hidden: ["People"] },
  { role: "auditor", email: "auditor@northmere.example.edu", heading: "Sign-offs", section: "home-auditor", nav: ["Home", "Benches"], hidden: ["People", "Labs"] },
  { role: "admin", email: "admin@northmere.example.edu", heading: "People and labs", section: "home-admin", nav: ["Home", "People", "Labs"], hidden: ["Benches"] },
];

for (const r of roles) {
  test(`${r.role} signs in and lands on their home`, async ({ page }) => {
    await page.goto("/");
    await expect(page).toHaveURL(/\/sign-in$/);
    await page.getByLabel("E-mail").fill(r.email);
    await page.getByLabel("Password").fill(PASSWORD);
    await page.getByRole("button", { name: "Sign in" }).click();
    await expect(page.getByTestId(r.section)).toBeVisible();
    await expect(page.getByRole("heading", { name: r.heading })).toBeVisible();
    const nav = page.getByRole("navigation", { name: "Main" });
    for (const label of r.nav) await expect(nav.getByRole("link", { name: label, exact: true })).toBeVisible();
    for (const label of r.hidden) await expect(nav.getByRole("link", { name: label, exact: true })).toHaveCount(0);
    await page.screenshot({ path: `test-results/screenshots/home-${r.role}.png`, fullPage: true });
  });
}

test("a wrong password says so without telling whether the account exists", async ({ page }) => {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill("nobody@northmere.example.edu");
  await page.getByLabel("Password").fill("not-the-password");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.locator("form").getByRole("alert")).toHaveText("Wrong e-mail or password.");
  await page.screenshot({ path: "test-results/screenshots/sign-in-refused.png" });
});

test("a researcher who opens the people page is told why not", async ({ page }) => {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill("researcher@northmere.example.edu");
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("home-researcher")).toBeVisible();
  const response = await page.goto("/admin/people");
  expect(response?.status()).toBe(403);
  await expect(page.getByRole("heading", { name: "Not open to your role" })).toBeVisible();
  await expect(page.getByText("Your role (Researcher) does not open this page.")).toBeVisible();
});
