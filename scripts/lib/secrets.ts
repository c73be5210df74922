// Secrets for a local installation, generated once and kept in .data/secrets.json (never committed).
import { randomBytes } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";

/** appDbPassword: the app's role (DATABASE_URL); ownerDbPassword: the role that migrates and owns the tables. */
export type LocalSecrets = { postgresPassword: string; appDbPassword: string; ownerDbPassword: string; authSecret: string };

const fresh = (bytes: number) => randomBytes(bytes).toString("base64url");

export function loadSecrets(dataDir: string): LocalSecrets {
  const file = path.join(dataDir, "secrets.json");
  const kept = existsSync(file) ? (JSON.parse(readFileSync(file, "utf8")) as Partial<LocalSecrets>) : {};
  const secrets: LocalSecrets = {
    postgresPassword: kept.postgresPassword ?? fresh(18),
    appDbPassword: kept.appDbPassword ?? fresh(18),
    // Added when the database got its two roles; an older secrets.json gains it on the next start.
    ownerDbPassword: kept.ownerDbPassword ?? fresh(18),
    authSecret: kept.authSecret ?? fresh(32),
  };
  if (Object.keys(kept).length !== Object.keys(secrets).length) {
    mkdirSync(dataDir, { recursive: true });
    writeFileSync(file, JSON.stringify(secrets, null, 2), { mode: 0o600 });
  }
  return secrets;
}
