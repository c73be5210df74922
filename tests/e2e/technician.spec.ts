// The technician in chromium: downloads the build sheet of a signed-off bench (with progress), starts the
// build, enters a measured position out of tolerance and sees it flagged, then measures every element within
// tolerance and ticks the whole checklist; records a matching and a mismatching observation and sees each
// judged; uploads a PNG of the screen, is refused a text file named .png with a sentence, uploads a rendered photo of
// the screen and reads its pattern (zone count, centre, distance, the plot), signs the build off,
// and reads it all back in the bench's trail.
import { readFileSync } from "node:fs";
import { expect as baseExpect, test, type Page } from "@playwright/test";
import pg from "pg";
import { PNG } from "pngjs";
import { greyPng } from "../../lib/pdf/png";
import { call, DEMO, DEMO_PASSWORD, signIn } from "../support/http";
import { createDrawnBench, databaseUrl, labIdByName, sampleBench } from "../support/review-fixtures";
import { defaultPhoto, renderPhoto, truePattern, type SyntheticBench } from "../unit/photo/render";

// The dev server compiles a route on its first request, and the sheet is printed by chromium: be patient.
const expect = baseExpect.configure({ timeout: 30_000 });
const shots = "test-results/screenshots";
const title = `E2E build ${Date.now().toString(36)}`;
let revisionId = "";
let benchId = "";
/** Where sampleBench() puts each element, along the beam. */
const DRAWN_MM: Record<string, number> = { "laser-1": 0, "lens-1": 100, "iris-1": 400, "screen-1": 1400 };

test.beforeAll(async () => {
  const pool = new pg.Pool({ connectionString: databaseUrl(), max: 1 });
  try {
    const researcher = await signIn(DEMO.researcher);
    const officer = await signIn(DEMO.officer);
    const labId = await labIdByName(researcher.cookie, "Wrenfield Imaging Lab");
    const b = await createDrawnBench(pool, researcher.cookie, labId, sampleBench(title));
    await call("POST", `/api/revisions/${b.revisionId}/submit`, researcher.cookie, { contentHash: b.contentHash });
    const decided = await call("POST", `/api/revisions/${b.revisionId}/decision`, officer.cookie, { outcome: "approve", contentHash: b.contentHash, password: DEMO_PASSWORD, conditions: "Enclosure closed." });
    if (decided.status !== 201) throw new Error(`not approved: ${decided.text}`);
    revisionId = b.revisionId;
    benchId = b.benchId;
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

  // Every element measured within tolerance (iris-1 corrected to +0.5 mm).
  for (const [id, mm] of Object.entries(DRAWN_MM)) {
    const input = page.getByLabel(`Measured position of ${id} (mm)`);
    await input.fill(String(mm + 0.5));
    await input.press("Enter");
    await expect(page.getByTestId(`tolerance-${id}`)).toContainText("within ±2 mm (+0.5 mm)");
  }

  // Tick every line of the checklist: elements, controls, eyewear.
  const checklist = page.getByTestId("checklist");
  const boxes = checklist.getByRole("checkbox");
  const total = await boxes.count();
  expect(total).toBeGreaterThanOrEqual(Object.keys(DRAWN_MM).length + 2);
  for (let i = 0; i < total; i++) {
    const box = boxes.nth(i);
    await expect(box).toBeEnabled();
    // The box shows what the server recorded, so it turns checked once the save is back.
    if (!(await box.isChecked())) await box.click();
    await expect(box).toBeChecked();
  }
  await expect(checklist).toContainText(`${total} of ${total} ticked`);
  await expect(page.getByRole("button", { name: "Complete the build" })).toBeEnabled();
  await checklist.screenshot({ path: `${shots}/technician-3b-checklist-ticked.png` });

  // The prediction behind iris-1, as the card shows it (pattern diameter, power at the screen).
  const card = page.getByTestId("aperture-iris-1");
  const shown = async (n: number) => Number((await card.locator("dd").nth(n).innerText()).replace(/[^0-9.]/g, ""));
  const predictedDiameter = await shown(2);
  const predictedPower = await shown(3);
  expect(predictedDiameter).toBeGreaterThan(0);
  expect(predictedPower).toBeGreaterThan(0);
  const form = page.getByTestId("observation-form-iris-1");

  // An observation that matches: the predicted diameter and power.
  await form.getByLabel("Ring pattern diameter (mm)").fill(String(predictedDiameter));
  await form.getByLabel("Power at the screen (mW)").fill(String(predictedPower));
  await form.getByLabel("Note").fill("As on the sheet.");
  await form.getByRole("button", { name: "Record the observation" }).click();
  await expect(form.getByText("Matches the prediction")).toBeVisible();
  const matching = card.getByTestId("observation").filter({ hasText: "As on the sheet." });
  await expect(matching).toContainText("✓ Matches");
  await expect(matching).not.toContainText("Mismatch");

  // An observation that does not match: three times the predicted power at the screen.
  await form.getByLabel("Power at the screen (mW)").fill(String(Number((predictedPower * 3).toPrecision(3))));
  await form.getByLabel("Note").fill("The pattern looks much brighter than the sheet.");
  await form.getByRole("button", { name: "Record the observation" }).click();
  await expect(form.getByText("Does not match the prediction")).toBeVisible();
  const mismatching = card.getByTestId("observation").filter({ hasText: "much brighter than the sheet" });
  await expect(mismatching).toContainText("✕ Mismatch");
  await expect(mismatching).toContainText("Power at the screen: predicted");
  await expect(card.getByTestId("observation")).toHaveCount(2);

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

  // The 16 × 16 picture cannot be read as a screen photo: the sentence says why.
  await card.getByRole("button", { name: "Read the pattern in screen.png behind iris-1" }).click();
  await expect(card.getByTestId("screen-photo").filter({ hasText: "screen.png" }).getByRole("alert")).toContainText("it must be at least 32 × 32 pixels");

  // A photo of the screen as drawn, rendered by the tests' own renderer (blur, noise, the pattern off the middle):
  // "Read the pattern" fits the zone count, centre and distance and shows them beside the prediction with the plot.
  const photoBench: SyntheticBench = { wavelengthNm: 632.8, beamDiameterMm: 0.8, lenses: [{ positionMm: 100, focalLengthMm: -25 }], aperturePositionMm: 400, apertureDiameterMm: 2, screenDistanceMm: 1000 };
  const rendered = renderPhoto(photoBench, defaultPhoto({ widthPx: 640, heightPx: 480, centrePx: { x: 352.4, y: 221.7 }, mmPerPixel: truePattern(photoBench).shadowRadiusMm / 150, blurPx: 1.2, seed: 7 }));
  const encoded = new PNG({ width: rendered.widthPx, height: rendered.heightPx });
  encoded.data = Buffer.from(rendered.data);
  await upload.getByLabel("File to upload (iris-1)").setInputFiles({ name: "screen-photo.png", mimeType: "image/png", buffer: PNG.sync.write(encoded) });
  await upload.getByRole("button", { name: "Upload", exact: true }).click();
  await expect(upload.getByText("Kept, with its SHA-256 fingerprint")).toBeVisible();
  await card.getByRole("button", { name: "Read the pattern in screen-photo.png behind iris-1" }).click();
  const reading = card.getByTestId("photo-reading").filter({ hasText: "screen-photo.png" });
  await expect(reading).toContainText("✓ Matches", { timeout: 60_000 });
  await expect(reading).toContainText("Half-period zones");
  await expect(reading).toContainText("Dark rings at");
  await expect(reading.getByTestId("photo-distance")).toContainText("drawn 1,000 mm");
  await expect(reading.getByTestId("photo-profile-plot")).toBeVisible();
  await expect(card.getByTestId("observation").filter({ hasText: 'Read from the screen photo "screen-photo.png"' })).toContainText("✓ Matches");
  await reading.screenshot({ path: `${shots}/technician-4b-photo-reading.png` });
  await page.screenshot({ path: `${shots}/technician-5-build-page.png`, fullPage: true });

  // Complete the build: everything is ticked and within tolerance.
  await page.getByRole("button", { name: "Complete the build" }).click();
  await expect(page.getByText(/Build completed by .+, \d{1,2} \w{3} \d{4}, \d{2}:\d{2}/)).toBeVisible();

  // The bench's trail shows the rebuild to the technician (review comments are not theirs to read).
  await page.goto(`/benches/${benchId}/trail`);
  const trail = page.getByTestId("trail-timeline");
  await expect(page.getByRole("heading", { name: `Trail of ${title}` })).toBeVisible();
  for (const words of ["Signed off", "Build started", "Observation recorded", "Photo or file uploaded", "Screen photo read", "Build completed"]) await expect(trail).toContainText(words);
  await expect(page.getByTestId("trail-comments-hidden")).toBeVisible();
  await page.screenshot({ path: `${shots}/technician-6-trail.png`, fullPage: true });
});
