// Applies the committed Drizzle migrations (migrations/) as the owning role, then gives the app's role
// exactly the rights it needs. Run by the start and test scripts before the app starts; never inside
// `next build`.
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

/**
 * The app's rights, given again after every migration (new tables included): read and write the
 * ordinary tables, only INSERT and SELECT on the append-only ones (those whose rows a
 * *_refuse_change trigger guards), use the sequences. Nothing else: no TRUNCATE, REFERENCES or
 * TRIGGER, no CREATE on the schema, and as it owns nothing, no ALTER, DROP or trigger control.
 */
export async function grantAppRole(ownerUrl: string, appRole: string): Promise<{ appendOnly: string[] }> {
  const client = new pg.Client({ connectionString: ownerUrl });
  await client.connect();
  const role = `"${appRole.replace(/"/g, '""')}"`;
  try {
    await client.query("begin");
    await client.query(`revoke all on schema public from ${role}`);
    await client.query(`grant usage on schema public to ${role}`);
    await client.query(`revoke all on all tables in schema public from ${role}`);
    await client.query(`grant select, insert, update, delete on all tables in schema public to ${role}`);
    const { rows } = await client.query<{ table: string }>(
      `select distinct c.relname as table
         from pg_trigger t
         join pg_class c on c.oid = t.tgrelid
         join pg_namespace n on n.oid = c.relnamespace
         join pg_proc p on p.oid = t.tgfoid
        where n.nspname = 'public' and not t.tgisinternal and p.proname like '%\\_refuse\\_change'
        order by 1`,
    );
    for (const { table } of rows) await client.query(`revoke update, delete on "${table.replace(/"/g, '""')}" from ${role}`);
    await client.query(`revoke all on all sequences in schema public from ${role}`);
    await client.query(`grant usage, select on all sequences in schema public to ${role}`);
    await client.query("commit");
    return { appendOnly: rows.map((r) => r.table) };
  } catch (error) {
    await client.query("rollback").catch(() => undefined);
    throw error;
  } finally {
    await client.end();
  }
}
