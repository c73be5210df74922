// The committed migrations build the whole schema on an empty database, and the audit trail
// refuses UPDATE, DELETE and TRUNCATE at the database level.
import path from "node:path";
import { drizzle } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

const superUrl = process.env.TEST_SUPERUSER_URL;
const dbName = `bw_migrate_${process.pid}`;
let pool: pg.Pool;

describe.skipIf(!superUrl)("migrations on an empty database", () => {
  beforeAll(async () => {
    const admin = new pg.Client({ connectionString: superUrl });
    await admin.connect();
    await admin.query(`drop database if exists ${dbName}`);
    await admin.query(`create database ${dbName}`);
    await admin.end();
    const url = new URL(superUrl!);
    url.pathname = `/${dbName}`;
    pool = new pg.Pool({ connectionString: url.toString(), max: 2 });
    await migrate(drizzle(pool), { migrationsFolder: path.resolve(import.meta.dirname, "../../migrations") });
  });

  afterAll(async () => {
    await pool?.end();
    const admin = new pg.Client({ connectionString: superUrl });
    await admin.connect();
    await admin.query(`drop database if exists ${dbName}`);
    await admin.end();
  });

  it("creates every table of the schema", async () => {
    const { rows } = await pool.query<{ table_name: string }>("select table_name from information_schema.tables where table_schema = 'public' order by 1");
    expect(rows.map((r) => r.table_name)).toEqual(
      expect.arrayContaining(["user", "session", "account", "verification", "lab", "lab_member", "invitation", "bench", "bench_revision", "audit_event", "mail_outbox"]),
    );
  });

  it("applying the migrations twice changes nothing", async () => {
    await migrate(drizzle(pool), { migrationsFolder: path.resolve(import.meta.dirname, "../../migrations") });
    const { rows } = await pool.query("select count(*)::int as n from drizzle.__drizzle_migrations");
    expect(rows[0].n).toBeGreaterThanOrEqual(2);
  });

  it("keeps the audit trail append-only", async () => {
    await pool.query("insert into audit_event (action) values ('test-event')");
    await expect(pool.query("update audit_event set action = 'rewritten'")).rejects.toThrow(/append-only/);
    await expect(pool.query("delete from audit_event")).rejects.toThrow(/append-only/);
    await expect(pool.query("truncate audit_event")).rejects.toThrow(/append-only/);
    const { rows } = await pool.query("select action from audit_event");
    expect(rows).toEqual([{ action: "test-event" }]);
  });
});
