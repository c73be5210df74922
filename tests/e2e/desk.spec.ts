// The auditor's desk and the laser register in chromium: the auditor filters to sign-offs that
// expire soon, opens one, reads its trail and exports CSV; the officer registers a laser and a
// researcher of that lab finds it in the register. Screenshots: test-results/screenshots/desk-*.png, register-*.png.
import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { expect, test, type Page } from "@playwright/test";
import pg from "pg";
import { databaseUrl } from "../support/review-fixtures";

const PASSWORD = "northmere-demo-2026";
const marker = `e2e${Date.now().toString(36)}`;
const title = `Knife-edge profile of the 532 nm probe ${marker}`;
const conditions = "Eyewear OD 3 at 532 nm for everyone in the room; beam enclosure closed.";
const laserModel = `Northmere Photonics GL-50 ${marker}`;
let pool: pg.Pool;
let hash = "";

async function signIn(page: Page, who: string, section: string) {
  await page.goto("/sign-in");
  await page.waitForLoadState("networkidle"); // the form submits through React once hydrated
  await page.getByLabel("E-mail").fill(`${who}@northmere.example.edu`);
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId(section)).toBeVisible({ timeout: 30_000 });
}

test.beforeAll(async () => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 1 });
  // A sign-off that ends in 12 days, signed by the demo officer on a bench of the demo researcher.
  const { rows } = await pool.query<{ lab: string; author: string; officer: string; officer_name: string; technician: string }>(
    `select (select id from lab where name = 'Wrenfield Imaging Lab') as lab,
            (select id from "user" where email = 'technician@northmere.example.edu') as technician,
            (select id from "user" where email = 'researcher@northmere.example.edu') as author,
            (select id from "user" where email = 'officer@northmere.example.edu') as officer,
            (select name from "user" where email = 'officer@northmere.example.edu') as officer_name`,
  );
  const { lab, author, officer, officer_name, technician } = rows[0];
  const benchId = randomUUID();
  const revisionId = randomUUID();
  hash = randomUUID().replace(/-/g, "") + randomUUID().replace(/-/g, "");
  const doc = { version: 1, title, elements: [{ id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 532, powerMw: 4, beamDiameterMm: 1 }] };
  const day = 86_400_000;
  await pool.query("insert into bench (id, lab_id, title, author_id, created_at) values ($1, $2, $3, $4, $5)", [benchId, lab, title, author, new Date(Date.now() - 360 * day)]);
  await pool.query("insert into bench_revision (id, bench_id, number, document, content_hash, state, created_by, created_at) values ($1, $2, 1, $3, $4, 'approved', $5, $6)", [revisionId, benchId, JSON.stringify(doc), hash, author, new Date(Date.now() - 360 * day)]);
  await pool.query(
    `insert into audit_event (actor_id, actor_role, action, bench_id, revision_id, content_hash, detail, at) values ($1, 'researcher', 'review-submitted', $2, $3, $4, '{"from":"draft","to":"submitted","number":1}', $5)`,
    [author, benchId, revisionId, hash, new Date(Date.now() - 355 * day)],
  );
  await pool.query(
    `insert into review_comment (revision_id, bench_id, thread_id, author_id, author_name, author_role, body, created_at) values ($1, $2, gen_random_uuid(), $3, $4, 'Laser safety officer', 'Where does the beam end after the razor blade?', $5)`,
    [revisionId, benchId, officer, officer_name, new Date(Date.now() - 354 * day)],
  );
  await pool.query(
    `insert into review_decision (revision_id, bench_id, outcome, signer_id, signer_name, signer_role, meaning, conditions, valid_until, content_hash, hazard_summary, step_up_verified, decided_at)
     values ($1, $2, 'approved', $3, $4, 'Laser safety officer', 'Approved for operation as drawn, with the conditions listed.', $5, $6, $7, '{"hazardClass":{"value":"3R"}}', true, $8)`,
    [revisionId, benchId, officer, officer_name, conditions, new Date(Date.now() + 12 * day), hash, new Date(Date.now() - 353 * day)],
  );
  // A build of it whose screen photo, once read, showed the screen further back than drawn: a mismatch.
  const build = await pool.query<{ id: string }>("insert into build_record (revision_id, bench_id, content_hash, technician_id) values ($1, $2, $3, $4) returning id", [revisionId, benchId, hash, technician]);
  const buildId = build.rows[0].id;
  const observation = await pool.query<{ id: string }>(
    "insert into build_observation (build_id, aperture_id, centre_seen, centre_predicted, mismatch, reasons, recorded_by) values ($1, 'iris-1', 'bright', 'bright', true, $2, $3) returning id",
    [buildId, JSON.stringify(["Screen distance: drawn 500 mm behind iris, the photo's pattern fits 640 mm (140 mm further; allowed ±15 mm)"]), technician],
  );
  const upload = await pool.query<{ id: string }>(
    "insert into upload (build_id, kind, file_name, content_type, size_bytes, sha256, storage_key, uploaded_by) values ($1, 'screen-photo', 'screen.png', 'image/png', 1, 'x', 'uploads/none.png', $2) returning id",
    [buildId, technician],
  );
  await pool.query("insert into photo_reading (build_id, upload_id, aperture_id, observation_id, result, prediction_engine, read_by) values ($1, $2, 'iris-1', $3, '{}', 'test', $4)", [buildId, upload.rows[0].id, observation.rows[0].id, technician]);
});

test.afterAll(async () => {
  await pool.query("delete from laser_register where model = $1", [laserModel]);
  await pool.end();
});

test("the auditor filters to sign-offs expiring soon, reads a trail and exports CSV", async ({ page }) => {
  await signIn(page, "auditor", "home-auditor");
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Sign-off desk" }).click();
  await expect(page.getByRole("heading", { name: "Sign-off desk" })).toBeVisible();
  await page.screenshot({ path: "test-results/screenshots/desk-all.png", fullPage: true });

  await page.getByLabel("Expiring within (days)").fill("30");
  await page.getByRole("button", { name: "Apply the filters" }).click();
  await expect(page).toHaveURL(/expiring=30/);
  const table = page.getByTestId("approvals-table");
  await expect(table.getByRole("link", { name: title })).toBeVisible();
  await expect(table.getByText(/1[12] days left/).first()).toBeVisible();
  await page.getByLabel("Bench title contains").fill(marker);
  await page.getByRole("button", { name: "Apply the filters" }).click();
  await expect(page.getByTestId("desk-count")).toHaveText("Showing 1–1 of 1 sign-off.");
  await page.screenshot({ path: "test-results/screenshots/desk-expiring.png", fullPage: true });
  // The build's photo reading found a mismatch: the row says so in words, with the count, and the filter finds it.
  await expect(table.getByTestId("desk-mismatch")).toContainText("1 observation differs from the prediction");
  await expect(table.getByTestId("desk-mismatch")).toContainText("1 build, read from a screen photo");
  await expect(page.getByTestId("desk-mismatch-total")).toContainText("1 of these sign-offs has a build whose observation (typed, or read from a screen photo) differs from the prediction.");
  await page.getByTestId("desk-mismatch-total").getByRole("button", { name: "Show only those" }).click();
  await expect(page).toHaveURL(/builds=mismatch/);
  await expect(page.getByRole("combobox", { name: "Builds", exact: true })).toHaveValue("mismatch");
  await expect(page.getByTestId("desk-count")).toHaveText("Showing 1–1 of 1 sign-off.");
  await page.screenshot({ path: "test-results/screenshots/desk-mismatch.png", fullPage: true });

  const approvals = page.waitForEvent("download");
  await page.getByTestId("export-approvals").click();
  const csv = readFileSync((await (await approvals).path())!, "utf8");
  expect(csv.trimEnd().split("\r\n")).toHaveLength(2);
  expect(csv).toContain(title);
  expect(csv).toContain(hash);

  await table.getByRole("link", { name: title }).click();
  await expect(page.getByRole("heading", { name: title })).toBeVisible();
  const decision = page.getByTestId("trail-decision");
  await expect(decision).toContainText("Approved for operation as drawn, with the conditions listed.");
  await expect(decision).toContainText(conditions);
  await expect(decision).toContainText(hash);
  await expect(page.getByText("Where does the beam end after the razor blade?")).toBeVisible();
  await page.screenshot({ path: "test-results/screenshots/desk-trail.png", fullPage: true });

  const trail = page.waitForEvent("download");
  await page.getByTestId("export-trail").click();
  const trailCsv = readFileSync((await (await trail).path())!, "utf8");
  expect(trailCsv).toContain("decision");
  expect(trailCsv).toContain(conditions);
});

test("the officer registers a laser and a researcher of the lab finds it in the register", async ({ page }) => {
  const officer = page;
  await signIn(officer, "officer", "home-officer");
  await officer.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Lasers" }).click();
  await officer.getByRole("link", { name: "Register a laser" }).click();
  await officer.getByLabel("Manufacturer and model").fill(laserModel);
  await officer.getByLabel("Serial number").fill(`GL50-${marker}`);
  await officer.getByLabel("Lab", { exact: true }).selectOption({ label: "Wrenfield Imaging Lab" });
  await officer.getByLabel("Location (room, table)").fill("Harbour Building B214, table 1");
  await officer.getByLabel("Class on the label").selectOption("2");
  await officer.getByLabel("Wavelengths (nm)").fill("532");
  await officer.getByLabel("Maximum power (mW)").fill("5");
  await officer.getByLabel("Beam diameter (mm, 1/e²)").fill("1");
  await officer.getByLabel("Divergence (mrad, 1/e² full angle)").fill("1.2");
  await officer.getByLabel("Responsible person").selectOption({ label: "Dr. Alba Quennell" });
  await officer.screenshot({ path: "test-results/screenshots/register-new.png", fullPage: true });
  await officer.getByRole("button", { name: "Register the laser" }).click();
  await expect(officer.getByRole("heading", { name: laserModel })).toBeVisible({ timeout: 30_000 });
  // 5 mW at 532 nm is above the Class 2 limit: the estimate differs and says so; the label stays 2.
  await expect(officer.getByTestId("class-mismatch")).toContainText("Label 2 · estimate 3R");
  await officer.screenshot({ path: "test-results/screenshots/register-detail.png", fullPage: true });
  await page.context().clearCookies();

  const researcher = page;
  await signIn(researcher, "researcher", "home-researcher");
  await researcher.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Lasers" }).click();
  const row = researcher.getByTestId("laser-table").getByRole("row", { name: new RegExp(laserModel) });
  await expect(row).toBeVisible();
  await expect(row).toContainText("532 nm");
  await expect(row).toContainText("In service");
  await expect(researcher.getByRole("link", { name: "Register a laser" })).toHaveCount(0);
  await researcher.screenshot({ path: "test-results/screenshots/register-list.png", fullPage: true });
});
