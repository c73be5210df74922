// PDF output: a bounded pool over Debian's chromium (puppeteer-core) and renderPdf(url, {cookie, paper}).
// Used by lib/server/build-sheets.ts; the page printed is the app's own print route.
export { renderPdf, printOptions, DEFAULT_TIMEOUT_MS, PdfRenderError, PdfTimeoutError, UNCONTROLLED_FOOTER, type Paper, type RenderOptions } from "./render";
export { closeBrowser, poolStats, withPage, MAX_PAGES, CHROMIUM_PATH, CHROMIUM_ARGS } from "./browser-pool";
