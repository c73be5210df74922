// The build sheet's print time: a warm build-sheet PDF against the time the same chromium (lib/pdf's pool,
// in this process) takes to print a blank page with the same paper, header and footer, both in one run.
// Needs a signed-off revision, so it draws one through the API: the researcher whose cookie is given creates a
// bench, saves the drawing, sends it for review; the demo safety officer signs it off (password re-entered).
//
//   runSheetBench(appUrl, researcherCookie) → [{ name, value, unit, target }]
//   CLI: npx tsx scripts/bench-sheet.ts [appUrl]   (signs in the demo researcher itself)
import { closeBrowser, poolStats, printOptions, renderPdf, withPage, type Paper } from "@/lib/pdf";

type Figure = { name: string; value: number; unit: string; target: string };

const RUNS = 5;
const PAPER: Paper = "A4";
const SHEET_TARGET_MS = 2000;
const RATIO_TARGET = 2;
const TIMEOUT_MS = 90_000;
const DEMO_OFFICER = { email: "officer@northmere.example.edu", password: "northmere-demo-2026" };
const DEMO_RESEARCHER = { email: "researcher@northmere.example.edu", password: "northmere-demo-2026" };

/** A bench with one element of each kind, as a real sheet has. */
function sheetBench(title: string) {
  return {
    version: 1 as const,
    title,
    elements: [
      { id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 4, beamDiameterMm: 0.8 },
      { id: "lens-1", kind: "lens", positionMm: 100, focalLengthMm: -25 },
      { id: "nd-1", kind: "filter", positionMm: 250, opticalDensity: 0.5 },
      { id: "iris-1", kind: "aperture", positionMm: 400, diameterMm: 2 },
      { id: "screen-1", kind: "screen", positionMm: 1400 },
      { id: "block-1", kind: "beam-block", positionMm: 1450 },
    ],
  };
}

async function api<T>(appUrl: string, method: string, path: string, cookie: string, body?: unknown): Promise<{ status: number; json: T }> {
  const res = await fetch(`${appUrl}${path}`, {
    method,
    headers: { origin: appUrl, cookie, ...(body === undefined ? {} : { "content-type": "application/json" }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const json = (await res.json().catch(() => null)) as T;
  return { status: res.status, json };
}

function fail(step: string, res: { status: number; json: unknown }): never {
  throw new Error(`The sheet benchmark could not ${step}: the server answered ${res.status} ${JSON.stringify(res.json)}`);
}

export async function signInCookie(appUrl: string, who: { email: string; password: string }): Promise<string> {
  const res = await fetch(`${appUrl}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: appUrl },
    body: JSON.stringify(who),
  });
  if (!res.ok) throw new Error(`The sheet benchmark could not sign in ${who.email}: ${res.status}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
}

/** Draws, submits and signs off a bench through the API; returns the signed-off revision. */
export async function signedOffRevision(appUrl: string, cookie: string): Promise<{ revisionId: string; title: string }> {
  const title = `Sheet benchmark ${Date.now().toString(36)}`;
  const labs = await api<{ labs: { id: string; name: string }[] }>(appUrl, "GET", "/api/labs", cookie);
  if (labs.status !== 200) fail("list the labs", labs);
  let benchId: string | null = null;
  for (const lab of labs.json.labs) {
    const created = await api<{ id: string }>(appUrl, "POST", "/api/benches", cookie, { labId: lab.id, title });
    if (created.status === 201) {
      benchId = created.json.id;
      break;
    }
    if (created.status !== 403) fail("create a bench", created);
  }
  if (!benchId) throw new Error("The sheet benchmark could not create a bench: the cookie's user is a researcher in no lab.");
  type Draft = { draft: { revisionId: string; revisionNumber: number; version: number; contentHash: string } };
  const draft = await api<Draft>(appUrl, "GET", `/api/benches/${benchId}/draft`, cookie);
  if (draft.status !== 200) fail("read the draft", draft);
  const saved = await api<Draft>(appUrl, "PUT", `/api/benches/${benchId}/draft`, cookie, {
    document: sheetBench(title),
    baseRevision: draft.json.draft.revisionNumber,
    baseVersion: draft.json.draft.version,
  });
  if (saved.status !== 200) fail("save the drawing", saved);
  const { revisionId, contentHash } = saved.json.draft;
  const submitted = await api(appUrl, "POST", `/api/revisions/${revisionId}/submit`, cookie, { contentHash });
  if (submitted.status !== 200) fail("send the bench for review", submitted);
  const officer = await signInCookie(appUrl, DEMO_OFFICER);
  const decided = await api(appUrl, "POST", `/api/revisions/${revisionId}/decision`, officer, {
    outcome: "approve",
    contentHash,
    password: DEMO_OFFICER.password,
    conditions: "Beam enclosure closed during use.",
  });
  if (decided.status !== 201) fail("sign the bench off", decided);
  return { revisionId, title };
}

function median(samples: number[]): number {
  const sorted = [...samples].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

async function timed(job: () => Promise<Buffer | Uint8Array>): Promise<number> {
  const start = performance.now();
  const pdf = await job();
  const ms = performance.now() - start;
  if (Buffer.from(pdf.subarray(0, 4)).toString("latin1") !== "%PDF") throw new Error("The sheet benchmark got something that is not a PDF.");
  return ms;
}

export async function runSheetBench(appUrl: string, cookie: string): Promise<Figure[]> {
  const base = appUrl.replace(/\/$/, "");
  const { revisionId, title } = await signedOffRevision(base, cookie);
  const headerText = `${title} — revision 1 — ${PAPER}`;
  const url = `${base}/print/sheets/${revisionId}?paper=${PAPER}`;
  // The same print settings for both; the blank page has no network and nothing to lay out.
  const sheet = () => renderPdf(url, { cookie, paper: PAPER, headerText, timeoutMs: TIMEOUT_MS });
  const blank = () =>
    withPage(async (page) => {
      await page.setContent("<!doctype html><html><head><title>blank</title></head><body></body></html>", { waitUntil: "load" });
      return page.pdf(printOptions({ paper: PAPER, headerText }, TIMEOUT_MS));
    }, TIMEOUT_MS);
  // For the breakdown only (not part of either figure): the print route's HTML alone, as renderPdf fetches it.
  const serverRender = async () => {
    const start = performance.now();
    const res = await fetch(url, { headers: { cookie }, redirect: "manual" });
    const html = await res.text();
    if (!res.ok || !html.includes("data-print-ready")) throw new Error(`The sheet benchmark could not fetch the print route: ${res.status}`);
    return performance.now() - start;
  };
  const launchesBefore = poolStats().launches;
  try {
    // Warm-up: launches the browser (if none is running), compiles the print route, fills caches.
    const coldMs = await timed(sheet);
    await timed(blank);
    const sheetMs: number[] = [];
    const blankMs: number[] = [];
    const serverMs: number[] = [];
    // Interleaved, so drift in the machine's load falls on both alike.
    for (let i = 0; i < RUNS; i++) {
      blankMs.push(await timed(blank));
      sheetMs.push(await timed(sheet));
      serverMs.push(await serverRender());
    }
    if (poolStats().launches - launchesBefore > 1) throw new Error("The sheet benchmark's browser was launched more than once; the figures would not be warm.");
    const warm = median(sheetMs);
    const blankMedian = median(blankMs);
    const ratio = warm / blankMedian;
    return [
      { name: `build sheet PDF, first render (browser launch + route compile)`, value: coldMs, unit: "ms", target: "reference" },
      { name: `build sheet PDF, warm (median of ${RUNS}, ${PAPER}, 6 elements)`, value: warm, unit: "ms", target: `≤ ${SHEET_TARGET_MS} ms` },
      { name: `blank page PDF, same browser and print settings (median of ${RUNS})`, value: blankMedian, unit: "ms", target: "reference" },
      { name: `of which: print route server render, HTML alone (median of ${RUNS})`, value: median(serverMs), unit: "ms", target: "reference" },
      { name: "build sheet PDF ÷ blank page PDF", value: Math.round(ratio * 100) / 100, unit: "×", target: `≤ ${RATIO_TARGET}×` },
    ];
  } finally {
    await closeBrowser();
  }
}

const isMain = process.argv[1] && import.meta.url === new URL(`file://${process.argv[1]}`).href;
if (isMain) {
  const appUrl = process.argv[2] ?? process.env.APP_URL ?? "http://127.0.0.1:3000";
  signInCookie(appUrl, DEMO_RESEARCHER)
    .then((cookie) => runSheetBench(appUrl, cookie))
    .then((figures) => {
      for (const f of figures) console.log(`  ${f.name}: ${Number(f.value.toPrecision(4))} ${f.unit}   (target ${f.target})`);
    })
    .catch((error: unknown) => {
      console.error(error instanceof Error ? error.message : error);
      process.exit(1);
    });
}
