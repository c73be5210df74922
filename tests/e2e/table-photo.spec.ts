// A table's build in chromium: the light through the iris reaches two screens (a splitter behind it), so the technician
// says which one the photo shows; the photo, rendered by the tests' own renderer with the screen 700 mm from the iris
// along the beam, is read against that beam's path and matches; the trail names the screen. Screenshot: test-results/screenshots/table-photo-reading.png.
import { expect as baseExpect, test, type Page } from "@playwright/test";
import pg from "pg";
import { PNG } from "pngjs";
import type { BenchDocument } from "@/lib/bench/schema";
import { call, DEMO, DEMO_PASSWORD, signIn } from "../support/http";
import { createDrawnBench, databaseUrl, labIdByName } from "../support/review-fixtures";
import { defaultPhoto, renderPhoto, truePattern, type SyntheticBench } from "../unit/photo/render";

const expect = baseExpect.configure({ timeout: 30_000 });
const shots = "test-results/screenshots";
const title = `E2E table photo ${Date.now().toString(36)}`;
let buildId = "";
let benchId = "";

// Unfolded, the path to screen-B is this straight bench: the iris 300 mm from the laser, the screen 700 mm behind it.
const toScreenB: SyntheticBench = { wavelengthNm: 632.8, beamDiameterMm: 4, lenses: [], aperturePositionMm: 300, apertureDiameterMm: 3, screenDistanceMm: 700 };
const tableDoc = {
  version: 2,
  title,
  table: { widthMm: 1200, depthMm: 900, holePitchMm: 25 },
  elements: [
    { id: "hene", kind: "laser", xMm: 100, yMm: 100, angleDeg: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 4 },
    { id: "iris", kind: "aperture", xMm: 400, yMm: 100, angleDeg: 180, diameterMm: 3 },
    { id: "BS", kind: "beam-splitter", xMm: 600, yMm: 100, angleDeg: 135, reflectance: 0.5 },
    { id: "screen-A", kind: "screen", xMm: 600, yMm: 500, angleDeg: 270 },
    { id: "screen-B", kind: "screen", xMm: 1100, yMm: 100, angleDeg: 180 },
  ],
};

test.beforeAll(async () => {
  const pool = new pg.Pool({ connectionString: databaseUrl(), max: 1 });
  try {
    const researcher = await signIn(DEMO.researcher);
    const officer = await signIn(DEMO.officer);
    const technician = await signIn(DEMO.technician);
    const labId = await labIdByName(researcher.cookie, "Wrenfield Imaging Lab");
    const b = await createDrawnBench(pool, researcher.cookie, labId, tableDoc as unknown as BenchDocument);
    benchId = b.benchId;
    await call("POST", `/api/revisions/${b.revisionId}/submit`, researcher.cookie, { contentHash: b.contentHash });
    const decided = await call("POST", `/api/revisions/${b.revisionId}/decision`, officer.cookie, { outcome: "approve", contentHash: b.contentHash, password: DEMO_PASSWORD });
    if (decided.status !== 201) throw new Error(`not approved: ${decided.text}`);
    const started = await call("POST", "/api/builds", technician.cookie, { revisionId: b.revisionId });
    if (started.status !== 201) throw new Error(`build not started: ${started.text}`);
    buildId = (started.json!.build as { id: string }).id;
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

test("the technician says which screen of the table the photo shows and it is read against that beam's path", async ({ page }) => {
  test.setTimeout(180_000);
  await signInAs(page, DEMO.technician);
  await page.goto(`/builds/${buildId}`);
  await page.waitForLoadState("networkidle");
  const card = page.getByTestId("aperture-iris");
  const upload = page.getByTestId("upload-form-iris");
  const rendered = renderPhoto(toScreenB, defaultPhoto({ widthPx: 640, heightPx: 480, centrePx: { x: 330.6, y: 251.3 }, mmPerPixel: truePattern(toScreenB).shadowRadiusMm / 150, blurPx: 1.2, seed: 31 }));
  const encoded = new PNG({ width: rendered.widthPx, height: rendered.heightPx });
  encoded.data = Buffer.from(rendered.data);
  await upload.getByLabel("File to upload (iris)").setInputFiles({ name: "screen-b.png", mimeType: "image/png", buffer: PNG.sync.write(encoded) });
  await upload.getByRole("button", { name: "Upload", exact: true }).click();
  await expect(upload.getByText("Kept, with its SHA-256 fingerprint")).toBeVisible();

  await expect(card.getByTestId("other-screens-iris")).toHaveText("These figures are for screen-A; the light through iris also reaches screen-B. A photo of that screen is read against its own beam: choose the screen beside the photos.");
  const which = card.getByRole("combobox", { name: /The light through iris reaches 2 screens; the photo to read shows/ });
  await expect(which).toHaveValue("screen-A");
  await which.selectOption("screen-B");
  await card.getByRole("button", { name: "Read the pattern in screen-b.png behind iris on screen-B" }).click();
  const reading = card.getByTestId("photo-reading").filter({ hasText: "screen-b.png" });
  await expect(reading).toContainText("✓ Matches", { timeout: 60_000 });
  await expect(reading).toContainText("(the screen screen-B, beam p1)");
  await expect(reading.getByTestId("photo-distance")).toContainText("drawn 700 mm");
  await expect(card.getByTestId("observation").filter({ hasText: 'Read from the screen photo "screen-b.png"' })).toContainText("✓ Matches");
  await card.screenshot({ path: `${shots}/table-photo-reading.png` });

  // The bench's trail names the screen and the beam the photo was read against.
  await page.goto(`/benches/${benchId}/trail`);
  await expect(page.getByTestId("trail-timeline")).toContainText("“screen-b.png” behind iris on screen-B (beam p1)");
});
