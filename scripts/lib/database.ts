// Applies the committed Drizzle migrations (migrations/) to a database. Run by the start and test
// scripts before the app starts; never inside `next build`.
import path from "node:path";
import { drizzle } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import pg from "pg";
import { ROOT } from "./system";

export async function applyMigrations(databaseUrl: string): Promise<void> {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 1 });
  try {
    await migrate(drizzle(pool), { migrationsFolder: path.join(ROOT, "migrations") });
  } finally {
    await pool.end();
  }
}
