import { SMTPServer } from "smtp-server";
import type { Db } from "@/db/client";
import { storeReceivedMail } from "@/db/queries/mail";
import type { Logger } from "../clock";
import { parseMessage } from "./mime";

export interface FakeSmtp {
  port: number;
  close(): Promise<void>;
}

/** Largest message the fake accepts (bytes). */
const MAX_MESSAGE_BYTES = 1 << 20;

/**
 * A development SMTP server on loopback that accepts every message (no auth, no TLS) and stores it
 * in the mailbox table for /admin/mail. It never relays anything anywhere.
 */
export async function startFakeSmtp(deps: { db: Db; host?: string; port: number; logger: Logger }): Promise<FakeSmtp> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["AUTH", "STARTTLS"],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("end", () => {
        const raw = Buffer.concat(chunks).toString("utf8");
        const { subject, body } = parseMessage(raw);
        const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : "";
        const to = session.envelope.rcptTo.map((r) => r.address);
        storeReceivedMail(deps.db, { envelopeFrom: from, envelopeTo: to, subject, body, raw }).then(
          () => callback(),
          (err: Error) => {
            deps.logger.warn(`fake SMTP could not store a message: ${err.message}`);
            callback(new Error("mailbox unavailable, try again later"));
          },
        );
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(deps.port, deps.host ?? "127.0.0.1", () => resolve());
  });
  const address = server.server.address();
  const port = typeof address === "object" && address ? address.port : deps.port;
  deps.logger.info(`fake SMTP listening on ${deps.host ?? "127.0.0.1"}:${port}`);
  return { port, close: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}
