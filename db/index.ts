import { env } from "@/lib/env";
import { createDb, type Db } from "./client";

declare global {
  // One handle per process, kept on globalThis so that Next's module reloads in development reuse it.
  var tapwrightDb: Db | undefined;
}

/** The process-wide database handle (one pool per process). */
export function db(): Db {
  globalThis.tapwrightDb ??= createDb(env().DATABASE_URL);
  return globalThis.tapwrightDb;
}
