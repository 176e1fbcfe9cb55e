import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { grantAppRole } from "@/db/grants";
import { freshDb } from "./support/fresh-db";

/**
 * The app's database role (db/cluster.sh: tapwright_app) against a migrated database: it does what the
 * app does and nothing that would get past the audit log's append-only rule. Needs TEST_APP_DATABASE_URL
 * (npm test sets it from the local cluster).
 */
const APP_URL = process.env.TEST_APP_DATABASE_URL;

describe.skipIf(!APP_URL)("the app's database role", () => {
  let fresh: Awaited<ReturnType<typeof freshDb>>;
  let app: pg.Client;

  beforeAll(async () => {
    fresh = await freshDb("db_roles");
    const appUrl = new URL(APP_URL!);
    await grantAppRole(fresh.db, decodeURIComponent(appUrl.username));
    appUrl.pathname = new URL(fresh.url).pathname;
    app = new pg.Client({ connectionString: appUrl.toString() });
    await app.connect();
  });
  afterAll(async () => {
    await app?.end();
    await fresh?.close();
  });

  /** The SQLSTATE a statement fails with, or "ok". */
  async function outcome(statement: string): Promise<string> {
    try {
      await app.query(statement);
      return "ok";
    } catch (err) {
      return (err as { code?: string }).code ?? String(err);
    }
  }

  it("writes and reads what the app writes and reads", async () => {
    expect(await outcome("insert into audit_log (action, entity) values ('test.write', 'test')")).toBe("ok");
    expect(await outcome("select count(*) from audit_log")).toBe("ok");
    expect(await outcome("insert into users (email, display_name, password_hash, role) values ('r@x.test', 'R', 'x', 'operator')")).toBe("ok");
    expect(await outcome("update users set display_name = 'R2' where email = 'r@x.test'")).toBe("ok");
    expect(await outcome("insert into login_throttle (key) values ('address:10.0.0.1')")).toBe("ok");
    expect(await outcome("delete from login_throttle")).toBe("ok");
  });

  it("cannot change, empty or unprotect the audit log (42501 insufficient privilege)", async () => {
    expect(await outcome("truncate audit_log")).toBe("42501");
    expect(await outcome("update audit_log set action = 'forged'")).toBe("42501");
    expect(await outcome("delete from audit_log")).toBe("42501");
    expect(await outcome("alter table audit_log disable trigger all")).toBe("42501");
    expect(await outcome("drop trigger audit_log_no_change on audit_log")).toBe("42501");
    expect(await outcome("drop table audit_log")).toBe("42501");
  });

  it("owns nothing and may not change the schema", async () => {
    expect(await outcome("create table intruder (id int)")).toBe("42501");
    expect(await outcome("truncate users")).toBe("42501");
    expect(await outcome("alter table users add column x int")).toBe("42501");
    expect(await outcome("select * from kysely_migration")).toBe("42501");
    expect(await outcome("update reviews set comment = 'changed'")).toBe("42501");
    const owned = await app.query("select count(*)::int as n from pg_class where relowner = (select oid from pg_roles where rolname = current_user)");
    expect(owned.rows[0].n).toBe(0);
    expect(await outcome("create database intruder")).toBe("42501");
  });
});
