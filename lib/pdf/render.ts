// renderPdf: opens a page of the app in the shared chromium with the requesting user's session cookie
// and prints it to PDF (A4 or Letter) with page numbers and the "uncontrolled when printed" footer.
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

async function load(page: Page, url: string, options: RenderOptions, timeoutMs: number): Promise<void> {
  if (options.cookie) await page.setExtraHTTPHeaders({ cookie: options.cookie });
  await page.emulateMediaType("print");
  const response = await page.goto(url, { waitUntil: "load", timeout: timeoutMs });
  const finalUrl = new URL(page.url());
  const wanted = new URL(url);
  if (finalUrl.pathname !== wanted.pathname) throw new PdfRenderError(`The print page sent the browser elsewhere (${finalUrl.pathname}); the session was probably not accepted`);
  if (!response || !response.ok()) throw new PdfRenderError(`The print page answered ${response?.status() ?? "nothing"}`);
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
  return withPage(async (page) => {
    progress(20, "browser ready");
    await load(page, url, options, timeoutMs);
    progress(60, "page loaded");
    const pdf = await page.pdf(printOptions(options, timeoutMs));
    progress(90, "printed");
    return Buffer.from(pdf);
  }, timeoutMs);
}

export { PdfTimeoutError };
