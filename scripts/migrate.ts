// Migrations for a deployment that is not run by `npm start`: applies migrations/ as the owning role
// and gives the app's role its rights. `npm start` and `npm test` do the same themselves.
//   MIGRATION_DATABASE_URL=postgres://benchwarden_owner:…@host/db DATABASE_URL=postgres://benchwarden:…@host/db npx tsx scripts/migrate.ts
import { applyMigrations, grantAppRole } from "./lib/database";

async function main(): Promise<void> {
  const ownerUrl = process.env.MIGRATION_DATABASE_URL;
  const appUrl = process.env.DATABASE_URL;
  if (!ownerUrl || !appUrl) {
    console.error("Set MIGRATION_DATABASE_URL (the role that owns the tables) and DATABASE_URL (the app's role).");
    process.exit(2);
  }
  const appRole = decodeURIComponent(new URL(appUrl).username);
  if (appRole === decodeURIComponent(new URL(ownerUrl).username)) {
    console.error("DATABASE_URL and MIGRATION_DATABASE_URL name the same role; the app must connect as a role that owns nothing.");
    process.exit(2);
  }
  await applyMigrations(ownerUrl);
  const { appendOnly } = await grantAppRole(ownerUrl, appRole);
  console.log(`migrations applied; ${appRole} may read and write, append-only: ${appendOnly.join(", ")}`);
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
