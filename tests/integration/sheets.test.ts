// The build sheet over HTTP against the running server: request a sheet of a signed-off revision, poll the
// job until it is ready, download the PDF (audited), the second request reuses it; the PDF's text (pdf.js)
// holds every part at its position, the hash, the approver and the conditions; pdftoppm renders page 1 for
// people to look at; verification by hash; refusals in words.
import { execFileSync } from "node:child_process";
import { existsSync, mkdirSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";
import pg from "pg";
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BenchDocument } from "../../lib/bench/schema";
import { APP_URL, call, DEMO, DEMO_PASSWORD, signIn } from "../support/http";
import { createDrawnBench, databaseUrl, labIdByName, sampleBench } from "../support/review-fixtures";

const run = Date.now().toString(36);
const outDir = path.resolve(import.meta.dirname, "../../test-results/sheets");
const screenshots = path.resolve(import.meta.dirname, "../../test-results/screenshots");
let pool: pg.Pool;
const cookie = {} as Record<"researcher" | "officer" | "technician" | "auditor" | "student", string>;
let approved: { revisionId: string; contentHash: string; benchId: string; signerName: string };
const title = `Sheet bench ${run}`;
const CONDITIONS = `Beam enclosure closed during use; interlock ${run} tested weekly.`;

/** Every element kind of version 1, so the parts list is checked for each. */
function everyKindBench(t: string): BenchDocument {
  const base = sampleBench(t);
  return {
    ...base,
    elements: [
      ...base.elements.filter((e) => e.kind !== "screen"),
      { id: "nd-1", kind: "filter", positionMm: 250, opticalDensity: 0.5 },
      { id: "screen-1", kind: "screen", positionMm: 1400 },
      { id: "block-1", kind: "beam-block", positionMm: 1450 },
    ],
  };
}

/** The text of every page, in reading order, extracted with pdf.js (Mozilla's PDF library, legacy build for Node). */
async function pdfText(bytes: Buffer): Promise<{ pages: string[]; all: string }> {
  const doc = await getDocument({ data: new Uint8Array(bytes), isEvalSupported: false, useSystemFonts: false }).promise;
  const pages: string[] = [];
  try {
    for (let n = 1; n <= doc.numPages; n++) {
      const content = await (await doc.getPage(n)).getTextContent();
      pages.push(content.items.map((item) => ("str" in item ? `${item.str}${item.hasEOL ? "\n" : ""}` : "")).join(""));
    }
  } finally {
    await doc.destroy();
  }
  return { pages, all: pages.join("\n") };
}

const flat = (text: string) => text.replace(/\s+/g, " ");
const escapeRe = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

type Json = Record<string, unknown>;
type Sheet = { id: string; state: string; progressPercent: number; error: string | null; downloadUrl: string | null };

async function approvedRevision(t: string, doc: BenchDocument = sampleBench(t)) {
  const labId = await labIdByName(cookie.researcher, "Wrenfield Imaging Lab");
  const b = await createDrawnBench(pool, cookie.researcher, labId, doc);
  expect((await call("POST", `/api/revisions/${b.revisionId}/submit`, cookie.researcher, { contentHash: b.contentHash })).status).toBe(200);
  const decided = await call("POST", `/api/revisions/${b.revisionId}/decision`, cookie.officer, { outcome: "approve", contentHash: b.contentHash, password: DEMO_PASSWORD, conditions: CONDITIONS });
  expect(decided.status, decided.text).toBe(201);
  return { ...b, signerName: String((decided.json!.decision as Json).signerName) };
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
  approved = await approvedRevision(title, everyKindBench(title));
  mkdirSync(outDir, { recursive: true });
  mkdirSync(screenshots, { recursive: true });
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
    const { sheet, seen } = await waitReady(approved.revisionId, cookie.technician);
    expect(sheet.error).toBeNull();
    expect(sheet.state).toBe("ready");
    // The order the name claims: the progress seen while polling never goes back, and ends at 100.
    const progress = [first.progressPercent, ...seen];
    for (let i = 1; i < progress.length; i++) expect(progress[i], `progress ${progress.join(" → ")}`).toBeGreaterThanOrEqual(progress[i - 1]);
    expect(progress.at(-1)).toBe(100);
    expect(progress[0]).toBeLessThan(100);
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

  it("its text holds every part at its position, the content hash, the approver's name and the conditions", async () => {
    const { pages, all } = await pdfText(pdf);
    writeFileSync(path.join(outDir, `sheet-${run}.txt`), all);
    expect(pages.length).toBeGreaterThanOrEqual(2);
    const text = flat(all);
    // The parts list: each element's id, then its kind and its position along the beam.
    const partsList = flat(all.slice(all.indexOf("Parts list"), all.indexOf("Build order")));
    expect(partsList.length, "a parts list before the build order").toBeGreaterThan(20);
    for (const e of everyKindBench(title).elements) {
      expect(partsList, `${e.id} at ${e.positionMm} mm in the parts list`).toMatch(new RegExp(`${escapeRe(e.id)} [^0-9]*?${e.positionMm} mm`));
      expect(text, `the build order mounts ${e.id} at ${e.positionMm} mm`).toMatch(new RegExp(`${escapeRe(e.id)} at ${e.positionMm} mm \\(±\\d+ mm\\)`));
    }
    // The hash may wrap across lines; on page 1 and in the approval block.
    expect(pages[0].replace(/\s+/g, "")).toContain(approved.contentHash);
    expect(all.replace(/\s+/g, "")).toContain(`Contenthash${approved.contentHash}`);
    // The approval: who signed, in which role, what the signature means, the conditions, the validity.
    expect(approved.signerName.length).toBeGreaterThan(0);
    expect(text).toContain(`Officer ${approved.signerName}, Laser safety officer`);
    expect(text).toContain(`Signed off by ${approved.signerName}`);
    expect(text).toContain("Meaning Approved for operation as drawn, with the conditions listed.");
    expect(text).toContain(`Conditions ${CONDITIONS}`);
    expect(text).toMatch(/Valid until \d{1,2} [A-Z][a-z]{2} \d{4} \(to the end of that day\)/); // one date format, the lab's zone
    // The hash is printed unbroken (one line), never split across lines.
    expect(all).toContain(approved.contentHash);
    // The sheet's figures are advice; work is authorised by the sign-off; the scope limits are on the safety page.
    expect(text).toContain("Work is authorised by the sign-off above, under its conditions");
    expect(text).toContain("What these hazard figures do not cover");
    expect(text).not.toMatch(/from memory|recalled|PRODUCT\.md|never authorises/);
    // Every page: the running footer and its page number.
    pages.forEach((page, i) => {
      expect(flat(page)).toContain("Uncontrolled when printed — check the online record");
      expect(flat(page)).toContain(`Page ${i + 1} of ${pages.length}`);
    });
    expect(text).toMatch(/laser safety officer and local regulations decide/);
  });

  it("renders page 1 to PNG with pdftoppm for people to look at", () => {
    const file = path.join(outDir, `sheet-${run}.pdf`);
    writeFileSync(file, pdf);
    const prefix = path.join(screenshots, "sheet-page-1");
    execFileSync("pdftoppm", ["-png", "-r", "90", "-f", "1", "-l", "1", "-singlefile", file, prefix]);
    const png = `${prefix}.png`;
    expect(existsSync(png), "pdftoppm wrote page 1").toBe(true);
    expect(statSync(png).size).toBeGreaterThan(10_000);
  });

  it("Letter paper is a separate job", async () => {
    const res = await call("POST", `/api/revisions/${approved.revisionId}/sheet`, cookie.technician, { paper: "Letter" });
    expect(res.status).toBe(202);
    const { sheet } = await waitReady(approved.revisionId, cookie.technician, "Letter");
    expect(sheet.state).toBe("ready");
    expect(sheet.id).not.toBe(sheetId);
  }, 180_000);

  it("refuses a sheet of a revision that is not signed off, and hides other labs' revisions", async () => {
    const labId = await labIdByName(cookie.researcher, "Wrenfield Imaging Lab");
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
