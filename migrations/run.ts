import { createDb } from "@/db/client";
import { grantAppRole } from "@/db/grants";
import { env } from "@/lib/env";
import { migrateToLatest } from "./migrator";

/**
 * Migrates as the schema's owner (MIGRATION_DATABASE_URL, or DATABASE_URL when only that is set),
 * then grants the app's role (DATABASE_URL's user, when it is another role) what the app may do.
 */
const e = env();
const ownerUrl = e.MIGRATION_DATABASE_URL ?? e.DATABASE_URL;
const db = createDb(ownerUrl, 1);
try {
  const applied = await migrateToLatest(db);
  console.log(applied.length ? `migrated: ${applied.join(", ")}` : "schema up to date");
  const appRole = decodeURIComponent(new URL(e.DATABASE_URL).username);
  if (appRole && appRole !== decodeURIComponent(new URL(ownerUrl).username)) {
    await grantAppRole(db, appRole);
    console.log(`granted the app's privileges to ${appRole}`);
  }
} finally {
  await db.destroy();
}
