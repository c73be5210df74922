// The one database client: a pg Pool wrapped by Drizzle, created on first use.
import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import pg from "pg";
import { env } from "@/lib/env";
import * as schema from "./schema";

export type Database = NodePgDatabase<typeof schema>;
export type Transaction = Parameters<Parameters<Database["transaction"]>[0]>[0];
export type DbOrTx = Database | Transaction;

const globalForDb = globalThis as unknown as { benchwardenDb?: { pool: pg.Pool; db: Database } };

export function getDb(): Database {
  if (!globalForDb.benchwardenDb) {
    const pool = new pg.Pool({ connectionString: env().DATABASE_URL, max: 10 });
    globalForDb.benchwardenDb = { pool, db: drizzle(pool, { schema }) };
  }
  return globalForDb.benchwardenDb.db;
}

export async function closeDb(): Promise<void> {
  await globalForDb.benchwardenDb?.pool.end();
  globalForDb.benchwardenDb = undefined;
}

export { schema };
