// Helpers shared by `npm start` and `npm test`: paths, logging, child processes that stop when we
// stop. (Debian packages and npm dependencies are installed earlier, by scripts/bootstrap.sh.)
import { spawn, type ChildProcess, type SpawnOptions } from "node:child_process";
import { existsSync, readdirSync } from "node:fs";
import path from "node:path";

export const ROOT = path.resolve(import.meta.dirname, "../..");

export function log(message: string): void {
  process.stdout.write(`[benchwarden] ${message}\n`);
}

export function isRoot(): boolean {
  return typeof process.getuid === "function" && process.getuid() === 0;
}

export function postgresBinDir(): string | null {
  const base = "/usr/lib/postgresql";
  if (!existsSync(base)) return null;
  const versions = readdirSync(base)
    .filter((v) => existsSync(path.join(base, v, "bin/initdb")))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(base, versions[0], "bin") : null;
}

const children = new Set<ChildProcess>();

/** Spawns a process that is stopped (SIGTERM, then SIGKILL) when stopChildren runs. */
export function startChild(name: string, command: string, args: string[], options: SpawnOptions = {}): ChildProcess {
  const child = spawn(command, args, { cwd: ROOT, stdio: "inherit", ...options });
  children.add(child);
  child.on("exit", (code, signal) => {
    children.delete(child);
    if (!stopping && code !== 0) log(`${name} exited (${signal ?? code})`);
  });
  return child;
}

let stopping = false;

/**
 * Like startChild, but starts the process again when it exits on its own (a crash, or the database
 * gone for good): after 1 s, then 2 s, 4 s … at most 30 s; a run that lasted a minute resets the wait.
 */
export function superviseChild(name: string, command: string, args: string[], options: SpawnOptions = {}): void {
  let delayMs = 1000;
  const launch = () => {
    const startedAt = Date.now();
    const child = startChild(name, command, args, options);
    child.on("exit", () => {
      if (stopping) return;
      if (Date.now() - startedAt > 60_000) delayMs = 1000;
      log(`${name} stopped; starting it again in ${delayMs / 1000} s`);
      setTimeout(() => {
        if (!stopping) launch();
      }, delayMs);
      delayMs = Math.min(30_000, delayMs * 2);
    });
  };
  launch();
}

export async function stopChildren(): Promise<void> {
  stopping = true;
  const waits = [...children].map(
    (child) =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null || child.signalCode !== null) return resolve();
        const timer = setTimeout(() => child.kill("SIGKILL"), 5000);
        child.once("exit", () => {
          clearTimeout(timer);
          resolve();
        });
        child.kill("SIGTERM");
      }),
  );
  await Promise.all(waits);
}

// The ports the Fetch standard blocks (https://fetch.spec.whatwg.org/#port-blocking): Node's fetch
// and chromium refuse to connect to them, so no test server may listen on one.
const BLOCKED_PORTS = new Set([
  1, 7, 9, 11, 13, 15, 17, 19, 20, 21, 22, 23, 25, 37, 42, 43, 53, 69, 77, 79, 87, 95, 101, 102, 103, 104, 109, 110, 111, 113, 115, 117, 119, 123, 135, 137, 139,
  143, 161, 179, 389, 427, 465, 512, 513, 514, 515, 526, 530, 531, 532, 540, 548, 554, 556, 563, 587, 601, 636, 989, 990, 993, 995, 1719, 1720, 1723, 2049,
  3659, 4045, 4190, 5060, 5061, 6000, 6566, 6665, 6666, 6667, 6668, 6669, 6679, 6697, 10080,
]);

/** `port`, or the next port above it that fetch and browsers allow. */
export function allowedPort(port: number): number {
  let p = port;
  while (BLOCKED_PORTS.has(p)) p++;
  return p;
}

export async function waitForHttp(url: string, timeoutMs: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    try {
      const res = await fetch(url, { redirect: "manual" });
      if (res.status < 500) return;
    } catch {
      /* not up yet */
    }
    if (Date.now() > deadline) throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
    await new Promise((r) => setTimeout(r, 250));
  }
}
