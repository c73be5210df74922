// Debian's chromium and the flags every use of it here shares: the build sheet's PDF pool (puppeteer-core), the
// end-to-end tests and the editor benchmark (Playwright). Never a downloaded browser.
export const CHROMIUM_PATH = "/usr/bin/chromium";

/** Flags for a headless browser with no network beyond loopback; --no-sandbox because it may run as root. */
export const CHROMIUM_ARGS = [
  "--no-sandbox",
  "--disable-gpu",
  "--disable-dev-shm-usage",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--disable-quic",
  "--no-first-run",
];
