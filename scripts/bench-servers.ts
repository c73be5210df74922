// Two app servers versus one, in the same run, on one PostgreSQL: requests per second of the bench
// list (GET /api/benches, what the Benches page reads) and of the auditor's approvals list
// (GET /api/desk/approvals, page 1 of every sign-off, what the sign-off desk reads). One server
// takes all 10 connections; then the same 10 are split 5 + 5 over two servers (autocannon against
// both at once, the two rates summed) — the same offered load, only the number of servers changes.
// The two configurations alternate for ROUNDS rounds so drift on a shared machine hits both alike.
// While each measurement runs, the CPU time of each app server, of PostgreSQL and of this process
// (the load generator) is read from /proc, with the whole machine's busy share: the figures say
// what limits the gain.
//
//   runServersBench({ env, firstUrl, secondPort, pgDataDir }) → [{ name, value, unit, target }]
//   Needs a running production server at firstUrl on a database filled by scripts/seed-scale.ts;
//   starts the second `next start` itself (same environment, same database) and leaves it to
//   stopChildren().
import { readdirSync, readFileSync } from "node:fs";
import { cpus as cpuList, loadavg } from "node:os";
import path from "node:path";
import autocannon from "autocannon";
import { NEXT } from "./lib/provision";
import { log, startChild, waitForHttp } from "./lib/system";

type Figure = { name: string; value: number; unit: string; target: string };

const CONNECTIONS = 10;
const DURATION_S = 10;
const ROUNDS = 3;
const CLK_TCK = 100; // getconf CLK_TCK on Linux

/** Every process's parent and CPU ticks (user + system), from /proc/<pid>/stat. */
function processTable(): Map<number, { ppid: number; ticks: number }> {
  const table = new Map<number, { ppid: number; ticks: number }>();
  for (const entry of readdirSync("/proc")) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = readFileSync(`/proc/${entry}/stat`, "utf8");
      // The command name sits in parentheses and may hold spaces; the fields after it are fixed.
      const fields = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
      table.set(Number(entry), { ppid: Number(fields[1]), ticks: Number(fields[11]) + Number(fields[12]) });
    } catch {
      // the process ended while we looked
    }
  }
  return table;
}

/** CPU ticks of each process in the tree under `root` (itself included), by pid. */
function treeTicks(table: Map<number, { ppid: number; ticks: number }>, root: number): Map<number, number> {
  const found = new Map<number, number>();
  const stack = [root];
  while (stack.length) {
    const pid = stack.pop()!;
    if (found.has(pid) || !table.has(pid)) continue;
    found.set(pid, table.get(pid)!.ticks);
    for (const [child, info] of table) if (info.ppid === pid) stack.push(child);
  }
  return found;
}

/** Ticks a process tree used between two looks: a process that began meanwhile counts whole; one that ended is lost (PostgreSQL's backends for the pools live on). */
function ticksBetween(before: Map<number, number>, after: Map<number, number>): number {
  let total = 0;
  for (const [pid, ticks] of after) total += ticks - (before.get(pid) ?? 0);
  return total;
}

/** The machine's busy and total ticks over all CPUs (first line of /proc/stat). */
function machineTicks(): { busy: number; total: number } {
  const values = readFileSync("/proc/stat", "utf8").split("\n")[0].trim().split(/\s+/).slice(1).map(Number);
  const total = values.reduce((a, b) => a + b, 0);
  const idle = values[3] + (values[4] ?? 0); // idle + iowait
  return { busy: total - idle, total };
}

type CpuSample = { servers: Map<number, number>[]; postgres: Map<number, number>; generator: number; machineBusy: number; machineTotal: number; wall: number };

function cpuSample(serverPids: number[], postmasterPid: number): CpuSample {
  const table = processTable();
  const usage = process.cpuUsage();
  const machine = machineTicks();
  return {
    servers: serverPids.map((pid) => treeTicks(table, pid)),
    postgres: treeTicks(table, postmasterPid),
    generator: ((usage.user + usage.system) / 1e6) * CLK_TCK,
    machineBusy: machine.busy,
    machineTotal: machine.total,
    wall: performance.now(),
  };
}

/** Cores used (1.0 = one core busy) by each part between two samples. */
function coresUsed(a: CpuSample, b: CpuSample) {
  const seconds = (b.wall - a.wall) / 1000;
  const cores = (ticks: number) => ticks / CLK_TCK / seconds;
  const cpus = cpuList().length;
  return {
    servers: b.servers.map((t, i) => cores(ticksBetween(a.servers[i], t))),
    postgres: cores(ticksBetween(a.postgres, b.postgres)),
    generator: cores(b.generator - a.generator),
    machine: ((b.machineBusy - a.machineBusy) / (b.machineTotal - a.machineTotal)) * cpus,
    cpus,
  };
}

type Target = { name: string; path: string; cookie: string };

async function rate(url: string, cookie: string, connections: number, duration = DURATION_S): Promise<{ rps: number; failures: number }> {
  const result = await autocannon({ url, connections, duration, headers: { cookie } });
  return { rps: result.requests.average, failures: result.non2xx + result.errors + result.timeouts };
}

async function signIn(appUrl: string, email: string): Promise<string> {
  const res = await fetch(`${appUrl}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: appUrl },
    body: JSON.stringify({ email, password: "northmere-demo-2026" }),
  });
  if (!res.ok) throw new Error(`The servers benchmark could not sign in ${email}: ${res.status}`);
  return res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
}

export async function runServersBench(options: { env: NodeJS.ProcessEnv; firstUrl: string; firstPid: number; secondPort: number; pgDataDir: string }): Promise<Figure[]> {
  const secondUrl = `http://127.0.0.1:${options.secondPort}`;
  const second = startChild("second app", NEXT, ["start", "-H", "127.0.0.1", "-p", String(options.secondPort)], { env: options.env, stdio: ["ignore", "ignore", "inherit"] });
  await waitForHttp(`${secondUrl}/api/health`, 60_000);
  const postmasterPid = Number(readFileSync(path.join(options.pgDataDir, "postmaster.pid"), "utf8").split("\n")[0]);
  const serverPids = [options.firstPid, second.pid!];

  // Sessions live in PostgreSQL: a cookie from the first server is good on the second.
  const researcher = await signIn(options.firstUrl, "researcher@northmere.example.edu");
  const auditor = await signIn(options.firstUrl, "auditor@northmere.example.edu");
  const targets: Target[] = [
    { name: "bench list (GET /api/benches as the researcher: their lab's benches among 10 010)", path: "/api/benches", cookie: researcher },
    { name: "approvals list (GET /api/desk/approvals as the auditor: page 1 of every sign-off, 25 rows and the count)", path: "/api/desk/approvals", cookie: auditor },
  ];
  for (const t of targets) {
    for (const base of [options.firstUrl, secondUrl]) {
      const res = await fetch(`${base}${t.path}`, { headers: { cookie: t.cookie } });
      if (res.status !== 200) throw new Error(`The servers benchmark's ${t.path} answered ${res.status} on ${base}: ${await res.text()}`);
      await res.arrayBuffer();
      await rate(`${base}${t.path}`, t.cookie, CONNECTIONS / 2, 3); // warm-up: compile paths, fill pools
    }
  }

  const figures: Figure[] = [{ name: "servers benchmark: machine load average (1 min) at the start", value: loadavg()[0], unit: `on ${cpuList().length} cores`, target: "reference" }];
  for (const t of targets) {
    const one: number[] = [];
    const two: number[] = [];
    const oneCpu: ReturnType<typeof coresUsed>[] = [];
    const twoCpu: ReturnType<typeof coresUsed>[] = [];
    for (let round = 0; round < ROUNDS; round++) {
      let before = cpuSample(serverPids, postmasterPid);
      const single = await rate(`${options.firstUrl}${t.path}`, t.cookie, CONNECTIONS);
      oneCpu.push(coresUsed(before, cpuSample(serverPids, postmasterPid)));
      before = cpuSample(serverPids, postmasterPid);
      const pair = await Promise.all([options.firstUrl, secondUrl].map((base) => rate(`${base}${t.path}`, t.cookie, CONNECTIONS / 2)));
      twoCpu.push(coresUsed(before, cpuSample(serverPids, postmasterPid)));
      const failures = single.failures + pair[0].failures + pair[1].failures;
      if (failures > 0) throw new Error(`The servers benchmark's ${t.path} had ${failures} failed requests (non-2xx, errors or timeouts).`);
      one.push(single.rps);
      two.push(pair[0].rps + pair[1].rps);
      log(`servers benchmark ${t.path} round ${round + 1}: one server ${single.rps.toFixed(1)} req/s, two servers ${pair[0].rps.toFixed(1)} + ${pair[1].rps.toFixed(1)} req/s`);
    }
    const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
    const cpuWords = (samples: ReturnType<typeof coresUsed>[]) => {
      const avg = (pick: (s: ReturnType<typeof coresUsed>) => number) => mean(samples.map(pick)).toFixed(2);
      return `cores busy: machine ${avg((s) => s.machine)} of ${samples[0].cpus}; app servers ${samples[0].servers.map((_, i) => avg((s) => s.servers[i])).join(" + ")}, PostgreSQL ${avg((s) => s.postgres)}, load generator ${avg((s) => s.generator)}`;
    };
    const oneRps = mean(one);
    const twoRps = mean(two);
    figures.push(
      { name: `${t.name}, one server, ${CONNECTIONS} connections`, value: oneRps, unit: `req/s (rounds: ${one.map((x) => x.toFixed(1)).join(", ")}; ${cpuWords(oneCpu)})`, target: "reference" },
      { name: `${t.name}, two servers, ${CONNECTIONS / 2} + ${CONNECTIONS / 2} connections, summed`, value: twoRps, unit: `req/s (rounds: ${two.map((x) => x.toFixed(1)).join(", ")}; ${cpuWords(twoCpu)})`, target: "reference" },
      { name: `${t.name}, two servers ÷ one`, value: twoRps / oneRps, unit: "×", target: "≥ 1.6× not expected on 2 cores" },
    );
  }
  return figures;
}
