// Eyewear coverage on the review screen in chromium: an officer keeps a lab's eyewear; the review screen of a 532 nm bench
// says, per line, which item covers the OD needed and names the lab's standard. Screenshots for a person to look at.
import { expect as baseExpect, test, type Browser, type Page } from "@playwright/test";
import pg from "pg";
import type { BenchDocument } from "../../lib/bench/schema";
import { call, DEMO, DEMO_PASSWORD, signIn } from "../support/http";
import { createDrawnBench, databaseUrl, labIdByName } from "../support/review-fixtures";

const expect = baseExpect.configure({ timeout: 15_000 });
const marker = Date.now().toString(36);
const shots = "test-results/screenshots";
const itemName = `E2E green goggles ${marker}`;
let revisionId = "";
let itemId = "";

const doc: BenchDocument = {
  version: 1,
  title: `E2E green eyewear bench ${marker}`,
  elements: [
    { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 532, powerMw: 40, beamDiameterMm: 1 },
    { id: "lens-1", kind: "lens", positionMm: 200, focalLengthMm: 100 },
    { id: "screen-1", kind: "screen", positionMm: 900 },
  ],
};

test.beforeAll(async () => {
  const pool = new pg.Pool({ connectionString: databaseUrl(), max: 1 });
  try {
    const researcher = await signIn(DEMO.researcher);
    const officer = await signIn(DEMO.officer);
    const labId = await labIdByName(researcher.cookie, "Wrenfield Imaging Lab");
    const item = await call("POST", "/api/eyewear", officer.cookie, { labId, name: itemName, quantity: 2, bands: [{ fromNm: 520, toNm: 545, opticalDensity: 8, en207ScaleNumber: 7 }] });
    if (item.status !== 201) throw new Error(`eyewear not created: ${item.text}`);
    itemId = String(item.json!.id);
    ({ revisionId } = await createDrawnBench(pool, researcher.cookie, labId, doc));
  } finally {
    await pool.end();
  }
});

test.afterAll(async () => {
  const officer = await signIn(DEMO.officer);
  if (itemId) await call("DELETE", `/api/eyewear/${itemId}`, officer.cookie);
});

async function signedIn(browser: Browser, email: string): Promise<Page> {
  const context = await browser.newContext();
  const page = await context.newPage();
  await page.goto("/sign-in");
  await page.waitForLoadState("networkidle");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("signed-in-name")).toBeVisible();
  return page;
}

test("the review screen says which of the lab's eyewear covers each line, under the lab's standard", async ({ browser }) => {
  const officer = await signedIn(browser, DEMO.officer);
  await officer.goto(`/reviews/${revisionId}`);
  await expect(officer.getByRole("heading", { name: "Eyewear for each line" })).toBeVisible();
  const coverage = officer.getByTestId("eyewear-coverage");
  const line = coverage.locator("li[data-line-status]").first();
  await expect(line).toHaveAttribute("data-line-status", "covered");
  await expect(line).toContainText("532 nm");
  await expect(line).toContainText(itemName);
  // The demo's near-infrared visor has no band at 532 nm, so it is never named as covering this line.
  await expect(line).not.toContainText("Near-infrared visor");
  await expect(coverage.getByTestId("safety-standard")).toContainText("ANSI Z136.1-2014");
  await expect(coverage).toContainText("confirm with your laser safety officer");
  await coverage.scrollIntoViewIfNeeded();
  await officer.screenshot({ path: `${shots}/eyewear-review-coverage.png`, fullPage: true });

  // The eyewear page lists the item under its lab, with the standard picker for the officer.
  await officer.goto("/eyewear");
  await expect(officer.getByText(itemName)).toBeVisible();
  await expect(officer.getByLabel("Safety standard for Wrenfield Imaging Lab")).toHaveValue("ANSI Z136.1-2014");
  await officer.screenshot({ path: `${shots}/eyewear-page.png`, fullPage: true });
});
