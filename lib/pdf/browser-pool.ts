// A small pool over one headless Debian chromium (puppeteer-core, never a downloaded browser): the
// browser is launched on first use and kept for later jobs, at most MAX_PAGES pages render at once,
// every job has a deadline, an idle browser is closed after a while, and it dies with the process.
import { rmSync } from "node:fs";
import { mkdtemp, rm } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import puppeteer, { type Browser } from "puppeteer-core";
import { CHROMIUM_ARGS, CHROMIUM_PATH } from "@/lib/chromium";

export { CHROMIUM_ARGS, CHROMIUM_PATH };
export const MAX_PAGES = 2;
const IDLE_CLOSE_MS = 5 * 60 * 1000;

type PoolState = {
  browser: Promise<Browser> | null;
  userDataDir: string | null;
  busy: number;
  waiting: (() => void)[];
  idleTimer: NodeJS.Timeout | null;
  exitHookInstalled: boolean;
  launches: number;
};

// Kept on globalThis so the dev server's hot reload does not leak a second browser.
const globalForPool = globalThis as unknown as { benchwardenPdfPool?: PoolState };
const state: PoolState = (globalForPool.benchwardenPdfPool ??= {
  browser: null,
  userDataDir: null,
  busy: 0,
  waiting: [],
  idleTimer: null,
  exitHookInstalled: false,
  launches: 0,
});

function installExitHook(): void {
  if (state.exitHookInstalled) return;
  state.exitHookInstalled = true;
  // 'exit' handlers must be synchronous: kill the chromium process and remove its profile.
  process.once("exit", killNow);
  // A server stopped by a signal may never reach 'exit' (chromium runs in its own process group, so
  // it would be left behind): stop the browser on the signal too. Where nobody else listens for the
  // signal, end the process as the default action would have.
  for (const signal of ["SIGTERM", "SIGINT"] as const) {
    process.once(signal, () => {
      killNow();
      if (process.listenerCount(signal) === 0) process.exit(0);
    });
  }
}

// Removing a chromium profile never throws: chromium may still be writing into it while it closes
// (ENOTEMPTY), and an error thrown from an event handler would bring the whole server down.
function removeProfileNow(dir: string): void {
  try {
    rmSync(dir, { recursive: true, force: true });
  } catch {
    /* the exit hook cannot wait; the OS's temp cleaning takes the rest */
  }
}

function removeProfileLater(dir: string): void {
  rm(dir, { recursive: true, force: true, maxRetries: 5, retryDelay: 100 }).catch((error: unknown) => {
    console.warn("[benchwarden] could not remove the chromium profile", dir, error instanceof Error ? error.message : error);
  });
}

let lastBrowser: Browser | null = null;
function killNow(): void {
  try {
    lastBrowser?.process()?.kill("SIGKILL");
  } catch {
    /* already gone */
  }
  if (state.userDataDir) removeProfileNow(state.userDataDir);
}

async function launch(): Promise<Browser> {
  installExitHook();
  const userDataDir = await mkdtemp(path.join(os.tmpdir(), "benchwarden-chromium-"));
  state.userDataDir = userDataDir;
  const browser = await puppeteer.launch({
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: CHROMIUM_ARGS,
    userDataDir,
    // The app owns the process signals; the 'exit' hook above stops the browser.
    handleSIGINT: false,
    handleSIGTERM: false,
    handleSIGHUP: false,
    protocolTimeout: 120_000,
  });
  state.launches += 1;
  lastBrowser = browser;
  browser.on("disconnected", () => {
    if (lastBrowser === browser) {
      state.browser = null;
      lastBrowser = null;
      removeProfileLater(userDataDir);
    }
  });
  return browser;
}

async function browser(): Promise<Browser> {
  if (state.browser) {
    const b = await state.browser.catch(() => null);
    if (b?.connected) return b;
    state.browser = null;
  }
  state.browser = launch();
  state.browser.catch(() => {
    state.browser = null;
  });
  return state.browser;
}

async function acquire(): Promise<void> {
  if (state.idleTimer) {
    clearTimeout(state.idleTimer);
    state.idleTimer = null;
  }
  if (state.busy < MAX_PAGES) {
    state.busy += 1;
    return;
  }
  await new Promise<void>((resolve) => state.waiting.push(resolve));
}

function release(): void {
  const next = state.waiting.shift();
  if (next) {
    next(); // the slot passes straight to the next job
    return;
  }
  state.busy -= 1;
  if (state.busy === 0) {
    state.idleTimer = setTimeout(() => void closeBrowser(), IDLE_CLOSE_MS);
    state.idleTimer.unref();
  }
}

/** Runs the job with a fresh page of the shared browser, within the deadline; the page is always closed. */
export async function withPage<T>(job: (page: import("puppeteer-core").Page) => Promise<T>, deadlineMs: number): Promise<T> {
  await acquire();
  let timer: NodeJS.Timeout | null = null;
  let page: import("puppeteer-core").Page | null = null;
  try {
    const b = await browser();
    page = await b.newPage();
    const opened = page;
    const timeout = new Promise<never>((_, reject) => {
      timer = setTimeout(() => reject(new PdfTimeoutError(deadlineMs)), deadlineMs);
    });
    return await Promise.race([job(opened), timeout]);
  } finally {
    if (timer) clearTimeout(timer);
    if (page) await page.close().catch(() => undefined);
    release();
  }
}

export class PdfTimeoutError extends Error {
  constructor(readonly deadlineMs: number) {
    super(`The page did not finish within ${Math.round(deadlineMs / 1000)} s`);
  }
}

/** Closes the shared browser (idle timer, tests, shutdown). The next job launches a new one. */
export async function closeBrowser(): Promise<void> {
  const pending = state.browser;
  state.browser = null;
  if (!pending) return;
  const b = await pending.catch(() => null);
  await b?.close().catch(() => b?.process()?.kill("SIGKILL"));
}

/** For the benchmark and tests: how often a browser was launched, and pages in use. */
export function poolStats(): { launches: number; busy: number; waiting: number } {
  return { launches: state.launches, busy: state.busy, waiting: state.waiting.length };
}
