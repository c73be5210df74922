// The bench editor in chromium: a researcher starts a bench, places a laser, an aperture and a screen from the
// palette (click and drag), drags an element on the drawing, types a bad value and sees why beside the field,
// watches the zone count follow, undoes and redoes, moves by keyboard, reloads and finds it saved. Also: the
// read-only view for an officer, a conflict between two sessions, an import with field errors, the finder's ticks
// (move the screen to a dark, then a bright centre), the beam patterned by required eyewear OD with its legend,
// what changed since the last review, and a two-finger pinch on a touch screen. Finally the issue's own bench: a laser
// from the register, a diverging lens, a 2 mm aperture and a screen, the screen moved until the centre turns from
// bright to dark, revisions made, a reload, and the compare page marking the moved screen.
// Screenshots go to test-results/screenshots/editor-*.png.
import { expect, request as playwrightRequest, test, type Browser, type Page } from "@playwright/test";

const PASSWORD = "northmere-demo-2026";
const RAIL_Y_PX = 190; // the optical axis inside the drawing (components/editor/bench-canvas.tsx)

test.describe.configure({ mode: "serial" });
test.setTimeout(180_000);

let benchUrl = "";

async function signIn(page: Page, email: string) {
  await page.goto("/sign-in", { timeout: 120_000 });
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"), { timeout: 60_000 });
}

async function canvasPointFor(page: Page, mm: number, dy = 0) {
  const frame = page.getByTestId("bench-canvas");
  const box = (await frame.boundingBox())!;
  const pxPerMm = Number(await frame.getAttribute("data-px-per-mm"));
  const panPx = Number(await frame.getAttribute("data-pan-px"));
  return { x: box.x + panPx + mm * pxPerMm, y: box.y + RAIL_Y_PX + dy, pxPerMm };
}

const row = (page: Page, id: string) => page.locator(`button[data-element-row="${id}"]`);

async function positionOf(page: Page, id: string): Promise<number> {
  const text = await row(page, id).locator("span.font-mono.text-sm").last().textContent();
  return Number(text!.replace(" mm", ""));
}

async function freshPredictions(page: Page) {
  await expect(page.getByTestId("predictions")).toHaveAttribute("data-stale", "false", { timeout: 20_000 });
}

test("a researcher draws, tunes and saves a bench", async ({ page }) => {
  await signIn(page, "researcher@northmere.example.edu");
  await page.goto("/benches", { timeout: 120_000 });
  await page.getByRole("link", { name: "New bench" }).click();
  await page.getByLabel("Title").fill(`Editor e2e ${Date.now()}`);
  await page.getByRole("button", { name: "Create and open the editor" }).click();
  await page.waitForURL(/\/benches\/[0-9a-f-]{36}$/, { timeout: 120_000 });
  benchUrl = page.url();
  await expect(page.getByTestId("bench-editor")).toBeVisible({ timeout: 60_000 });
  await expect(page.getByText("The rail is empty")).toBeVisible();

  // Palette: click a laser (ad hoc, from the laser chooser) and an aperture onto the rail, drag a screen onto it.
  await page.getByTestId("palette-laser").click();
  await page.getByTestId("laser-ad-hoc").click();
  await expect(page.getByTestId("save-status")).toHaveAttribute("data-state", "saved", { timeout: 15_000 });
  await page.getByTestId("palette-aperture").click();
  const dropAt = await canvasPointFor(page, 600);
  const frameBox = (await page.getByTestId("bench-canvas").boundingBox())!;
  await page.getByTestId("palette-screen").dragTo(page.getByTestId("bench-canvas"), { targetPosition: { x: dropAt.x - frameBox.x, y: 120 } });
  await expect(row(page, "screen-1")).toBeVisible();
  expect(Math.abs((await positionOf(page, "screen-1")) - 600)).toBeLessThanOrEqual(2);

  // Predictions arrive: one aperture with its zone count and centre.
  await freshPredictions(page);
  const zones = page.getByTestId("aperture-row-iris-1").getByTestId("zone-count");
  await expect(zones).toHaveText(/\d/);
  const zonesBefore = await zones.textContent();
  await page.screenshot({ path: "test-results/screenshots/editor-placed.png", fullPage: true });

  // Drag the screen 150 px downstream on the drawing (snap 1 mm).
  const screenBefore = await positionOf(page, "screen-1");
  const from = await canvasPointFor(page, screenBefore);
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  for (let i = 1; i <= 10; i++) await page.mouse.move(from.x + i * 15, from.y);
  await page.mouse.up();
  const screenAfter = await positionOf(page, "screen-1");
  expect(screenAfter - screenBefore).toBeGreaterThan(100 / from.pxPerMm);
  expect(Number.isInteger(screenAfter)).toBe(true);
  await freshPredictions(page);
  await expect(zones).not.toHaveText(zonesBefore!);

  // Properties: a bad value stays in the field with the reason beside it and is not used.
  await row(page, "iris-1").click();
  const diameter = page.getByLabel("Diameter");
  await diameter.fill("-2");
  await expect(page.locator("#field-diameterMm-error")).toHaveText(/Aperture diameter must be greater than 0 mm/);
  await expect(diameter).toHaveValue("-2");
  await expect(diameter).toHaveAttribute("aria-invalid", "true");
  await expect(row(page, "iris-1")).toContainText("⌀ 2 mm");
  await page.screenshot({ path: "test-results/screenshots/editor-field-error.png", fullPage: true });
  await diameter.fill("1");
  await expect(page.locator("#field-diameterMm-error")).toHaveCount(0);
  await expect(row(page, "iris-1")).toContainText("⌀ 1 mm");
  await freshPredictions(page);
  const zonesAt1mm = await zones.textContent();
  expect(zonesAt1mm).not.toBe(zonesBefore);
  await expect(page.getByTestId("ring-image")).toBeVisible({ timeout: 20_000 });

  // Undo brings the 2 mm iris back, redo the 1 mm one (keyboard and button).
  await row(page, "iris-1").focus();
  await page.keyboard.press("Control+z");
  await expect(row(page, "iris-1")).toContainText("⌀ 2 mm");
  await expect(diameter).toHaveValue("2");
  await page.getByRole("button", { name: /Redo/ }).click();
  await expect(row(page, "iris-1")).toContainText("⌀ 1 mm");
  await freshPredictions(page);
  await expect(zones).toHaveText(zonesAt1mm!);

  // Keyboard only: move the screen by 10 mm (Shift+→) and 1 mm (→).
  await row(page, "screen-1").focus();
  await page.keyboard.press("Enter");
  await page.keyboard.press("Shift+ArrowRight");
  await page.keyboard.press("ArrowRight");
  await expect.poll(() => positionOf(page, "screen-1")).toBe(screenAfter + 11);
  await freshPredictions(page);
  const zonesTuned = await zones.textContent();
  await page.screenshot({ path: "test-results/screenshots/editor-tuned.png", fullPage: true });

  // Saved, and still there after a reload.
  await expect(page.getByTestId("save-status")).toHaveAttribute("data-state", "saved", { timeout: 15_000 });
  await page.reload();
  await expect(row(page, "screen-1")).toBeVisible({ timeout: 60_000 });
  expect(await positionOf(page, "screen-1")).toBe(screenAfter + 11);
  await expect(row(page, "iris-1")).toContainText("⌀ 1 mm");
  await freshPredictions(page);
  await expect(zones).toHaveText(zonesTuned!);
  await row(page, "iris-1").click();
  await expect(page.getByTestId("ring-image")).toBeVisible({ timeout: 20_000 });
  await page.screenshot({ path: "test-results/screenshots/editor-reloaded.png", fullPage: true });
});

test("an officer sees the drawing and predictions but cannot change them", async ({ page }) => {
  test.skip(!benchUrl, "needs the bench from the first test");
  await signIn(page, "officer@northmere.example.edu");
  await page.goto(benchUrl, { timeout: 120_000 });
  await expect(page.getByTestId("read-only-note")).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId("palette-lens")).toHaveCount(0);
  await expect(page.getByTestId("save-status")).toHaveAttribute("data-state", "read-only");
  await freshPredictions(page);
  await row(page, "iris-1").click();
  await expect(page.getByLabel("Diameter")).toHaveAttribute("readonly", "");
  await page.keyboard.press("Delete");
  await expect(row(page, "iris-1")).toBeVisible();
  await page.screenshot({ path: "test-results/screenshots/editor-read-only.png", fullPage: true });
});

async function researcherPage(browser: Browser) {
  const context = await browser.newContext();
  const page = await context.newPage();
  await signIn(page, "researcher@northmere.example.edu");
  await page.goto(benchUrl, { timeout: 120_000 });
  await expect(row(page, "iris-1")).toBeVisible({ timeout: 60_000 });
  return { context, page };
}

test("two sessions edit the same draft: the second sees a conflict and loses nothing", async ({ browser }) => {
  test.skip(!benchUrl, "needs the bench from the first test");
  const a = await researcherPage(browser);
  const b = await researcherPage(browser);

  await row(a.page, "iris-1").click();
  await a.page.getByLabel("Diameter").fill("1.5");
  await expect(a.page.getByTestId("save-status")).toHaveAttribute("data-state", "saved", { timeout: 15_000 });

  await row(b.page, "screen-1").click();
  await b.page.keyboard.press("Shift+ArrowRight");
  await expect(b.page.getByTestId("conflict")).toBeVisible({ timeout: 15_000 });
  await expect(b.page.getByTestId("save-status")).toHaveAttribute("data-state", "conflict");
  await expect(b.page.getByTestId("conflict-differences")).toContainText("iris-1: diameter (mm) 1 in yours, 1.5 saved");
  await expect(b.page.getByTestId("conflict-differences")).toContainText("screen-1: position (mm)");
  await b.page.screenshot({ path: "test-results/screenshots/editor-conflict.png", fullPage: true });

  const screenB = await positionOf(b.page, "screen-1");
  await b.page.getByRole("button", { name: /Keep mine/ }).click();
  await expect(b.page.getByTestId("save-status")).toHaveAttribute("data-state", "saved", { timeout: 15_000 });

  await a.page.reload();
  await expect(row(a.page, "screen-1")).toBeVisible({ timeout: 60_000 });
  expect(await positionOf(a.page, "screen-1")).toBe(screenB);
  await a.context.close();
  await b.context.close();
});

test("an import with mistakes lists them by field and changes nothing", async ({ page }) => {
  test.skip(!benchUrl, "needs the bench from the first test");
  await signIn(page, "researcher@northmere.example.edu");
  await page.goto(benchUrl, { timeout: 120_000 });
  await expect(row(page, "iris-1")).toBeVisible({ timeout: 60_000 });
  const bad = {
    version: 1,
    elements: [
      { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 50, powerMw: 1, beamDiameterMm: 1 },
      { id: "iris-1", kind: "aperture", positionMm: 100, diameterMm: 0 },
      { id: "x-1", kind: "mirror", positionMm: 200 },
    ],
  };
  await page.getByTestId("import-file").setInputFiles({ name: "bad-bench.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(bad)) });
  const problems = page.getByTestId("import-problems");
  await expect(problems).toBeVisible();
  await expect(problems).toContainText("elements.0.wavelengthNm");
  await expect(problems).toContainText("elements.1.diameterMm");
  await expect(problems).toContainText("elements.2.kind");
  await expect(row(page, "screen-1")).toBeVisible();
  await page.screenshot({ path: "test-results/screenshots/editor-import-errors.png", fullPage: true });
});

test("the finder's ticks move the screen to a dark or bright centre; the beam shows the eyewear OD it needs", async ({ page }) => {
  test.skip(!benchUrl, "needs the bench from the first test");
  await page.setViewportSize({ width: 1180, height: 820 }); // a 11" tablet in landscape
  await signIn(page, "researcher@northmere.example.edu");
  await page.goto(benchUrl, { timeout: 120_000 });
  await expect(row(page, "iris-1")).toBeVisible({ timeout: 60_000 });

  // A wide beam on a small iris, so the centre is truly bright or dark; 50 mW of green needs eyewear.
  await row(page, "laser-1").click();
  await page.getByLabel("Wavelength").fill("532");
  await page.getByLabel("Power").fill("50");
  await page.getByLabel("Beam diameter (1/e², at the waist)").fill("5");
  await freshPredictions(page);
  const legend = page.getByTestId("hazard-legend");
  await expect(legend).toContainText("OD under 1");
  await expect(legend).toContainText("OD 1 to under 3");
  await expect(legend).toContainText("OD 3 or more");
  await expect(legend).toHaveAttribute("data-bands-shown", /medium/);

  // The finder for the selected aperture: ticks on the rail and candidates in the panel.
  await row(page, "iris-1").click();
  const finder = page.getByTestId("finder");
  await expect(finder).toHaveAttribute("data-stale", "false", { timeout: 20_000 });
  await expect(page.getByTestId("finder-candidate").first()).toBeVisible({ timeout: 20_000 });
  await expect(page.getByTestId("bench-canvas")).toHaveAttribute("data-finder-ticks", /dark-\d+@/);
  await expect(legend).toContainText("Ruler ticks for iris-1");
  const centre = page.getByTestId("aperture-row-iris-1").getByTestId("centre");

  for (const goal of ["dark", "bright"] as const) {
    const candidate = page.getByTestId(`finder-${goal}`).getByTestId("finder-candidate").first();
    await expect(candidate).toHaveAttribute("data-centre", goal);
    const target = Number(await candidate.getAttribute("data-position-mm"));
    await candidate.getByRole("button", { name: /Move the screen here/ }).click();
    await expect.poll(() => positionOf(page, "screen-1")).toBe(target);
    await freshPredictions(page);
    await expect(centre).toHaveText(goal);
    await expect(finder).toHaveAttribute("data-stale", "false", { timeout: 20_000 });
    // where the screen now stands is listed once, as the current place, not again among the candidates
    await expect(page.getByTestId("finder-current")).toHaveAttribute("data-centre", goal);
    await expect(finder.locator(`[data-testid="finder-candidate"][data-position-mm="${target}"]`)).toHaveCount(0);
    if (goal === "dark") await page.screenshot({ path: "test-results/screenshots/editor-finder-dark.png", fullPage: true });
  }
  await page.getByTestId("bench-canvas").screenshot({ path: "test-results/screenshots/editor-finder-ticks.png" });

  // One undo puts the screen back where the last move found it.
  await row(page, "iris-1").focus();
  await page.keyboard.press("Control+z");
  await freshPredictions(page);
  await expect(centre).toHaveText("dark");

  // What changed since the last revision sent for review (none was sent on this bench yet).
  await expect(page.getByTestId("changes-since-review")).toContainText(/sent for review yet|Changes since revision/);
  await expect(page.getByTestId("save-status")).toHaveAttribute("data-state", "saved", { timeout: 15_000 });
  await page.screenshot({ path: "test-results/screenshots/editor-hazard.png", fullPage: true });
});

test("two fingers pinch the drawing on a touch screen", async ({ browser }) => {
  test.skip(!benchUrl, "needs the bench from the first test");
  const context = await browser.newContext({ hasTouch: true, viewport: { width: 1024, height: 768 } });
  const page = await context.newPage();
  await signIn(page, "researcher@northmere.example.edu");
  await page.goto(benchUrl, { timeout: 120_000 });
  await expect(row(page, "iris-1")).toBeVisible({ timeout: 60_000 });
  const frame = page.getByTestId("bench-canvas");
  await expect(frame.locator("canvas").first()).toBeVisible({ timeout: 30_000 }); // the drawing (loaded in the browser only) is up
  await freshPredictions(page);
  const before = Number(await frame.getAttribute("data-px-per-mm"));
  const box = (await frame.boundingBox())!;
  const y = box.y + 120; // above the rail, on the open drawing
  const cx = box.x + box.width / 2;
  const cdp = await context.newCDPSession(page);
  const touch = (type: "touchStart" | "touchMove" | "touchEnd", spreadPx: number) =>
    cdp.send("Input.dispatchTouchEvent", {
      type,
      touchPoints: type === "touchEnd" ? [] : [{ x: cx - spreadPx, y, id: 1 }, { x: cx + spreadPx, y, id: 2 }],
    });
  await touch("touchStart", 50);
  for (let spread = 55; spread <= 150; spread += 5) await touch("touchMove", spread);
  await touch("touchEnd", 150);
  await expect.poll(async () => Number(await frame.getAttribute("data-px-per-mm"))).toBeGreaterThan(before * 2.2);
  await page.screenshot({ path: "test-results/screenshots/editor-tablet-pinched.png", fullPage: false });
  await context.close();
});

const REGISTER_MODEL = "Northmere Optics HN-10 (editor e2e)";

/** The Wrenfield Imaging Lab's in-service HeNe for this test, entered by the officer once (found again on later runs). */
async function ensureRegisterLaser(baseURL: string): Promise<{ id: string; labId: string }> {
  const api = await playwrightRequest.newContext({ baseURL, extraHTTPHeaders: { origin: baseURL, "x-forwarded-for": "198.51.100.77" } });
  try {
    const signedIn = await api.post("/api/auth/sign-in/email", { data: { email: "officer@northmere.example.edu", password: PASSWORD } });
    expect(signedIn.status()).toBe(200);
    const labs = (await (await api.get("/api/labs")).json()) as { labs: { id: string; name: string }[] };
    const labId = labs.labs.find((l) => l.name === "Wrenfield Imaging Lab")!.id;
    const listed = (await (await api.get(`/api/lasers?labId=${labId}&status=in-service`)).json()) as { lasers: { id: string; model: string }[] };
    const known = listed.lasers.find((l) => l.model === REGISTER_MODEL);
    if (known) return { id: known.id, labId };
    const created = await api.post("/api/lasers", {
      data: { labId, labelClass: "2", wavelengthsNm: [632.8], maxPowerMw: 0.95, beamDiameterMm: 0.8, divergenceMrad: 1.0, model: REGISTER_MODEL, serialNumber: "HN-E2E-1", location: "Harbour Building B214, table 2", status: "in-service" },
    });
    expect(created.status(), await created.text()).toBe(201);
    return { id: ((await created.json()) as { id: string }).id, labId };
  } finally {
    await api.dispose();
  }
}

async function setField(page: Page, label: string, value: string) {
  const field = page.getByLabel(label, { exact: true });
  await field.fill(value);
  await expect(field).toHaveValue(value);
}

test("the issue's bench: a register laser, a diverging lens, a 2 mm iris and a screen; bright to dark; revisions; compare", async ({ page, baseURL }) => {
  const registered = await ensureRegisterLaser(baseURL!);
  await signIn(page, "researcher@northmere.example.edu");
  await page.goto("/benches/new", { timeout: 120_000 });
  await page.getByLabel("Title").fill(`Diverging lens and iris ${Date.now()}`);
  await page.getByRole("button", { name: "Create and open the editor" }).click();
  await page.waitForURL(/\/benches\/[0-9a-f-]{36}$/, { timeout: 120_000 });
  const url = page.url();
  await expect(page.getByTestId("bench-editor")).toBeVisible({ timeout: 60_000 });
  const canvas = page.getByTestId("bench-canvas");
  await expect(canvas.locator("canvas").first()).toBeVisible({ timeout: 30_000 });

  // The laser entry offers the register's in-service lasers (or ad hoc); drag the HeNe onto the rail.
  await page.getByTestId("palette-laser").click();
  const entry = page.locator(`[data-testid="register-laser"][data-laser-id="${registered.id}"]`);
  await expect(entry).toBeVisible({ timeout: 20_000 });
  await expect(entry).toContainText("632.8 nm");
  await expect(entry).toContainText("max 0.95 mW");
  await expect(entry).toContainText("Class 2");
  await page.screenshot({ path: "test-results/screenshots/editor-laser-chooser.png", fullPage: true });
  await entry.dragTo(canvas, { targetPosition: { x: 120, y: 120 } });
  await expect(row(page, "laser-1")).toBeVisible();
  await expect(page.getByTestId("register-entry-name")).toContainText(REGISTER_MODEL);
  await expect(page.getByLabel("Wavelength", { exact: true })).toHaveValue("632.8");
  await expect(page.getByLabel("Power", { exact: true })).toHaveValue("0.95");
  await expect(page.getByLabel("Beam diameter (1/e², at the waist)")).toHaveValue("0.8");
  await setField(page, "Position on the rail", "0");

  // More power than the register lists, or a wavelength it does not list: a warning in plain words.
  await setField(page, "Power", "2");
  const warnings = page.getByTestId("register-warnings");
  await expect(warnings.locator('[data-code="power-above-register"]')).toContainText("2 mW is more than this laser can give: the register's maximum");
  await setField(page, "Wavelength", "532");
  await expect(warnings.locator('[data-code="wavelength-not-registered"]')).toContainText("532 nm is not a wavelength the register lists");
  await page.screenshot({ path: "test-results/screenshots/editor-register-warning.png", fullPage: true });
  await setField(page, "Wavelength", "632.8");
  await setField(page, "Power", "0.95");
  await expect(warnings).toHaveCount(0);

  // A diverging lens, a 2 mm aperture and a screen dragged onto the rail, then their values typed in.
  const frameBox = (await canvas.boundingBox())!;
  const dropAndSet = async (kind: string, id: string, values: Record<string, string>) => {
    const at = await canvasPointFor(page, Number(values["Position on the rail"]));
    const x = Math.min(Math.max(at.x - frameBox.x, 30), frameBox.width - 30);
    await page.getByTestId(`palette-${kind}`).dragTo(canvas, { targetPosition: { x, y: 120 } });
    await expect(row(page, id)).toBeVisible();
    await expect(page.getByTestId("properties")).toContainText(id);
    for (const [label, value] of Object.entries(values)) await setField(page, label, value);
  };
  await dropAndSet("lens", "lens-1", { "Position on the rail": "100", "Focal length": "-50" });
  await dropAndSet("aperture", "iris-1", { "Position on the rail": "400", Diameter: "2" });
  await dropAndSet("screen", "screen-1", { "Position on the rail": "1000" });
  await page.getByRole("button", { name: "Fit all" }).click();
  await freshPredictions(page);
  const centre = page.getByTestId("aperture-row-iris-1").getByTestId("centre");
  await expect(centre).toHaveText("bright");
  await expect(page.getByTestId("save-status")).toHaveAttribute("data-state", "saved", { timeout: 15_000 });
  await page.screenshot({ path: "test-results/screenshots/editor-issue-bright.png", fullPage: true });

  // Make a revision: revision 1 stays as it is; the drawing goes on in revision 2.
  await page.getByTestId("make-revision").click();
  await expect(page.getByTestId("revision-made")).toContainText("Revision 1 is kept as it is");
  await expect(page.getByTestId("revisions-panel")).toContainText("Revision 2");

  // Drag the screen downstream, a little at a time, until the centre turns dark.
  let steps = 0;
  while ((await centre.textContent()) !== "dark") {
    expect(steps++, "the centre should turn dark within 15 moves").toBeLessThan(15);
    await canvas.scrollIntoViewIfNeeded();
    await page.getByRole("button", { name: "Fit all" }).click(); // keep the screen in sight as it goes downstream
    const from = await canvasPointFor(page, await positionOf(page, "screen-1"));
    const stepPx = 40 * from.pxPerMm;
    await page.mouse.move(from.x, from.y);
    await page.mouse.down();
    for (let i = 1; i <= 5; i++) await page.mouse.move(from.x + (i * stepPx) / 5, from.y);
    await page.mouse.up();
    await freshPredictions(page);
  }
  const darkAt = await positionOf(page, "screen-1");
  expect(darkAt).toBeGreaterThan(1200);
  await expect(page.getByTestId("save-status")).toHaveAttribute("data-state", "saved", { timeout: 15_000 });
  await page.screenshot({ path: "test-results/screenshots/editor-issue-dark.png", fullPage: true });

  // Make a revision of the dark setup (revision 2 kept; now revision 3), reload: the same drawing and predictions.
  await page.getByTestId("make-revision").click();
  await expect(page.getByTestId("revision-made")).toContainText("Revision 2 is kept as it is");
  await page.reload();
  await expect(row(page, "screen-1")).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId("revisions-panel")).toContainText("Revision 3");
  expect(await positionOf(page, "screen-1")).toBe(darkAt);
  await expect(row(page, "lens-1")).toContainText("f −50 mm");
  await expect(row(page, "iris-1")).toContainText("⌀ 2 mm");
  await freshPredictions(page);
  await expect(centre).toHaveText("dark");
  await row(page, "laser-1").click();
  await expect(page.getByTestId("register-entry-name")).toContainText(REGISTER_MODEL);
  await page.screenshot({ path: "test-results/screenshots/editor-issue-reloaded.png", fullPage: true });

  // Compare revisions 1 and 2 from the editor: the screen is marked as moved, with the distance, in shape and word.
  await page.getByTestId("compare-from").selectOption("1");
  await page.getByTestId("compare-to").selectOption("2");
  await page.getByTestId("compare-link").click();
  await page.waitForURL(/\/compare\?from=1&to=2$/, { timeout: 60_000 });
  const after = page.getByTestId("compare-drawing-to");
  await expect(after.locator('[data-element-id="screen-1"]')).toHaveAttribute("data-mark", "moved");
  await expect(after.locator('[data-element-id="screen-1"]')).toContainText(`↔ moved +${darkAt - 1000} mm`);
  await expect(after.locator('[data-ghost-of="screen-1"]')).toHaveCount(1);
  await expect(page.getByTestId("compare-drawing-from").locator('[data-element-id="screen-1"]')).toContainText("↔ moved");
  await expect(after.locator('[data-element-id="iris-1"]')).toHaveAttribute("data-mark", "");
  await expect(page.getByTestId("compare-summary")).toHaveText("1 moved.");
  await expect(page.getByTestId("revision-diff")).toContainText(`positionMm: 1000 → ${darkAt}`);
  await page.screenshot({ path: "test-results/screenshots/editor-compare.png", fullPage: true });
  expect(url).toContain("/benches/");
});
