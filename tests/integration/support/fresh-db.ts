import pg from "pg";
import { createDb, type Db } from "@/db/client";
import { migrateToLatest } from "@/migrations/migrator";

const BASE_URL = process.env.TEST_DATABASE_URL ?? "postgres://postgres@127.0.0.1:5433/tapwright_test";

async function admin<T>(fn: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: BASE_URL });
  await client.connect();
  try {
    return await fn(client);
  } finally {
    await client.end();
  }
}

/** Whether a drop was refused for a backend of another role: an autovacuum worker (the cluster's superuser) still in the database. */
function heldByAutovacuum(err: unknown): boolean {
  return err instanceof Error && "code" in err && err.code === "42501";
}

/** Drops a test database; an autovacuum worker in it refuses FORCE for a moment, so this tries again, at most ten times. */
async function dropDatabase(name: string): Promise<void> {
  for (let attempt = 1; ; attempt++) {
    try {
      await admin((c) => c.query(`drop database if exists "${name}" with (force)`));
      return;
    } catch (err) {
      if (!heldByAutovacuum(err) || attempt === 10) throw err;
      await new Promise((r) => setTimeout(r, 200));
    }
  }
}

/** A new, empty database on the test cluster (never the demo's); returns its URL and a dropper. */
export async function createTestDatabase(label: string): Promise<{ url: string; drop: () => Promise<void> }> {
  const name = `tw_${label.replace(/[^a-z0-9_]/g, "_")}_${process.pid}_${Date.now().toString(36)}`;
  await admin((c) => c.query(`create database "${name}"`));
  const url = new URL(BASE_URL);
  url.pathname = `/${name}`;
  return {
    url: url.toString(),
    drop: () => dropDatabase(name),
  };
}

/** A migrated test database with its Kysely handle. */
export async function freshDb(label: string): Promise<{ db: Db; url: string; close: () => Promise<void> }> {
  const { url, drop } = await createTestDatabase(label);
  const db = createDb(url, 4);
  await migrateToLatest(db);
  return {
    db,
    url,
    close: async () => {
      await db.destroy();
      await drop();
    },
  };
}
