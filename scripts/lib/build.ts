// `next build` only when the sources changed since the last build (a content hash kept in .next/).
import { createHash } from "node:crypto";
import { execFileSync } from "node:child_process";
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";
import { log, ROOT } from "./system";

const SOURCE_DIRS = ["app", "components", "lib", "db", "public"];
const SOURCE_FILES = ["next.config.mjs", "package-lock.json", "tsconfig.json", "postcss.config.mjs", "tailwind.config.ts"];
const STAMP = path.join(ROOT, ".next/benchwarden-source-hash");

function walk(dir: string, out: string[]): void {
  if (!existsSync(dir)) return;
  for (const entry of readdirSync(dir)) {
    const full = path.join(dir, entry);
    if (statSync(full).isDirectory()) walk(full, out);
    else out.push(full);
  }
}

export function sourceHash(): string {
  const files: string[] = [];
  for (const d of SOURCE_DIRS) walk(path.join(ROOT, d), files);
  for (const f of SOURCE_FILES) if (existsSync(path.join(ROOT, f))) files.push(path.join(ROOT, f));
  const hash = createHash("sha256");
  for (const f of files.sort()) hash.update(path.relative(ROOT, f)).update("\0").update(readFileSync(f));
  return hash.digest("hex");
}

export function buildIfStale(): void {
  const hash = sourceHash();
  const built = existsSync(path.join(ROOT, ".next/BUILD_ID")) && existsSync(STAMP) && readFileSync(STAMP, "utf8") === hash;
  if (built) {
    log("the build is up to date");
    return;
  }
  log("building the app (next build)");
  execFileSync(path.join(ROOT, "node_modules/.bin/next"), ["build"], {
    cwd: ROOT,
    stdio: "inherit",
    env: { ...process.env, NEXT_TELEMETRY_DISABLED: "1" },
  });
  writeFileSync(STAMP, hash);
}
