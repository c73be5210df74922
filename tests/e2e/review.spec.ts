// The sign-off cycle in chromium: a researcher sends a bench for review, the officer's e-mail arrives
// in the mail catcher, the officer finds it in the queue, reads the review screen and signs off with a
// condition and the password; the researcher then sees it signed off, the technician sees it to build.
import AxeBuilder from "@axe-core/playwright";
import { expect as baseExpect, test, type Browser, type Page } from "@playwright/test";
import pg from "pg";
import { call, DEMO, DEMO_PASSWORD, signIn, waitForMail } from "../support/http";
import { createDrawnBench, databaseUrl, labIdByName, sampleBench } from "../support/review-fixtures";

// The dev server compiles a route on its first request; allow for that after each action.
const expect = baseExpect.configure({ timeout: 15_000 });
// the whole sign-off cycle in two browsers: minutes on a loaded two-core machine
test.setTimeout(180_000);

const title = `E2E iris bench ${Date.now().toString(36)}`;
const shots = "test-results/screenshots";
let revisionId = "";
let contentHash = "";

test.beforeAll(async () => {
  const pool = new pg.Pool({ connectionString: databaseUrl(), max: 1 });
  try {
    const researcher = await signIn(DEMO.researcher);
    const labId = await labIdByName(researcher.cookie, "Wrenfield Imaging Lab");
    const created = await createDrawnBench(pool, researcher.cookie, labId, sampleBench(title, { powerMw: 4 }));
    revisionId = created.revisionId;
    contentHash = created.contentHash;
  } finally {
    await pool.end();
  }
});

async function signedIn(browser: Browser, email: string): Promise<Page> {
  const context = await browser.newContext();
  const page = await context.newPage();
  await page.goto("/sign-in");
  await page.waitForLoadState("networkidle"); // the dev server hydrates late; a click before that would be lost
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("signed-in-name")).toBeVisible();
  return page;
}

test("a bench goes from draft to signed off in the browser", async ({ browser }) => {
  // The researcher sends the drawing for review.
  const researcher = await signedIn(browser, DEMO.researcher);
  await researcher.goto(`/reviews/${revisionId}`);
  await researcher.waitForLoadState("networkidle");
  await expect(researcher.getByRole("heading", { name: title })).toBeVisible();
  const control = researcher.getByTestId("submit-for-review");
  await expect(control.getByText("Draft")).toBeVisible();
  await control.getByRole("button", { name: "Send for review" }).click();
  await expect(control.getByText("Waiting for review")).toBeVisible();
  await expect(control.getByRole("button", { name: "Withdraw from review" })).toBeVisible();
  await researcher.screenshot({ path: `${shots}/review-1-researcher-sent.png`, fullPage: true });

  // The officer's e-mail names the bench and hash and links to this exact revision.
  const mail = await waitForMail(DEMO.officer, new RegExp(`Waiting for your review: ${title}`));
  expect(mail.text).toContain(contentHash);
  const link = mail.text.match(/https?:\/\/\S+\/reviews\/[0-9a-f-]+/)![0];
  expect(new URL(link).pathname).toBe(`/reviews/${revisionId}`);

  // The officer finds it in the queue and opens the review screen.
  const officer = await signedIn(browser, DEMO.officer);
  await officer.goto("/reviews");
  const queue = officer.getByTestId("review-queue");
  await expect(queue.getByRole("link", { name: title })).toBeVisible();
  await officer.screenshot({ path: `${shots}/review-2-queue.png`, fullPage: true });
  await queue.getByRole("link", { name: title }).click();
  await expect(officer).toHaveURL(new RegExp(`/reviews/${revisionId}$`));
  await expect(officer.getByRole("heading", { name: "Laser hazard" })).toBeVisible();
  await expect(officer.getByTestId("hazard-panel").getByText(/^Class (1|1M|2|2M|3R|3B|4)$/)).toBeVisible();
  await expect(officer.getByText("Eyewear (highest need on the bench)")).toBeVisible();
  await expect(officer.getByRole("img", { name: /Side view of the bench/ })).toBeVisible();
  await expect(officer.getByText(/No earlier revision of this bench was signed off/)).toBeVisible();
  await officer.screenshot({ path: `${shots}/review-3-review-screen.png`, fullPage: true });

  // A comment pinned to the iris, then the sign-off: a wrong password signs nothing.
  await officer.waitForLoadState("networkidle");
  await officer.getByLabel("New comment").fill("Please confirm the iris is on a lockable mount.");
  await officer.getByLabel("About").selectOption("iris-1");
  await expect(officer.getByRole("button", { name: "Add the comment" })).toBeEnabled();
  await Promise.all([
    officer.waitForResponse((r) => r.url().endsWith(`/api/revisions/${revisionId}/comments`) && r.request().method() === "POST"),
    officer.getByRole("button", { name: "Add the comment" }).click(),
  ]);
  await expect(officer.getByTestId("comment-threads").getByText("◎ About iris-1")).toBeVisible();

  await expect(officer.getByRole("radio", { name: /Sign off/ })).toBeChecked();
  await officer.getByLabel("Conditions (optional)").fill("Eyewear OD 2 at 633 nm for everyone in the room; door interlock on.");
  await officer.getByLabel("Your password, to sign").fill("not-the-password");
  await officer.getByRole("button", { name: "Sign off this revision" }).click();
  await expect(officer.getByText("The password is not right")).toBeVisible();
  await officer.screenshot({ path: `${shots}/review-4-wrong-password.png` });
  await officer.getByLabel("Your password, to sign").fill(DEMO_PASSWORD);
  await officer.getByRole("button", { name: "Sign off this revision" }).click();
  const record = officer.getByTestId("decision-record");
  await expect(record.getByRole("heading", { name: "● Signed off" })).toBeVisible();
  await expect(record.getByText("Rafe Dunmore, Laser safety officer")).toBeVisible();
  await expect(record.getByTestId("decision-conditions")).toHaveText(/Eyewear OD 2 at 633 nm/);
  await expect(officer.getByRole("button", { name: "Sign off this revision" })).toHaveCount(0);
  await officer.screenshot({ path: `${shots}/review-5-signed-off.png`, fullPage: true });

  // The researcher sees it signed off with the condition; the e-mail says the same.
  await researcher.reload();
  await expect(researcher.locator("header").getByText("Signed off")).toBeVisible();
  await expect(researcher.getByTestId("decision-conditions")).toHaveText(/door interlock on/);
  await researcher.screenshot({ path: `${shots}/review-6-researcher-sees.png`, fullPage: true });
  const decided = await waitForMail(DEMO.researcher, new RegExp(`Signed off: ${title}`));
  expect(decided.html).toContain("door interlock on");

  // The technician of the lab sees it among the benches to build.
  const technician = await signedIn(browser, DEMO.technician);
  await expect(technician.getByTestId("home-technician").getByRole("link", { name: title })).toBeVisible();
  const res = await call("GET", `/api/revisions/${revisionId}`, (await signIn(DEMO.technician)).cookie);
  expect((res.json!.revision as { state: string }).state).toBe("approved");
});

test("the review screen of a table shows the plan, its hazard zone, the open beam in red and where every beam ends", async ({ browser }) => {
  // The demo data's two-laser table waits for review: its violet splitter lets half the beam run off the right edge.
  const cookie = (await signIn(DEMO.researcher)).cookie;
  const benches = (await call("GET", "/api/benches", cookie)).json!.benches as { id: string; title: string }[];
  const table = benches.find((b) => b.title === "Two lasers on the imperial breadboard");
  expect(table, "the demo data holds the two-laser table").toBeTruthy();
  const detail = (await call("GET", `/api/benches/${table!.id}`, cookie)).json as { revisions: { id: string; state: string }[] };
  const waiting = detail.revisions.find((r) => r.state === "submitted")!;

  const officer = await signedIn(browser, DEMO.officer);
  await officer.setViewportSize({ width: 1280, height: 900 });
  await officer.goto(`/reviews/${waiting.id}`);
  await expect(officer.getByRole("heading", { name: "Two lasers on the imperial breadboard" })).toBeVisible();
  const plan = officer.getByTestId("review-table-plan");
  await expect(plan).toBeVisible();
  // readable: the plan spans most of the main column
  expect((await plan.boundingBox())!.width).toBeGreaterThan(600);
  await expect(plan.locator("[data-nhz-path]")).toHaveCount(1);
  const open = officer.locator('[data-open-beam][data-exceeds-mpe="true"]');
  await expect(open).toHaveCount(1);
  await expect(open).toContainText("Open beam above the MPE");
  await expect(open).toContainText("from beam splitter BS2");
  await expect(open).toContainText(/Leaves the right edge at .* heading to the right \(\+x\), 0°; 2\.5\d* mW; NOHD/);
  // the HeNe window's two weak ghosts leave the table too, but within the MPE
  await expect(officer.locator('[data-open-beam][data-exceeds-mpe="false"]')).toHaveCount(2);
  await expect(officer.getByTestId("beam-ends")).toContainText("ends on beam block violet-block");
  await expect(officer.getByTestId("beam-ends")).toContainText("ends on screen red-screen");
  await expect(officer.getByTestId("path-table").locator('tr[data-band="above-mpe"]').first()).toBeVisible();
  await expect(officer.getByTestId("final-say").first()).toBeVisible();
  // each laser's line says its regime (both continuous here), and the line figures' sources are on the screen, not yet checked
  const regime = officer.getByTestId("pulse-regime").getByTestId("pulse-regime-line");
  await expect(regime).toHaveCount(2);
  await expect(regime.nth(0)).toContainText("hene, 632.8 nm: Continuous-wave — 2 mW");
  await expect(regime.nth(1)).toContainText("violet, 405 nm: Continuous-wave — 5 mW");
  const sources = officer.getByTestId("line-sources");
  await expect(sources).toContainText("ANSI Z136.1-2014 Table 5a");
  await expect(sources).toContainText("not yet checked against the standard's text — confirm with your laser safety officer");
  await expect(officer.getByTestId("hazard-panel")).not.toContainText(/from memory|recalled|\.ts\b/);
  await officer.screenshot({ path: `${shots}/review-table-screen.png`, fullPage: true });
  await plan.screenshot({ path: `${shots}/review-table-plan.png` });
  // no serious accessibility problem on the table's review screen (axe, WCAG 2.1 A and AA)
  const results = await new AxeBuilder({ page: officer }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  const bad = results.violations.filter((v) => v.impact === "serious" || v.impact === "critical");
  expect(bad.map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(" ")).join(" | ")}`)).toEqual([]);
});
