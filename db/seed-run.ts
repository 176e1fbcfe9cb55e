import { env } from "@/lib/env";
import { createDb } from "./client";
import { seedDemo } from "./seed";
import { seedDemoDeviceCredentials } from "./seed-device-credentials";

const e = env();
const db = createDb(e.MIGRATION_DATABASE_URL ?? e.DATABASE_URL, 1);
try {
  await seedDemo(db, e.DEMO_PASSWORD);
  await seedDemoDeviceCredentials(db, e.SESSION_SECRET);
  console.log("demo lab seeded (with one broker credential per demo device)");
} finally {
  await db.destroy();
}
