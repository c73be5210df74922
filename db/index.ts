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
    // An idle client loses its server (PostgreSQL restarted, connection killed): pg emits 'error' on
    // the pool, which would end the process if nobody listened. The pool drops that client and opens
    // a new one on the next query, so logging is all there is to do.
    pool.on("error", (error) => console.error(`[db] idle connection lost: ${error.message}`));
    globalForDb.benchwardenDb = { pool, db: drizzle(pool, { schema }) };
  }
  return globalForDb.benchwardenDb.db;
}

export async function closeDb(): Promise<void> {
  await globalForDb.benchwardenDb?.pool.end();
  globalForDb.benchwardenDb = undefined;
}

export { schema };
