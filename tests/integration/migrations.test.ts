import { sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDb, type Db } from "@/db/client";
import { seedDemo } from "@/db/seed";
import { DEMO_RIGS } from "@/lib/demo/lab";
import { migrations } from "@/migrations/all";
import { migrateToLatest, migrateToZero } from "@/migrations/migrator";
import { createTestDatabase } from "./support/fresh-db";

let db: Db;
let drop: () => Promise<void>;

beforeAll(async () => {
  const created = await createTestDatabase("migrations");
  drop = created.drop;
  db = createDb(created.url, 2);
});

afterAll(async () => {
  await db.destroy();
  await drop();
});

async function tables(): Promise<string[]> {
  const rows = await sql<{ name: string }>`
    select table_name as name from information_schema.tables
    where table_schema = 'public' and table_name not like 'kysely_%' order by 1`.execute(db);
  return rows.rows.map((r) => r.name);
}

describe("migrations on a real PostgreSQL", () => {
  it("go up, all the way down and up again", async () => {
    const applied = await migrateToLatest(db);
    expect(applied).toEqual(Object.keys(migrations));
    const afterUp = await tables();
    expect(afterUp).toEqual(expect.arrayContaining(["users", "rigs", "devices", "channels", "audit_log"]));
    await migrateToZero(db);
    expect(await tables()).toEqual([]);
    await migrateToLatest(db);
    expect(await tables()).toEqual(afterUp);
  });

  it("apply nothing when already current", async () => {
    expect(await migrateToLatest(db)).toEqual([]);
  });

  it("keep the audit log append-only", async () => {
    await db.insertInto("audit_log").values({ actor_id: null, action: "test", entity: "test", entity_id: null, before: null, after: null }).execute();
    await expect(db.updateTable("audit_log").set({ action: "changed" }).execute()).rejects.toThrow(/append-only/);
    await expect(db.deleteFrom("audit_log").execute()).rejects.toThrow(/append-only/);
  });

  it("refuse keys that cannot form a channel path", async () => {
    await expect(db.insertInto("rigs").values({ key: "Bad/Key", name: "x" }).execute()).rejects.toThrow();
  });

  it("seed the demo lab idempotently", async () => {
    await seedDemo(db, "tapwright-demo");
    await seedDemo(db, "tapwright-demo");
    const channels = await db.selectFrom("channels").select(({ fn }) => fn.countAll<string>().as("n")).executeTakeFirstOrThrow();
    const expected = DEMO_RIGS.flatMap((r) => r.devices.flatMap((d) => d.channels)).length;
    expect(Number(channels.n)).toBe(expected);
    const users = await db.selectFrom("users").select(["email", "role"]).orderBy("email").execute();
    expect(users.map((u) => u.role).sort()).toEqual(["admin", "engineer", "lead", "operator"]);
  });
});
