import { env } from "@/lib/env";
import { createDb } from "./client";
import { seedDemo } from "./seed";
import { seedDemoProduction } from "./seed-demo-production";
import { seedDemoDeviceCredentials } from "./seed-device-credentials";

const e = env();
const db = createDb(e.MIGRATION_DATABASE_URL ?? e.DATABASE_URL, 1);
try {
  await seedDemo(db, e.DEMO_PASSWORD);
  await seedDemoDeviceCredentials(db, e.SESSION_SECRET);
  console.log("demo lab seeded (with one broker credential per demo device)");
  if (e.DEMO_PRODUCTION === "1" && (await seedDemoProduction(db))) {
    console.log("demo production filter requested on the supply pressure (the demo device acknowledges it once the sidecar runs)");
  }
} finally {
  await db.destroy();
}
