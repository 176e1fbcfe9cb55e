import { Migrator, NO_MIGRATIONS, type Kysely } from "kysely";
import { migrationProvider } from "./all";

function migrator(db: Kysely<any>): Migrator {
  return new Migrator({ db, provider: migrationProvider });
}

/** Migrates `db` to the latest schema; throws naming the failing migration. */
export async function migrateToLatest(db: Kysely<any>): Promise<string[]> {
  const { error, results } = await migrator(db).migrateToLatest();
  if (error) {
    const failed = results?.find((r) => r.status === "Error")?.migrationName ?? "unknown";
    throw new Error(`Migration ${failed} failed: ${String(error)}`);
  }
  return (results ?? []).map((r) => r.migrationName);
}

/** Rolls every migration back (used by the up → down → up test). */
export async function migrateToZero(db: Kysely<any>): Promise<void> {
  const { error } = await migrator(db).migrateTo(NO_MIGRATIONS);
  if (error) throw new Error(`Rollback failed: ${String(error)}`);
}
