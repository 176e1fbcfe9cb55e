import { Kysely, PostgresDialect } from "kysely";
import pg from "pg";
import type { Database } from "./types";

export type Db = Kysely<Database>;

/** Builds a Kysely handle on its own pg pool; callers own its lifetime. */
export function createDb(connectionString: string, max = 10): Db {
  const pool = new pg.Pool({ connectionString, max, connectionTimeoutMillis: 3000 });
  pool.on("error", () => undefined);
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool }) });
}
