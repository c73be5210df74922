// renderPdf: renders a page of the app (fetched with the requesting user's session cookie while chromium
// opens a page) in the shared chromium, scripts off, and prints it to PDF (A4 or Letter) with page numbers
// and the "uncontrolled when printed" footer.
import type { Page, PDFOptions } from "puppeteer-core";
import { PdfTimeoutError, withPage } from "./browser-pool";

export type Paper = "A4" | "Letter";

export type RenderOptions = {
  /** The Cookie header of the user the page is rendered for; the print route requires a session. */
  cookie?: string;
  paper?: Paper;
  /** The whole job: load, fonts, print. */
  timeoutMs?: number;
  /** Shown left in the running header of every page. */
  headerText?: string;
  /** Shown in the footer of every page, before the page numbers. */
  footerText?: string;
  onProgress?: (percent: number, stage: string) => void;
};

export const DEFAULT_TIMEOUT_MS = 60_000;
export const UNCONTROLLED_FOOTER = "Uncontrolled when printed — check the online record";

export class PdfRenderError extends Error {}

function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c] ?? c);
}

// Header and footer templates run in their own tiny document: styles must be inline and sizes explicit.
function headerTemplate(text: string): string {
  return `<div style="width:100%;font-family:sans-serif;font-size:9pt;color:#333;padding:0 15mm;display:flex;justify-content:space-between"><span>${escapeHtml(text)}</span><span>Benchwarden build sheet</span></div>`;
}

function footerTemplate(text: string): string {
  return `<div style="width:100%;font-family:sans-serif;font-size:10pt;color:#000;padding:0 15mm;display:flex;justify-content:space-between;align-items:center"><span style="font-weight:bold">${escapeHtml(text)}</span><span style="font-size:12pt;font-weight:bold">Page <span class="pageNumber"></span> of <span class="totalPages"></span></span></div>`;
}

/**
 * Fetches the print route's HTML with the user's cookie. The server renders it while chromium opens a page
 * (the two overlap); a redirect means the session was not accepted (the route sends strangers to sign in).
 */
async function fetchPrintPage(url: string, options: RenderOptions, timeoutMs: number): Promise<string> {
  const res = await fetch(url, {
    headers: { accept: "text/html", ...(options.cookie ? { cookie: options.cookie } : {}) },
    redirect: "manual",
    signal: AbortSignal.timeout(timeoutMs),
  });
  if (res.status >= 300 && res.status < 400) {
    const to = res.headers.get("location");
    throw new PdfRenderError(`The print page sent the browser elsewhere (${to ? new URL(to, url).pathname : "no location"}); the session was probably not accepted`);
  }
  if (!res.ok) throw new PdfRenderError(`The print page answered ${res.status}`);
  return res.text();
}

/**
 * The markup chromium prints: the page's own relative links (its stylesheet) resolve against the print route,
 * as if chromium had navigated there, and the app's script elements (the client payload that hydration would
 * read, several times the sheet's own markup) are left out; scripts are off in the page anyway.
 */
function printableHtml(rawHtml: string, url: string): string {
  const html = rawHtml.replace(/<script\b[^>]*>[\s\S]*?<\/script\s*>/gi, "");
  const base = `<base href="${url.replace(/&/g, "&amp;").replace(/"/g, "&quot;")}">`;
  const head = /<head(\s[^>]*)?>/i.exec(html);
  return head ? `${html.slice(0, head.index + head[0].length)}${base}${html.slice(head.index + head[0].length)}` : `${base}${html}`;
}

async function load(page: Page, html: Promise<string>, url: string, options: RenderOptions, timeoutMs: number): Promise<void> {
  // The print route is a pure server render: everything the sheet shows is in the HTML. With the page's own
  // scripts off, chromium neither downloads nor runs the app's client bundle (hydration, providers, dev HMR),
  // so "load" is the HTML, its stylesheet and the inline images. puppeteer's own evaluate still works.
  // The session cookie stays in this process: the page's only requests are the app's static files.
  // The origin page below is an API answer, whose Content-Security-Policy allows nothing; the markup set into
  // it is the app's own print page (scripts off), so chromium leaves that policy aside here.
  await Promise.all([page.setJavaScriptEnabled(false), page.emulateMediaType("print"), page.setBypassCSP(true)]);
  // The app's font files are fetched in CORS mode: the document must have the app's origin, not
  // about:blank, or the font shipped with the app is refused and the sheet falls back to a system font.
  // A same-origin page that costs nothing to serve gives it that origin before the content is set.
  await page.goto(new URL("/api/health", url).toString(), { waitUntil: "domcontentloaded", timeout: timeoutMs });
  await page.setContent(printableHtml(await html, url), { waitUntil: "load", timeout: timeoutMs });
  // The page marks itself complete; a missing marker means it rendered an error instead.
  const ready = await page.$("[data-print-ready]");
  if (!ready) throw new PdfRenderError("The print page did not render the sheet");
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
}

/** The print settings of every sheet (paper, margins, running header and footer); the benchmark prints a blank page with the same. */
export function printOptions(options: RenderOptions, timeoutMs = options.timeoutMs ?? DEFAULT_TIMEOUT_MS): PDFOptions {
  return {
    format: options.paper ?? "A4",
    printBackground: true,
    displayHeaderFooter: true,
    headerTemplate: headerTemplate(options.headerText ?? ""),
    footerTemplate: footerTemplate(options.footerText ?? UNCONTROLLED_FOOTER),
    margin: { top: "16mm", bottom: "18mm", left: "15mm", right: "15mm" },
    timeout: timeoutMs,
  };
}

/** Renders the page at url to a PDF. Throws PdfTimeoutError past the deadline, PdfRenderError when the page is wrong. */
export async function renderPdf(url: string, options: RenderOptions = {}): Promise<Buffer> {
  const timeoutMs = options.timeoutMs ?? DEFAULT_TIMEOUT_MS;
  const progress = options.onProgress ?? (() => undefined);
  // The server renders the print route while chromium opens its page.
  const html = fetchPrintPage(url, options, timeoutMs);
  html.catch(() => undefined); // awaited (and thrown) inside the job; no unhandled rejection if the page never opens
  return withPage(async (page) => {
    progress(20, "browser ready");
    await load(page, html, url, options, timeoutMs);
    progress(60, "page loaded");
    const pdf = await page.pdf(printOptions(options, timeoutMs));
    progress(90, "printed");
    return Buffer.from(pdf);
  }, timeoutMs);
}

export { PdfTimeoutError };
