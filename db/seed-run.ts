import { env } from "@/lib/env";
import { createDb } from "./client";
import { seedDemo } from "./seed";

const e = env();
const db = createDb(e.DATABASE_URL, 1);
try {
  await seedDemo(db, e.DEMO_PASSWORD);
  console.log("demo lab seeded");
} finally {
  await db.destroy();
}
