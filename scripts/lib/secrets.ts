// Secrets for a local installation, generated once and kept in .data/secrets.json (never committed).
import { randomBytes } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";

export type LocalSecrets = { postgresPassword: string; appDbPassword: string; authSecret: string };

export function loadSecrets(dataDir: string): LocalSecrets {
  const file = path.join(dataDir, "secrets.json");
  if (existsSync(file)) return JSON.parse(readFileSync(file, "utf8")) as LocalSecrets;
  mkdirSync(dataDir, { recursive: true });
  const secrets: LocalSecrets = {
    postgresPassword: randomBytes(18).toString("base64url"),
    appDbPassword: randomBytes(18).toString("base64url"),
    authSecret: randomBytes(32).toString("base64url"),
  };
  writeFileSync(file, JSON.stringify(secrets, null, 2), { mode: 0o600 });
  return secrets;
}
