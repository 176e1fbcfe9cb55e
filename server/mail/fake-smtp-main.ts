import { createDb } from "@/db/client";
import { env } from "@/lib/env";
import { consoleLogger } from "../clock";
import { startFakeSmtp } from "./fake-smtp";

/** Entry point of the development SMTP fake: `node --import tsx server/mail/fake-smtp-main.ts`. */
const db = createDb(env().DATABASE_URL, 2);
const smtp = await startFakeSmtp({ db, port: env().SMTP_PORT, logger: consoleLogger });

async function shutdown(): Promise<void> {
  await smtp.close();
  await db.destroy();
  process.exit(0);
}
process.on("SIGTERM", () => void shutdown());
process.on("SIGINT", () => void shutdown());
