import { env } from "@/lib/env";
import { createDb, type Db } from "./client";

const holder = globalThis as unknown as { tapwrightDb?: Db };

/** The process-wide database handle (one pool per process). */
export function db(): Db {
  holder.tapwrightDb ??= createDb(env().DATABASE_URL);
  return holder.tapwrightDb;
}
