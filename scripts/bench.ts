// `npm run bench`: the speed figures the README reports. Pure engines are timed in-process; the
// HTTP figures come from autocannon against the production server on a throwaway database.
import path from "node:path";
import { readFileSync, rmSync } from "node:fs";
import autocannon from "autocannon";
import { buildIfStale } from "./lib/build";
import { stopCluster } from "./lib/postgres";
import { NEXT, provision } from "./lib/provision";
import { allowedPort, log, ROOT, startChild, stopChildren, waitForHttp } from "./lib/system";

type Figure = { name: string; value: number; unit: string; target: string };

/** Peak resident memory of a process (Linux VmHWM), in kB; 0 when unknown. */
function peakMemoryKb(pid: number | undefined): number {
  if (!pid) return 0;
  try {
    const status = readFileSync(`/proc/${pid}/status`, "utf8");
    return Number(status.match(/VmHWM:\s+(\d+) kB/)?.[1] ?? 0);
  } catch {
    return 0;
  }
}

// BW_TEST_PORT_OFFSET (default 0) moves every port, as for `npm test`, so checkouts can run side by side.
const offset = Number(process.env.BW_TEST_PORT_OFFSET ?? 0) || 0;

async function httpFigures(): Promise<Figure[]> {
  const at = (port: number) => allowedPort(port + offset);
  const ports = { app: at(3300), postgres: at(5435), smtp: at(2527), catcherWeb: at(1082) };
  // The second app server of the two-servers-versus-one figures (scripts/bench-servers.ts).
  const secondAppPort = at(3301);
  const dataDir = path.join(ROOT, ".data/bench");
  rmSync(dataDir, { recursive: true, force: true });
  const { cluster, env, ownerUrl } = await provision({ dataDir, ports, dbName: "benchwarden_bench", seed: true, rateLimitMax: 1000 });
  try {
    buildIfStale();
    const app = startChild("app", NEXT, ["start", "-H", "127.0.0.1", "-p", String(ports.app)], { env, stdio: ["ignore", "ignore", "inherit"] });
    await waitForHttp(`${env.APP_URL}/api/health`, 60_000);
    const signIn = await fetch(`${env.APP_URL}/api/auth/sign-in/email`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: env.APP_URL! },
      body: JSON.stringify({ email: "researcher@northmere.example.edu", password: "northmere-demo-2026" }),
    });
    const cookie = signIn.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    const doc = {
      version: 1,
      elements: [
        { id: "laser", kind: "laser", positionMm: 0, wavelengthNm: 632.8, powerMw: 1, beamDiameterMm: 0.8 },
        { id: "lens", kind: "lens", positionMm: 100, focalLengthMm: -25 },
        { id: "iris", kind: "aperture", positionMm: 400, diameterMm: 2 },
        { id: "screen", kind: "screen", positionMm: 1400 },
      ],
    };
    const measure = (opts: autocannon.Options) => autocannon({ connections: 10, duration: 10, ...opts });
    await measure({ url: `${env.APP_URL}/api/health`, duration: 3 }); // warm-up
    const trivial = await measure({ url: `${env.APP_URL}/api/health` });
    const analyze = await measure({
      url: `${env.APP_URL}/api/analyze`,
      method: "POST",
      headers: { "content-type": "application/json", cookie },
      body: JSON.stringify(doc),
    });
    if (analyze.non2xx > 0) throw new Error(`POST /api/analyze answered ${analyze.non2xx} non-2xx responses`);
    const ratio = analyze.requests.average / trivial.requests.average;
    const peakKb = peakMemoryKb(app.pid);
    // Two app servers versus one on the scale data: the bench list and the approvals list.
    const serversBench = async () => {
      const { runServersBench } = await import("./bench-servers");
      return await runServersBench({ env, firstUrl: env.APP_URL!, firstPid: app.pid!, secondPort: secondAppPort, pgDataDir: cluster.dataDir });
    };
    if (process.argv.includes("--servers-only")) {
      const { seedScale } = await import("./seed-scale");
      await seedScale(ownerUrl);
      return await serversBench();
    }
    if (process.argv.includes("--queue-only")) {
      const { runQueueBench } = await import("./bench-queue");
      return await runQueueBench({ appUrl: env.APP_URL!, databaseUrl: env.DATABASE_URL!, catcherUrl: env.MAIL_CATCHER_URL!, env, cookie });
    }
    // The editor's drag frame time and the build sheet, in chromium against this production server.
    const { runEditorBench } = await import("./bench-editor");
    const editor = await runEditorBench(env.APP_URL!, cookie);
    const { runTableEditorBench } = await import("./bench-table-editor");
    const tableEditor = await runTableEditorBench(env.APP_URL!, cookie);
    const { runSheetBench } = await import("./bench-sheet");
    const sheet = await runSheetBench(env.APP_URL!, cookie);
    // Queue throughput: e-mails through two mail workers to the catcher, build sheets per minute.
    const { runQueueBench } = await import("./bench-queue");
    const queue = await runQueueBench({ appUrl: env.APP_URL!, databaseUrl: env.DATABASE_URL!, catcherUrl: env.MAIL_CATCHER_URL!, env, cookie });
    // The sign-off desk at scale: 10 000 benches and 100 000+ trail rows in this throwaway database.
    const { seedScale } = await import("./seed-scale");
    const { runDeskBench } = await import("./bench-desk");
    // As the owning role: the scale seed ends with VACUUM ANALYZE, which only a table's owner may run.
    await seedScale(ownerUrl);
    const desk = await runDeskBench(env.DATABASE_URL!);
    const servers = await serversBench();
    return [
      ...editor,
      ...tableEditor,
      ...sheet,
      ...queue,
      ...desk,
      ...servers,
      { name: "GET /api/health throughput (trivial route)", value: trivial.requests.average, unit: "req/s", target: "reference" },
      { name: "POST /api/analyze throughput (signed in, 4 elements)", value: analyze.requests.average, unit: "req/s", target: "≥ 70 % of the trivial route" },
      { name: "POST /api/analyze ÷ trivial route", value: Math.round(ratio * 1000) / 10, unit: "%", target: "≥ 70 %" },
      { name: "app server peak resident memory (VmHWM) after the load above", value: peakKb / 1024, unit: "MB", target: "reference" },
    ];
  } finally {
    await stopChildren();
    stopCluster(cluster);
    rmSync(dataDir, { recursive: true, force: true });
  }
}

/** Only the sign-off desk's figures: a throwaway database with the scale data, no app server. */
async function deskFigures(): Promise<Figure[]> {
  const ports = { app: 3300 + offset, postgres: 5435 + offset, smtp: 2527 + offset, catcherWeb: 1082 + offset };
  const dataDir = path.join(ROOT, ".data/bench-desk");
  rmSync(dataDir, { recursive: true, force: true });
  const { cluster, env, ownerUrl } = await provision({ dataDir, ports, dbName: "benchwarden_bench", seed: false, rateLimitMax: 1000 });
  try {
    const { seedScale } = await import("./seed-scale");
    const { runDeskBench } = await import("./bench-desk");
    await seedScale(ownerUrl);
    return await runDeskBench(env.DATABASE_URL!);
  } finally {
    stopCluster(cluster);
    rmSync(dataDir, { recursive: true, force: true });
  }
}

async function main() {
  const figures: Figure[] = [];
  // --desk-only: only the sign-off desk's figures on the scale data: npm run bench -- --desk-only
  if (process.argv.includes("--desk-only")) {
    figures.push(...(await deskFigures()));
    log("benchmark figures");
    for (const f of figures) process.stdout.write(`  ${f.name}: ${Number(f.value.toPrecision(4))} ${f.unit}   (target ${f.target})\n`);
    return;
  }
  // --queue-only: only the queue figures (e-mails per second, sheets per minute): npm run bench -- --queue-only
  // --servers-only: only two app servers versus one on the scale data: npm run bench -- --servers-only
  if (process.argv.includes("--queue-only") || process.argv.includes("--servers-only")) {
    figures.push(...(await httpFigures()));
    log("benchmark figures");
    for (const f of figures) process.stdout.write(`  ${f.name}: ${Number(f.value.toPrecision(4))} ${f.unit}   (target ${f.target})\n`);
    return;
  }
  const { runOpticsBench } = await import("./bench-optics");
  figures.push(...(await runOpticsBench()));
  const { runPhotoBench } = await import("./bench-photo");
  figures.push(...(await runPhotoBench()));
  const { runSafetyBench } = await import("./bench-safety");
  figures.push(...(await runSafetyBench()));
  const { runTableBench } = await import("./bench-table");
  figures.push(...(await runTableBench()));
  if (!process.argv.includes("--engines-only")) figures.push(...(await httpFigures()));
  log("benchmark figures");
  for (const f of figures) process.stdout.write(`  ${f.name}: ${Number(f.value.toPrecision(4))} ${f.unit}   (target ${f.target})\n`);
}

main().catch(async (error: unknown) => {
  console.error(error);
  await stopChildren();
  process.exit(1);
});
