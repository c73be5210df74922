// The bench editor's drag smoothness (issue 5): in headless chromium, a bench with 40 elements on the rail, one of
// them dragged across it with mouse moves for about two seconds while the page records every animation frame
// (requestAnimationFrame). Reports the p95 frame time (target ≤ 16.7 ms, one 60 Hz frame) and the median.
// The bench is created through the API as the signed-in researcher (POST /api/benches, then PUT its draft).
//
//   runEditorBench(appUrl, cookie) → [{ name, value, unit, target }]
//   CLI: npx tsx scripts/bench-editor.ts [appUrl]   (signs in as the demo researcher)
import { pathToFileURL } from "node:url";
import { gzipSync } from "node:zlib";
import { chromium } from "playwright-core";
import { CHROMIUM_ARGS, CHROMIUM_PATH } from "../lib/chromium";

type Figure = { name: string; value: number; unit: string; target: string };
type Cookie = { name: string; value: string };

const ELEMENTS = 40;
const SPACING_MM = 25;
const DRAG_MS = 2000;
const TARGET_MS = 16.7;
const RAIL_Y_PX = 190; // the optical axis inside the drawing (components/editor/bench-canvas.tsx)
const VIEWPORT = { width: 1280, height: 860 };

function cookieList(cookie: Cookie[] | string): Cookie[] {
  if (typeof cookie !== "string") return cookie;
  return cookie
    .split(";")
    .map((part) => part.trim())
    .filter(Boolean)
    .map((part) => {
      const at = part.indexOf("=");
      return { name: part.slice(0, at), value: part.slice(at + 1) };
    });
}

/** A laser, then lenses, irises and filters every 25 mm, and a screen last: 40 elements the beam passes through. */
export function fortyElementBench(title: string) {
  const elements: Record<string, unknown>[] = [{ id: "laser-1", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 }];
  for (let i = 1; i < ELEMENTS - 1; i++) {
    const positionMm = i * SPACING_MM;
    const n = Math.floor(i / 3) + 1;
    if (i % 3 === 1) elements.push({ id: `lens-${n}`, kind: "lens", positionMm, focalLengthMm: n % 2 === 0 ? -400 : 400 });
    else if (i % 3 === 2) elements.push({ id: `iris-${n}`, kind: "aperture", positionMm, diameterMm: 12 });
    else elements.push({ id: `filter-${n}`, kind: "filter", positionMm, opticalDensity: 0.05 });
  }
  elements.push({ id: "screen-1", kind: "screen", positionMm: (ELEMENTS - 1) * SPACING_MM });
  return { version: 1, title, elements };
}

async function api(appUrl: string, cookieHeader: string, method: string, path: string, body?: unknown) {
  const res = await fetch(`${appUrl}${path}`, {
    method,
    headers: { origin: appUrl, cookie: cookieHeader, ...(body !== undefined ? { "content-type": "application/json" } : {}) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const json = (await res.json().catch(() => null)) as Record<string, unknown> | null;
  return { status: res.status, json };
}

/** Creates the 40-element bench in the first lab the signed-in researcher may create benches in; returns its id. */
async function createBench(appUrl: string, cookieHeader: string): Promise<string> {
  const labs = await api(appUrl, cookieHeader, "GET", "/api/labs");
  if (labs.status !== 200) throw new Error(`GET /api/labs answered ${labs.status}; is the cookie a signed-in researcher's?`);
  const title = `Frame-time benchmark, ${ELEMENTS} elements (${new Date().toISOString().slice(0, 16)})`;
  for (const lab of (labs.json!.labs as { id: string }[]) ?? []) {
    const created = await api(appUrl, cookieHeader, "POST", "/api/benches", { labId: lab.id, title });
    if (created.status === 403) continue; // not a member of this lab
    if (created.status !== 201) throw new Error(`POST /api/benches answered ${created.status}: ${JSON.stringify(created.json?.error ?? created.json)}`);
    const benchId = String(created.json!.id);
    const draft = await api(appUrl, cookieHeader, "GET", `/api/benches/${benchId}/draft`);
    const base = draft.json!.draft as { revisionNumber: number; version: number };
    const saved = await api(appUrl, cookieHeader, "PUT", `/api/benches/${benchId}/draft`, { document: fortyElementBench(title), baseRevision: base.revisionNumber, baseVersion: base.version });
    if (saved.status !== 200) throw new Error(`PUT the draft answered ${saved.status}: ${JSON.stringify(saved.json?.error ?? saved.json)}`);
    return benchId;
  }
  throw new Error("The signed-in person may not create a bench in any lab (a researcher of a lab is needed).");
}

const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(p * sorted.length) - 1))];
const round2 = (x: number) => Math.round(x * 100) / 100;

export async function runEditorBench(appUrl: string, cookie: Cookie[] | string): Promise<Figure[]> {
  const base = appUrl.replace(/\/$/, "");
  const cookies = cookieList(cookie);
  const cookieHeader = cookies.map((c) => `${c.name}=${c.value}`).join("; ");
  const benchId = await createBench(base, cookieHeader);

  const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS });
  try {
    const context = await browser.newContext({ viewport: VIEWPORT });
    await context.addCookies(cookies.map((c) => ({ name: c.name, value: c.value, url: base })));
    const page = await context.newPage();
    // First-load JavaScript: every script the route fetches, gzip-compressed here (level 9, as a
    // server would send it), split into what arrives before the load event and the whole.
    const scripts: Promise<number>[] = [];
    let beforeLoad: Promise<number>[] = [];
    page.on("response", (response) => {
      if (response.request().resourceType() !== "script") return;
      scripts.push(response.body().then((body) => gzipSync(body, { level: 9 }).length).catch(() => 0));
    });
    await page.goto(`${base}/benches/${benchId}`, { timeout: 180_000, waitUntil: "load" });
    beforeLoad = [...scripts];
    const frame = page.getByTestId("bench-canvas");
    await frame.locator("canvas").first().waitFor({ timeout: 120_000 });
    await page.locator('button[data-element-row="screen-1"]').waitFor({ timeout: 60_000 });
    // Let the first analysis arrive, so the drag measures the editor at work rather than its first load.
    await page.locator('[data-testid="aperture-row-iris-1"]').waitFor({ timeout: 60_000 });
    await page.locator('[data-testid="predictions"][data-stale="false"]').waitFor({ timeout: 60_000 });
    await frame.scrollIntoViewIfNeeded();
    const sum = async (list: Promise<number>[]) => (await Promise.all(list)).reduce((a, b) => a + b, 0) / 1024;
    const firstLoadKb = await sum(beforeLoad);
    const withCanvasKb = await sum(scripts);

    // The element to drag: an iris in the middle of the rail (element 20 of 40).
    const box = (await frame.boundingBox())!;
    const pxPerMm = Number(await frame.getAttribute("data-px-per-mm"));
    const panPx = Number(await frame.getAttribute("data-pan-px"));
    const middleMm = (ELEMENTS / 2) * SPACING_MM;
    const startX = box.x + panPx + middleMm * pxPerMm;
    const y = box.y + RAIL_Y_PX;
    const sweepPx = Math.min(box.width * 0.35, 420);

    // As a string: tsx's helpers (e.g. __name) do not exist in the page.
    await page.evaluate(`(() => {
      window.__frames = [];
      window.__recording = true;
      const tick = (t) => {
        if (!window.__recording) return;
        window.__frames.push(t);
        requestAnimationFrame(tick);
      };
      requestAnimationFrame(tick);
    })()`);
    await page.mouse.move(startX, y);
    await page.mouse.down();
    const started = Date.now();
    let moves = 0;
    // Across the rail and back (a triangle wave), as fast as the page takes the moves, for about two seconds.
    while (Date.now() - started < DRAG_MS) {
      const phase = ((Date.now() - started) / DRAG_MS) * 2;
      const offset = phase <= 1 ? phase * sweepPx : (2 - phase) * sweepPx;
      await page.mouse.move(startX + offset, y);
      moves += 1;
    }
    await page.mouse.up();
    const frames = (await page.evaluate(`(() => { window.__recording = false; return window.__frames; })()`)) as number[];
    await context.close();

    const deltas = frames.slice(1).map((t, i) => t - frames[i]);
    if (deltas.length < 3 || moves < 2) throw new Error(`Too few frames (${deltas.length}) or moves (${moves}) were recorded to measure the drag.`);
    const sorted = [...deltas].sort((a, b) => a - b);
    return [
      { name: `Editor: drag with ${ELEMENTS} elements, p95 frame time (${deltas.length} frames, ${moves} mouse moves)`, value: round2(percentile(sorted, 0.95)), unit: "ms", target: `≤ ${TARGET_MS} ms` },
      { name: `Editor: drag with ${ELEMENTS} elements, median frame time`, value: round2(percentile(sorted, 0.5)), unit: "ms", target: "—" },
      { name: "Editor route: first-load JavaScript (gzip, scripts before the load event)", value: round2(firstLoadKb), unit: "kB", target: "≤ 350 kB" },
      { name: "Editor route: all JavaScript once the canvas is drawn (gzip)", value: round2(withCanvasKb), unit: "kB", target: "reference" },
    ];
  } finally {
    await browser.close();
  }
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const appUrl = process.argv[2] ?? process.env.APP_URL ?? "http://127.0.0.1:3000";
  const signIn = await fetch(`${appUrl}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: appUrl },
    body: JSON.stringify({ email: "researcher@northmere.example.edu", password: "northmere-demo-2026" }),
  });
  if (!signIn.ok) throw new Error(`Signing in as the demo researcher answered ${signIn.status}.`);
  const cookie = signIn.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
  for (const f of await runEditorBench(appUrl, cookie)) console.log(`${f.name}: ${f.value} ${f.unit} (target ${f.target})`);
}
