// The technician in chromium: downloads the build sheet of a signed-off bench (with progress), starts the
// build, enters a measured position out of tolerance and sees it flagged, records a mismatching observation
// and sees the flag, uploads a PNG of the screen, and is refused a text file named .png with a sentence.
import { readFileSync } from "node:fs";
import { expect as baseExpect, test, type Page } from "@playwright/test";
import pg from "pg";
import { greyPng } from "../../lib/pdf/png";
import { call, DEMO, DEMO_PASSWORD, signIn } from "../support/http";
import { createDrawnBench, databaseUrl, labIdByName, sampleBench } from "../support/review-fixtures";

// The dev server compiles a route on its first request, and the sheet is printed by chromium: be patient.
const expect = baseExpect.configure({ timeout: 30_000 });
const shots = "test-results/screenshots";
const title = `E2E build ${Date.now().toString(36)}`;
let revisionId = "";

test.beforeAll(async () => {
  const pool = new pg.Pool({ connectionString: databaseUrl(), max: 1 });
  try {
    const researcher = await signIn(DEMO.researcher);
    const officer = await signIn(DEMO.officer);
    const labId = await labIdByName(researcher.cookie, "Coherent Imaging Lab");
    const b = await createDrawnBench(pool, researcher.cookie, labId, sampleBench(title));
    await call("POST", `/api/revisions/${b.revisionId}/submit`, researcher.cookie, { contentHash: b.contentHash });
    const decided = await call("POST", `/api/revisions/${b.revisionId}/decision`, officer.cookie, { outcome: "approve", contentHash: b.contentHash, password: DEMO_PASSWORD, conditions: "Enclosure closed." });
    if (decided.status !== 201) throw new Error(`not approved: ${decided.text}`);
    revisionId = b.revisionId;
  } finally {
    await pool.end();
  }
});

async function signInAs(page: Page, email: string) {
  await page.goto("/sign-in");
  await page.waitForLoadState("networkidle");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("signed-in-name")).toBeVisible();
}

test("a technician builds a signed-off bench from its sheet and records what was built and seen", async ({ page }) => {
  test.setTimeout(240_000);
  await signInAs(page, DEMO.technician);

  // The list: the new sign-off is there, with the sheet download.
  await page.goto("/builds");
  await page.waitForLoadState("networkidle");
  const row = page.getByTestId(`buildable-${revisionId}`);
  await expect(row.getByRole("heading", { name: title })).toBeVisible();
  await page.screenshot({ path: `${shots}/technician-1-list.png`, fullPage: true });

  // Download the build sheet: progress while the job runs, then the PDF.
  await row.getByRole("button", { name: "Download build sheet" }).click();
  const ready = row.getByTestId("sheet-ready-link");
  await expect(ready).toBeVisible({ timeout: 150_000 });
  await page.screenshot({ path: `${shots}/technician-2-sheet-ready.png`, fullPage: true });
  const [download] = await Promise.all([page.waitForEvent("download"), ready.click()]);
  expect(download.suggestedFilename()).toMatch(/^build-sheet-.*\.pdf$/);
  const pdf = readFileSync(await download.path());
  expect(pdf.subarray(0, 4).toString("latin1")).toBe("%PDF");

  // Start the build.
  await row.getByRole("button", { name: "Start the build" }).click();
  await expect(page).toHaveURL(/\/builds\/[0-9a-f-]+$/);
  await expect(page.getByRole("heading", { name: "As-built checklist" })).toBeVisible();
  await page.waitForLoadState("networkidle");

  // A measured position 5 mm off is flagged in words.
  const position = page.getByLabel("Measured position of iris-1 (mm)");
  await position.fill("405");
  await position.press("Enter");
  await expect(page.getByTestId("tolerance-iris-1")).toContainText("Out of tolerance");
  await expect(page.getByTestId("tolerance-iris-1")).toContainText("allowed ±2 mm");
  await page.getByTestId("check-element:iris-1").screenshot({ path: `${shots}/technician-3-out-of-tolerance.png` });

  // An observation that does not match: three times the predicted power at the screen.
  const card = page.getByTestId("aperture-iris-1");
  const predictedPower = Number((await card.locator("dd").nth(3).innerText()).replace(/[^0-9.]/g, ""));
  const form = page.getByTestId("observation-form-iris-1");
  await form.getByLabel("Power at the screen (mW)").fill(String(Number((predictedPower * 3).toPrecision(3))));
  await form.getByLabel("Note").fill("The pattern looks much brighter than the sheet.");
  await form.getByRole("button", { name: "Record the observation" }).click();
  await expect(form.getByText("Does not match the prediction")).toBeVisible();
  await expect(card.getByTestId("observation").first()).toContainText("Mismatch");
  await expect(card.getByTestId("observation").first()).toContainText("Power at the screen: predicted");

  // A real PNG of the screen is kept and shown beside the prediction.
  const upload = page.getByTestId("upload-form-iris-1");
  const png = greyPng(16, 16, Array.from({ length: 256 }, (_, i) => (i % 16) / 15));
  await upload.getByLabel("File to upload (iris-1)").setInputFiles({ name: "screen.png", mimeType: "image/png", buffer: png });
  await upload.getByRole("button", { name: "Upload", exact: true }).click();
  await expect(upload.getByText("Kept, with its SHA-256 fingerprint")).toBeVisible();
  await expect(card.getByRole("img", { name: /screen\.png/ })).toBeVisible();
  await card.screenshot({ path: `${shots}/technician-4-observation-and-photo.png` });

  // A text file named .png is refused with a sentence.
  await upload.getByLabel("File to upload (iris-1)").setInputFiles({ name: "fake.png", mimeType: "image/png", buffer: Buffer.from("this is only text, not a picture") });
  await upload.getByRole("button", { name: "Upload", exact: true }).click();
  await expect(upload.getByRole("alert")).toContainText("is not a PNG, JPEG or PDF file");
  await page.screenshot({ path: `${shots}/technician-5-build-page.png`, fullPage: true });
});
