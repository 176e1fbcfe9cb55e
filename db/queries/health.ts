import { sql } from "kysely";
import type { Db } from "../client";

/** Resolves when PostgreSQL answers a trivial query; rejects with the driver's error otherwise. */
export async function ping(db: Db): Promise<void> {
  await sql`select 1`.execute(db);
}
