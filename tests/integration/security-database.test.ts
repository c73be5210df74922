// Attacks on the trail through the database itself, as the app's own role (the credentials a
// compromised app server would hold): it may add to the append-only tables and read them, but not
// change, remove, truncate, switch off or drop their guards, replace the guard function, or drop them.
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { databaseUrl } from "../support/review-fixtures";

const APPEND_ONLY = ["audit_event", "review_decision", "review_comment", "review_reminder"];
let client: pg.Client;

beforeAll(async () => {
  client = new pg.Client({ connectionString: databaseUrl() });
  await client.connect();
});

afterAll(async () => {
  await client?.end();
});

/** Runs one statement in its own savepoint-free transaction and returns the error code, or "ok". */
async function attempt(sql: string): Promise<string> {
  await client.query("begin");
  try {
    await client.query(sql);
    return "ok";
  } catch (error) {
    return (error as { code?: string }).code ?? String(error);
  } finally {
    await client.query("rollback");
  }
}

const DENIED = "42501"; // insufficient_privilege (PostgreSQL error codes, Appendix A)
// "must be owner of …" is also 42501 in PostgreSQL 15.

describe("the app's database role", () => {
  it("is not the owner of the database, its schema or any table, and is no superuser", async () => {
    const { rows } = await client.query<{ me: string; superuser: boolean; db_owner: string; schema_owner: string }>(
      `select current_user as me, (select rolsuper from pg_roles where rolname = current_user) as superuser,
              (select pg_get_userbyid(datdba) from pg_database where datname = current_database()) as db_owner,
              (select pg_get_userbyid(nspowner) from pg_namespace where nspname = 'public') as schema_owner`,
    );
    expect(rows[0].superuser).toBe(false);
    expect(rows[0].db_owner).not.toBe(rows[0].me);
    expect(rows[0].schema_owner).not.toBe(rows[0].me);
    const owned = await client.query("select relname from pg_class c join pg_namespace n on n.oid = c.relnamespace where n.nspname = 'public' and pg_get_userbyid(c.relowner) = current_user");
    expect(owned.rows).toEqual([]);
  });

  it("may read and add to the trail", async () => {
    expect(await attempt("select count(*) from audit_event")).toBe("ok");
    expect(await attempt("insert into audit_event (action, detail) values ('security-test-probe', '{}')")).toBe("ok");
  });

  for (const table of APPEND_ONLY) {
    it(`cannot change or remove ${table}'s rows by any means`, async () => {
      expect(await attempt(`update ${table} set id = id`)).toBe(DENIED);
      expect(await attempt(`delete from ${table}`)).toBe(DENIED);
      expect(await attempt(`truncate ${table}`)).toBe(DENIED);
      expect(await attempt(`alter table ${table} disable trigger all`)).toBe(DENIED);
      expect(await attempt(`alter table ${table} disable trigger user`)).toBe(DENIED);
      expect(await attempt(`drop table ${table}`)).toBe(DENIED);
      expect(await attempt(`alter table ${table} rename to ${table}_old`)).toBe(DENIED);
      expect(await attempt(`create rule no_delete as on delete to ${table} do instead nothing`)).toBe(DENIED);
      // Granting itself more is a no-op (PostgreSQL only warns a role without grant options): it holds none of these.
      await attempt(`grant update, delete, truncate, trigger on ${table} to current_user`);
      const held = await client.query<{ p: string; has: boolean }>(
        `select p, has_table_privilege('${table}', p) as has from unnest(array['UPDATE', 'DELETE', 'TRUNCATE', 'TRIGGER', 'REFERENCES']) as p`,
      );
      expect(held.rows.filter((r) => r.has).map((r) => r.p)).toEqual([]);
    });
  }

  it("cannot drop the guards or replace the function behind them", async () => {
    expect(await attempt("drop trigger audit_event_no_update_delete on audit_event")).toBe(DENIED);
    expect(await attempt("drop trigger review_decision_no_truncate on review_decision")).toBe(DENIED);
    expect(await attempt("create or replace function audit_event_refuse_change() returns trigger as $$ begin return old; end $$ language plpgsql")).toBe(DENIED);
    expect(await attempt("create or replace function review_record_refuse_change() returns trigger as $$ begin return old; end $$ language plpgsql")).toBe(DENIED);
    expect(await attempt("drop function audit_event_refuse_change() cascade")).toBe(DENIED);
    expect(await attempt("set session_replication_role = replica")).toBe(DENIED);
  });

  it("cannot create objects in the schema or alter other tables", async () => {
    expect(await attempt("create table public.shadow_trail (id int)")).toBe(DENIED);
    expect(await attempt("create function public.evil() returns int as 'select 1' language sql")).toBe(DENIED);
    expect(await attempt("alter table bench add column evil text")).toBe(DENIED);
    expect(await attempt("drop table bench")).toBe(DENIED);
    expect(await attempt("truncate bench cascade")).toBe(DENIED);
    expect(await attempt('create trigger t before insert on bench for each row execute function audit_event_refuse_change()')).toBe(DENIED);
  });

  it("cannot touch the migration record", async () => {
    const code = await attempt("delete from drizzle.__drizzle_migrations");
    expect([DENIED, "42P01"]).toContain(code);
  });
});
