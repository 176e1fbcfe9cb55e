import { createDb } from "@/db/client";
import { env } from "@/lib/env";
import { migrateToLatest } from "./migrator";

const db = createDb(env().DATABASE_URL, 1);
try {
  const applied = await migrateToLatest(db);
  console.log(applied.length ? `migrated: ${applied.join(", ")}` : "schema up to date");
} finally {
  await db.destroy();
}
