// `npm test`: a throwaway PostgreSQL cluster and mail catcher on their own ports, the production
// build served on :3100, then every test — vitest (unit, integration, HTTP) and Playwright in
// Debian's chromium. Ends with one plain line "N passed, N failed"; non-zero exit on any failure.
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import path from "node:path";
import { buildIfStale } from "./lib/build";
import { stopCluster } from "./lib/postgres";
import { localIdentityProvider, NEXT, provision, TSX } from "./lib/provision";
import { allowedPort, log, ROOT, startChild, stopChildren, superviseChild, waitForHttp } from "./lib/system";

// BW_TEST_PORT_OFFSET (default 0) moves every port below by the same amount, so two checkouts can
// run their tests side by side (e.g. 1000: app on 4100, PostgreSQL on 6434). CI leaves it unset.
const offset = Number(process.env.BW_TEST_PORT_OFFSET ?? 0) || 0;
/** A port moved by the offset; a port that fetch and chromium refuse (e.g. 4190 = 3190 + 1000) moves on to the next allowed one. */
const at = (port: number) => allowedPort(port + offset);
const ports = { app: at(3100), postgres: at(5434), smtp: at(2526), catcherWeb: at(1081) };
// A second app server and a second mail worker on the same PostgreSQL, as an institution runs it
// behind a proxy; tests/integration/two-servers.test.ts talks to both.
const SECOND_APP_PORT = at(3101);
// The stand-in for the institution's OpenID Connect provider (scripts/identity-provider.ts).
const IDENTITY_PROVIDER_PORT = at(3190);
// Both app servers keep uploads and sheets in one S3-compatible store (scripts/s3-fake.ts, s3rver).
const S3_FAKE_PORT = at(3193);
// tests/integration/security-limits.test.ts starts its own server here, with the proxy setting off.
const UNTRUSTING_PORT = at(3199);
const dataDir = path.join(ROOT, ".data/test");
const resultsDir = path.join(ROOT, "test-results");

type Counts = { passed: number; failed: number };

// For working on one area: BW_VITEST_FILTER / BW_PLAYWRIGHT_FILTER hold space-separated file filters
// passed on to vitest and Playwright ("none" skips Playwright). CI sets neither and runs everything.
const words = (value: string | undefined): string[] => (value ?? "").split(/\s+/).filter(Boolean);
const vitestFilter = words(process.env.BW_VITEST_FILTER);
const playwrightFilter = words(process.env.BW_PLAYWRIGHT_FILTER);

function vitestCounts(file: string): Counts {
  if (!existsSync(file)) return { passed: 0, failed: 1 };
  const report = JSON.parse(readFileSync(file, "utf8")) as { numPassedTests: number; numFailedTests: number; numTotalTestSuites: number; success: boolean };
  // A suite that fails to load has no failed test in it; count it so the run cannot look green.
  const brokenSuites = report.success || report.numFailedTests > 0 ? 0 : 1;
  return { passed: report.numPassedTests, failed: report.numFailedTests + brokenSuites };
}

function playwrightCounts(file: string): Counts {
  if (!existsSync(file)) return { passed: 0, failed: 1 };
  const report = JSON.parse(readFileSync(file, "utf8")) as { stats: { expected: number; unexpected: number; flaky: number }; errors?: unknown[] };
  return { passed: report.stats.expected + report.stats.flaky, failed: report.stats.unexpected + (report.errors?.length ?? 0) };
}

function run(command: string, args: string[], env: NodeJS.ProcessEnv): number {
  const result = spawnSync(command, args, { cwd: ROOT, stdio: "inherit", env });
  return result.status ?? 1;
}

async function main(): Promise<number> {
  const started = Date.now();
  let typecheck: Counts = { passed: 0, failed: 1 };
  let lint: Counts = { passed: 0, failed: 1 };
  rmSync(dataDir, { recursive: true, force: true });
  mkdirSync(resultsDir, { recursive: true });
  for (const f of ["vitest.json", "playwright.json"]) rmSync(path.join(resultsDir, f), { force: true });

  const { cluster, env, superUrl } = await provision({ dataDir, ports, dbName: "benchwarden_test", seed: true, rateLimitMax: 60 });
  // The tests stand where a reverse proxy would: they sign in from distinct documentation-range
  // addresses through X-Forwarded-For, so the app trusts one proxy hop (tests/integration/security-*
  // also start a server with the setting off).
  const secondAppUrl = `http://127.0.0.1:${SECOND_APP_PORT}`;
  const idp = localIdentityProvider(env.APP_URL!, IDENTITY_PROVIDER_PORT);
  const testEnv = {
    ...env,
    ...idp.env,
    TEST_SUPERUSER_URL: superUrl,
    MAIL_WORKER_INTERVAL_MS: "300",
    TRUSTED_PROXY_COUNT: "1",
    SECOND_APP_URL: secondAppUrl,
    TEST_UNTRUSTING_PORT: String(UNTRUSTING_PORT),
    // tests/integration/postgres-restart.test.ts stops and starts this cluster.
    TEST_PG_DATA_DIR: cluster.dataDir,
    TEST_PG_PORT: String(cluster.port),
    STORAGE_DRIVER: "s3",
    S3_ENDPOINT: `http://127.0.0.1:${S3_FAKE_PORT}`,
    S3_BUCKET: "benchwarden-test",
    S3_REGION: "us-east-1",
    S3_ACCESS_KEY_ID: "S3RVER",
    S3_SECRET_ACCESS_KEY: "S3RVER",
    S3_FAKE_PORT: String(S3_FAKE_PORT),
    S3_FAKE_DIR: path.join(dataDir, "s3"),
  };
  try {
    startChild("mail catcher", TSX, ["scripts/mail-catcher.ts"], { env: testEnv });
    startChild("S3 fake", TSX, ["scripts/s3-fake.ts"], { env: testEnv });
    if (idp.start) startChild("identity provider", TSX, ["scripts/identity-provider.ts"], { env: testEnv, stdio: ["ignore", "ignore", "inherit"] });
    buildIfStale();
    startChild("app", NEXT, ["start", "-H", "127.0.0.1", "-p", String(ports.app)], { env: testEnv, stdio: ["ignore", "ignore", "inherit"] });
    startChild("second app", NEXT, ["start", "-H", "127.0.0.1", "-p", String(SECOND_APP_PORT)], { env: testEnv, stdio: ["ignore", "ignore", "inherit"] });
    superviseChild("mail worker", TSX, ["scripts/mail-worker.ts"], { env: testEnv, stdio: ["ignore", "ignore", "inherit"] });
    superviseChild("second mail worker", TSX, ["scripts/mail-worker.ts"], { env: testEnv, stdio: ["ignore", "ignore", "inherit"] });
    await waitForHttp(`${env.APP_URL}/sign-in`, 60_000);
    await waitForHttp(`${secondAppUrl}/sign-in`, 60_000);
    await waitForHttp(`${env.MAIL_CATCHER_URL}/api/messages`, 30_000);
    await waitForHttp(`${testEnv.S3_ENDPOINT}/`, 30_000);
    if (idp.start) await waitForHttp(`${idp.env.SSO_ISSUER}/.well-known/openid-configuration`, 30_000);

    log("type check of the whole project (tsc --noEmit)");
    typecheck = run(path.join(ROOT, "node_modules/.bin/tsc"), ["--noEmit", "-p", "tsconfig.json"], testEnv) === 0 ? { passed: 1, failed: 0 } : { passed: 0, failed: 1 };
    log("lint of the whole project (eslint, no warnings allowed)");
    lint = run(path.join(ROOT, "node_modules/.bin/eslint"), [".", "--max-warnings", "0", "--cache", "--cache-location", "node_modules/.cache/eslint/"], testEnv) === 0 ? { passed: 1, failed: 0 } : { passed: 0, failed: 1 };
    log("vitest: unit, integration and HTTP tests");
    run(path.join(ROOT, "node_modules/.bin/vitest"), ["run", "--reporter=default", "--reporter=json", `--outputFile.json=${path.join(resultsDir, "vitest.json")}`, ...vitestFilter], testEnv);
    if (playwrightFilter[0] === "none") {
      log("Playwright skipped (BW_PLAYWRIGHT_FILTER=none)");
      writeFileSync(path.join(resultsDir, "playwright.json"), JSON.stringify({ stats: { expected: 0, unexpected: 0, flaky: 0 } }));
    } else {
      log("Playwright: end-to-end tests in /usr/bin/chromium");
      run(path.join(ROOT, "node_modules/.bin/playwright"), ["test", ...playwrightFilter], testEnv);
    }
  } finally {
    await stopChildren();
    stopCluster(cluster);
    rmSync(dataDir, { recursive: true, force: true });
    if (cluster.dataDir.startsWith("/var/tmp/benchwarden")) rmSync(cluster.dataDir, { recursive: true, force: true });
  }

  const v = vitestCounts(path.join(resultsDir, "vitest.json"));
  const p = playwrightCounts(path.join(resultsDir, "playwright.json"));
  const passed = v.passed + p.passed + typecheck.passed + lint.passed;
  const failed = v.failed + p.failed + typecheck.failed + lint.failed;
  log(`type check ${typecheck.failed ? "failed" : "passed"}; lint ${lint.failed ? "failed" : "passed"}; vitest ${v.passed} passed, ${v.failed} failed; Playwright ${p.passed} passed, ${p.failed} failed; ${((Date.now() - started) / 1000).toFixed(0)} s`);
  process.stdout.write(`${passed} passed, ${failed} failed\n`);
  return failed === 0 && passed > 0 ? 0 : 1;
}

main()
  .then((code) => process.exit(code))
  .catch(async (error: unknown) => {
    console.error(`[benchwarden] test run failed: ${error instanceof Error ? error.stack : String(error)}`);
    await stopChildren();
    process.stdout.write("0 passed, 1 failed\n");
    process.exit(1);
  });
