import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import type { Database } from "./types";

/** The database handle, or a transaction on it (Kysely's Transaction is a Kysely): every query function takes one first. */
export type Db = Kysely<Database>;

/** Builds a Kysely handle on its own pg pool; callers own its lifetime. */
export function createDb(connectionString: string, max = 10): Db {
  const pool = new pg.Pool({ connectionString, max, connectionTimeoutMillis: 3000 });
  // An idle client that loses its connection is dropped by the pool; the next query reconnects.
  pool.on("error", (err) => console.warn(`[db] idle connection lost: ${err.message}`));
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool }) });
}
