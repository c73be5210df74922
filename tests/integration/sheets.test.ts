// The build sheet over HTTP against the running server: request a sheet of a signed-off revision, poll the
// job until it is ready, download the PDF (audited), the second request reuses it, pdftoppm renders page 1,
// the PDF's text holds every part, the hash and the approval; verification by hash; refusals in words.
import { execFileSync } from "node:child_process";
import { existsSync, mkdirSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { APP_URL, call, DEMO, DEMO_PASSWORD, signIn } from "../support/http";
import { createDrawnBench, databaseUrl, labIdByName, sampleBench } from "../support/review-fixtures";

const run = Date.now().toString(36);
const outDir = path.resolve(import.meta.dirname, "../../test-results/sheets");
let pool: pg.Pool;
const cookie = {} as Record<"researcher" | "officer" | "technician" | "auditor" | "student", string>;
let approved: { revisionId: string; contentHash: string; benchId: string };
const title = `Sheet bench ${run}`;

type Json = Record<string, unknown>;
type Sheet = { id: string; state: string; progressPercent: number; error: string | null; downloadUrl: string | null };

async function approvedRevision(t: string) {
  const labId = await labIdByName(cookie.researcher, "Coherent Imaging Lab");
  const b = await createDrawnBench(pool, cookie.researcher, labId, sampleBench(t));
  expect((await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, { contentHash: b.contentHash })).status).toBe(200);
  const decided = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "approve", contentHash: b.contentHash, password: DEMO_PASSWORD, conditions: "Beam enclosure closed during use." });
  expect(decided.status, decided.text).toBe(201);
  return b;
}

async function waitReady(revisionId: string, who: string, paper = "A4"): Promise<{ sheet: Sheet; seen: number[] }> {
  const seen: number[] = [];
  const deadline = Date.now() + 150_000;
  for (;;) {
    const res = await call("GET", `/api/revisions/${revisionId}/sheet?paper=${paper}`, who);
    expect(res.status, res.text).toBe(200);
    const sheet = res.json!.sheet as Sheet;
    seen.push(sheet.progressPercent);
    if (sheet.state === "ready" || sheet.state === "failed") return { sheet, seen };
    if (Date.now() > deadline) throw new Error(`sheet not ready: ${JSON.stringify(sheet)}`);
    await new Promise((r) => setTimeout(r, 500));
  }
}

beforeAll(async () => {
  pool = new pg.Pool({ connectionString: databaseUrl(), max: 2 });
  for (const key of ["researcher", "officer", "technician", "auditor", "student"] as const) {
    const s = await signIn(DEMO[key]);
    expect(s.status, `${key} signs in`).toBe(200);
    cookie[key] = s.cookie;
  }
  approved = await approvedRevision(title);
  mkdirSync(outDir, { recursive: true });
}, 60_000);

afterAll(async () => {
  await pool?.end();
});

describe("the build sheet PDF", () => {
  let sheetId = "";
  let pdf: Buffer;

  it("is made as a job: 202, progress, then ready", async () => {
    const res = await call("POST", `/api/revisions/${approved.revisionId}/sheet`, cookie.technician, { paper: "A4" });
    expect([200, 202], res.text).toContain(res.status);
    const first = res.json!.sheet as Sheet;
    expect(res.json!.reused).toBe(false);
    expect(["queued", "rendering"]).toContain(first.state);
    const { sheet } = await waitReady(approved.revisionId, cookie.technician);
    expect(sheet.error).toBeNull();
    expect(sheet.state).toBe("ready");
    expect(sheet.progressPercent).toBe(100);
    expect(sheet.downloadUrl).toBe(`/api/sheets/${sheet.id}/download`);
    sheetId = sheet.id;
  }, 180_000);

  it("downloads as a PDF, and the download is audited as an export", async () => {
    const res = await fetch(`${APP_URL}/api/sheets/${sheetId}/download`, { headers: { cookie: cookie.technician } });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    expect(res.headers.get("content-disposition")).toMatch(/attachment; filename="build-sheet-.*\.pdf"/);
    pdf = Buffer.from(await res.arrayBuffer());
    expect(pdf.subarray(0, 4).toString("latin1")).toBe("%PDF");
    const { rows } = await pool.query("select action, detail from audit_event where revision_id = $1 and action = 'build-sheet-exported'", [approved.revisionId]);
    expect(rows.length).toBeGreaterThanOrEqual(1);
    expect(rows[0].detail.sheetId).toBe(sheetId);
  });

  it("is cached: a second request reuses the ready sheet", async () => {
    const again = await call("POST", `/api/revisions/${approved.revisionId}/sheet`, cookie.auditor, { paper: "A4" });
    expect(again.status, again.text).toBe(200);
    expect(again.json!.reused).toBe(true);
    expect((again.json!.sheet as Sheet).id).toBe(sheetId);
    expect((again.json!.sheet as Sheet).state).toBe("ready");
  });

  it("renders page 1 with pdftoppm, and its text holds every part, the hash and the approval", () => {
    const file = path.join(outDir, `sheet-${run}.pdf`);
    writeFileSync(file, pdf);
    const prefix = path.join(outDir, `sheet-${run}`);
    execFileSync("pdftoppm", ["-png", "-r", "60", "-f", "1", "-l", "1", file, prefix]);
    const png = [`${prefix}-1.png`, `${prefix}-01.png`].find((p) => existsSync(p));
    expect(png, "pdftoppm wrote page 1").toBeTruthy();
    expect(statSync(png!).size).toBeGreaterThan(1000);
    const text = execFileSync("pdftotext", ["-layout", file, "-"]).toString();
    for (const part of ["laser-1", "lens-1", "iris-1", "screen-1"]) expect(text).toContain(part);
    expect(text.replace(/\s+/g, "")).toContain(approved.contentHash);
    expect(text).toContain("Beam enclosure closed during use.");
    expect(text).toMatch(/Officer/);
    expect(text).toMatch(/Uncontrolled when printed — check the online record/);
    expect(text).toMatch(/Page 1 of \d/);
    expect(text).toMatch(/laser safety officer and local regulations decide/);
  });

  it("Letter paper is a separate job", async () => {
    const res = await call("POST", `/api/revisions/${approved.revisionId}/sheet`, cookie.technician, { paper: "Letter" });
    expect(res.status).toBe(202);
    const { sheet } = await waitReady(approved.revisionId, cookie.technician, "Letter");
    expect(sheet.state).toBe("ready");
    expect(sheet.id).not.toBe(sheetId);
  }, 180_000);

  it("refuses a sheet of a revision that is not signed off, and hides other labs' revisions", async () => {
    const labId = await labIdByName(cookie.researcher, "Coherent Imaging Lab");
    const draft = await createDrawnBench(pool, cookie.researcher, labId, sampleBench(`Draft sheet ${run}`));
    const res = await call("POST", `/api/revisions/${draft.revisionId}/sheet`, cookie.technician, { paper: "A4" });
    expect(res.status).toBe(409);
    expect((res.json!.error as Json).message).toMatch(/not signed off/);
    const other = await call("POST", `/api/revisions/${approved.revisionId}/sheet`, cookie.student, { paper: "A4" });
    expect(other.status).toBe(404);
    const anonymous = await call("POST", `/api/revisions/${approved.revisionId}/sheet`, undefined, { paper: "A4" });
    expect(anonymous.status).toBe(401);
    const bad = await call("POST", `/api/revisions/${approved.revisionId}/sheet`, cookie.technician, { paper: "A3" });
    expect(bad.status).toBe(400);
  });

  it("the print route needs a session", async () => {
    const res = await fetch(`${APP_URL}/print/sheets/${approved.revisionId}`, { redirect: "manual" });
    expect([302, 303, 307, 308]).toContain(res.status);
    expect(res.headers.get("location")).toMatch(/\/sign-in/);
  });
});

describe("verifying a sheet by its hash", () => {
  it("says valid, with who signed and when, for the auditor and the technician", async () => {
    for (const who of [cookie.auditor, cookie.technician]) {
      const res = await call("GET", `/api/verify?hash=${approved.contentHash}`, who);
      expect(res.status, res.text).toBe(200);
      expect(res.json!.verdict).toBe("valid");
      const match = (res.json!.matches as Json[]).find((m) => m.revisionId === approved.revisionId)!;
      expect(match.signerName).toBeTruthy();
      expect(match.decidedAt).toBeTruthy();
    }
  });

  it("accepts the QR code's whole link", async () => {
    const res = await call("POST", "/api/verify", cookie.auditor, { hash: `${APP_URL}/verify?hash=${approved.contentHash}` });
    expect(res.status).toBe(200);
    expect(res.json!.verdict).toBe("valid");
  });

  it("says unknown for an altered hash, and refuses a malformed one with a sentence", async () => {
    const altered = `${approved.contentHash.slice(0, 63)}${approved.contentHash.endsWith("0") ? "1" : "0"}`;
    const res = await call("GET", `/api/verify?hash=${altered}`, cookie.auditor);
    expect(res.json!.verdict).toBe("unknown");
    const bad = await call("GET", "/api/verify?hash=xyz", cookie.auditor);
    expect(bad.status).toBe(400);
    expect((bad.json!.error as Json).message).toMatch(/64 characters/);
  });

  it("says expired once the sign-off has ended", async () => {
    const b = await approvedRevision(`Expiring sheet ${run}`);
    // What the review clock does when the validity ends (review_decision itself is append-only).
    await pool.query("update bench_revision set state = 'expired' where id = $1", [b.revisionId]);
    const res = await call("GET", `/api/verify?hash=${b.contentHash}`, cookie.auditor);
    expect(res.json!.verdict).toBe("expired");
    const refused = await call("POST", `/api/revisions/${b.revisionId}/sheet`, cookie.technician, { paper: "A4" });
    expect(refused.status).toBe(409);
    expect((refused.json!.error as Json).message).toMatch(/expired/);
  });
});
