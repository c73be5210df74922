// The table editor in chromium: a researcher starts a bench on an optical table, places a laser, folds its beam with
// a mirror (clicked in, then dragged along the beam with the mouse), adds a beam splitter and moves and turns it with the
// keyboard, raises the laser's power, sees the red open-beam warning for the two arms that leave the table, clicks a beam
// for its figures, drops beam blocks onto the arms from the palette and sees the warning cleared, then reloads and finds
// the table as it was. Also: a rail bench moved onto a table, and an element typed off the table named in a clear message.
// Screenshots go to test-results/screenshots/table-editor-*.png.
import { expect, test, type Page } from "@playwright/test";

const PASSWORD = "northmere-demo-2026";

test.describe.configure({ mode: "serial" });
test.setTimeout(240_000);

async function signIn(page: Page, email: string) {
  await page.goto("/sign-in", { timeout: 120_000 });
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"), { timeout: 60_000 });
}

/** The page point of a table point (mm from the left front corner, y away from the viewer). */
async function at(page: Page, xMm: number, yMm: number) {
  const frame = page.getByTestId("table-canvas");
  const box = (await frame.boundingBox())!;
  const s = Number(await frame.getAttribute("data-px-per-mm"));
  const left = Number(await frame.getAttribute("data-left-px"));
  const top = Number(await frame.getAttribute("data-top-px"));
  const depth = Number(await frame.getAttribute("data-depth-mm"));
  return { x: box.x + left + xMm * s, y: box.y + top + (depth - yMm) * s };
}

async function field(page: Page, key: string) {
  return page.locator(`#table-field-${key}`);
}

async function expectPlace(page: Page, xMm: number, yMm: number, angleDeg?: number) {
  await expect(await field(page, "xMm")).toHaveValue(String(xMm));
  await expect(await field(page, "yMm")).toHaveValue(String(yMm));
  if (angleDeg !== undefined) await expect(await field(page, "angleDeg")).toHaveValue(String(angleDeg));
}

async function shot(page: Page, name: string) {
  await page.screenshot({ path: `test-results/screenshots/table-editor-${name}.png`, fullPage: true });
}

let benchUrl = "";

test("a researcher draws a folded, split bench on a table, blocks its open beams and finds it saved", async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 1000 });
  await signIn(page, "researcher@northmere.example.edu");
  await page.goto("/benches/new", { timeout: 120_000 });
  await page.getByLabel("Title").fill(`Table e2e ${Date.now()}`);
  await page.getByLabel("Drawn on").selectOption("table-metric"); // 1200 × 900 mm, holes every 25 mm
  await page.getByRole("button", { name: "Create and open the editor" }).click();
  await page.waitForURL(/\/benches\/[0-9a-f-]{36}$/, { timeout: 120_000 });
  benchUrl = page.url();
  await expect(page.getByTestId("table-editor")).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId("table-canvas").locator("canvas").first()).toBeVisible({ timeout: 60_000 });

  // A laser (ad hoc) at the left, on a hole, aiming +x; its power raised to 20 mW in the properties.
  await page.getByTestId("table-palette-laser").click();
  await page.getByTestId("laser-ad-hoc").click();
  await expectPlace(page, 162.5, 462.5, 0);
  await (await field(page, "powerMw")).fill("20");
  await (await field(page, "powerMw")).press("Tab");
  // the laser's own panels, as on the rail: its (absent) register link and its further lines
  await expect(page.getByTestId("register-entry")).toHaveAttribute("data-linked", "false");
  await expect(page.getByTestId("laser-lines").getByRole("button", { name: "Add a further line" })).toBeVisible();

  // A mirror clicked in lands on the beam, turned 135° so the beam folds to +y (away from the viewer).
  await page.getByTestId("table-palette-mirror").click();
  await expectPlace(page, 212.5, 462.5, 135);
  // Dragged with the mouse along the beam to x ≈ 410 mm, a little off the axis: it snaps onto the beam, on a hole.
  const from = await at(page, 212.5, 462.5);
  const to = await at(page, 408, 466);
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  for (let i = 1; i <= 12; i++) await page.mouse.move(from.x + ((to.x - from.x) * i) / 12, from.y + ((to.y - from.y) * i) / 12);
  await page.mouse.up();
  await expectPlace(page, 412.5, 462.5, 135);
  // Its turning handle (42 px out along the normal) dragged round to the left gives 180°, and back gives 135° again.
  const centre = await at(page, 412.5, 462.5);
  const handle = (deg: number) => ({ x: centre.x + Math.cos((deg * Math.PI) / 180) * 42, y: centre.y - Math.sin((deg * Math.PI) / 180) * 42 });
  const turnHandle = async (fromDeg: number, toDeg: number) => {
    const a = handle(fromDeg);
    await page.mouse.move(a.x, a.y);
    await page.mouse.down();
    for (let i = 1; i <= 8; i++) {
      const b = handle(fromDeg + ((toDeg - fromDeg) * i) / 8);
      await page.mouse.move(b.x, b.y);
    }
    await page.mouse.up();
  };
  await turnHandle(135, 178);
  await expect(await field(page, "angleDeg")).toHaveValue("180");
  await turnHandle(180, 133);
  await expect(await field(page, "angleDeg")).toHaveValue("135");

  // A beam splitter clicked in goes onto the folded beam; the keyboard moves it four holes up and turns it twice by 45°.
  await page.getByTestId("table-palette-beam-splitter").click();
  await expectPlace(page, 412.5, 512.5, 225);
  const canvas = page.getByTestId("table-canvas");
  await canvas.focus();
  for (let i = 0; i < 4; i++) await page.keyboard.press("ArrowUp");
  await page.keyboard.press("r");
  await page.keyboard.press("r");
  await expectPlace(page, 412.5, 612.5, 315);
  // and a fine turn there and back: 1° each way
  await page.keyboard.press("BracketRight");
  await expect(await field(page, "angleDeg")).toHaveValue("316");
  await page.keyboard.press("BracketLeft");
  await expect(await field(page, "angleDeg")).toHaveValue("315");

  // Two arms leave the table above the MPE: the red warning names both, with power and NOHD.
  const warning = page.getByTestId("open-beam-warning");
  await expect(warning).toBeVisible({ timeout: 30_000 });
  await expect(warning).toContainText("2 beams above the MPE leave the table");
  await expect(warning).toContainText("the right edge");
  await expect(warning).toContainText("the back edge");
  await expect(warning).toContainText("NOHD");
  await expect(page.getByTestId("final-say")).toBeVisible();
  await expect(page.getByTestId("predictions")).toHaveAttribute("data-source", "server", { timeout: 30_000 });
  await shot(page, "open-beams");

  // Click the arm going right for its figures: about 20 mW × 0.99 × 0.5.
  const arm = await at(page, 650, 612.5);
  await page.mouse.click(arm.x, arm.y);
  await expect(page.getByTestId("beam-figures")).toBeVisible();
  await expect(page.getByTestId("beam-power")).toHaveText("9.9 mW");
  await expect(page.getByTestId("beam-band")).toContainText("above the MPE");

  // Beam blocks dragged from the palette onto each arm: each goes onto the beam and faces it.
  const blockOn = async (xMm: number, yMm: number) => {
    const p = await at(page, xMm, yMm);
    const box = (await canvas.boundingBox())!;
    await page.getByTestId("table-palette-beam-block").dragTo(canvas, { targetPosition: { x: p.x - box.x, y: p.y - box.y } });
  };
  await blockOn(1112.5, 615);
  await expectPlace(page, 1112.5, 612.5, 180);
  await expect(warning).toContainText("A beam above the MPE leaves the table", { timeout: 30_000 });
  await blockOn(410, 862.5);
  await expectPlace(page, 412.5, 862.5, 270);
  await expect(warning).toBeHidden({ timeout: 30_000 });
  await expect(page.getByTestId("no-open-beam")).toBeVisible();
  await expect(page.getByTestId("predictions")).toHaveAttribute("data-source", "server", { timeout: 30_000 });
  await expect(page.getByTestId("save-status")).toHaveAttribute("data-state", "saved", { timeout: 30_000 });
  await shot(page, "blocked");

  // Reload: the table comes back as saved, from the server.
  await page.reload({ timeout: 120_000 });
  await expect(page.getByTestId("table-editor")).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId("no-open-beam")).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId("table-canvas")).toHaveAttribute("data-beams", /p1:above-mpe/);
  // every element is there: select all and read the list
  await page.getByTestId("table-canvas").focus();
  await page.keyboard.press("Control+a");
  await expect(page.getByTestId("properties")).toContainText("5 elements selected: laser-1, mirror-1, splitter-1, block-1, block-2");
  await shot(page, "reloaded");

  // The table keeps revisions as a rail does: make one, and the next change is listed against what was last sent.
  await expect(page.getByTestId("changes-since-review")).toContainText("No revision of this bench has been sent for review yet, so everything on the table is new");
  await page.getByTestId("make-revision").click();
  await expect(page.getByTestId("revision-made")).toContainText("revision 2", { timeout: 30_000 });
  await expect(page.getByTestId("compare-revisions")).toBeVisible();
});

test("bad input: an element typed off the table, two elements on one spot — each named in a clear message, nothing lost", async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 1000 });
  await signIn(page, "researcher@northmere.example.edu");
  await page.goto(benchUrl, { timeout: 120_000 });
  await expect(page.getByTestId("table-editor")).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId("table-canvas").locator("canvas").first()).toBeVisible({ timeout: 60_000 });
  const block = await at(page, 1112.5, 612.5);
  await page.mouse.click(block.x, block.y);
  await expect(page.getByTestId("properties")).toContainText("block-1");
  // typed off the table: the reason beside the field names the element; the value is not taken
  await (await field(page, "xMm")).fill("1250");
  await (await field(page, "xMm")).press("Tab");
  await expect(page.getByTestId("properties")).toContainText('Beam block "block-1" at (1250, 612.5) mm is off the table');
  await expect(page.getByTestId("table-problems")).toHaveCount(0);
  // moved by keys onto the splitter's hole: the drawing keeps it, says why it cannot be saved, and the way back is one key away
  await (await field(page, "xMm")).fill("1112.5");
  await (await field(page, "xMm")).press("Tab");
  const otherBlock = await at(page, 412.5, 862.5);
  await page.mouse.click(otherBlock.x, otherBlock.y);
  await expect(page.getByTestId("properties")).toContainText("block-2");
  for (let i = 0; i < 10; i++) await page.keyboard.press("ArrowDown");
  await expect(page.getByTestId("table-problems")).toContainText('Beam block "block-2" and beam splitter "splitter-1" stand on the same spot (412.5, 612.5) mm');
  await expect(page.getByTestId("save-status")).toHaveAttribute("data-state", "invalid");
  await shot(page, "same-spot");
  for (let i = 0; i < 10; i++) await page.keyboard.press("ArrowUp");
  await expect(page.getByTestId("table-problems")).toHaveCount(0);
  await expect(page.getByTestId("save-status")).toHaveAttribute("data-state", "saved", { timeout: 30_000 });
});

test("a rail bench moves onto a table as a straight beam along +x", async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 1000 });
  await signIn(page, "researcher@northmere.example.edu");
  await page.goto("/benches/new", { timeout: 120_000 });
  await page.getByLabel("Title").fill(`Rail to table e2e ${Date.now()}`);
  await page.getByRole("button", { name: "Create and open the editor" }).click();
  await page.waitForURL(/\/benches\/[0-9a-f-]{36}$/, { timeout: 120_000 });
  await expect(page.getByTestId("bench-editor")).toBeVisible({ timeout: 60_000 });
  await page.getByTestId("palette-laser").click();
  await page.getByTestId("laser-ad-hoc").click();
  await page.getByTestId("palette-screen").click();
  await expect(page.getByTestId("save-status")).toHaveAttribute("data-state", "saved", { timeout: 30_000 });
  await page.getByTestId("move-to-table").click();
  await expect(page.getByTestId("table-editor")).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId("save-status")).toHaveAttribute("data-state", "saved", { timeout: 30_000 });
  await page.reload({ timeout: 120_000 });
  await expect(page.getByTestId("table-editor")).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId("table-canvas")).toHaveAttribute("data-beams", /^p1:(below|above)-mpe$/, { timeout: 30_000 });
  await shot(page, "from-rail");
});
