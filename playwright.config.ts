import { defineConfig } from "@playwright/test";
import { CHROMIUM_ARGS, CHROMIUM_PATH } from "./lib/chromium";

// End-to-end tests in Debian's chromium (never a downloaded browser), against the production
// server that scripts/test.ts starts on APP_URL. One worker: this machine has two cores.
export default defineConfig({
  testDir: "tests/e2e",
  outputDir: "test-results/e2e",
  workers: 1,
  retries: 0,
  timeout: 60_000,
  reporter: [["list"], ["json", { outputFile: "test-results/playwright.json" }]],
  use: {
    baseURL: process.env.APP_URL ?? "http://127.0.0.1:3100",
    viewport: { width: 1280, height: 860 },
    trace: "retain-on-failure",
    launchOptions: {
      executablePath: CHROMIUM_PATH,
      args: CHROMIUM_ARGS,
    },
  },
});
