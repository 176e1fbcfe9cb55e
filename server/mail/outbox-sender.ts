import nodemailer from "nodemailer";
import type { Db } from "@/db/client";
import { lockDueMail, markMailFailed, markMailSent } from "@/db/queries/mail";
import { withAbsoluteLinks } from "@/lib/mail/templates";
import { backoffDelay } from "../broker/mqtt-bus";
import type { Clock, Logger, Timer } from "../clock";
import { errorMessage } from "@/lib/errors";

/** What the sender needs of a nodemailer transport. */
export interface MailTransport {
  sendMail(message: { from: string; to: string[]; subject: string; text: string }): Promise<unknown>;
}

/** A nodemailer SMTP transport to host:port without TLS or auth (the local SMTP fake or a relay). */
export function smtpTransport(host: string, port: number): MailTransport {
  return nodemailer.createTransport({ host, port, secure: false, ignoreTLS: true, connectionTimeout: 5000, greetingTimeout: 5000 });
}

export interface OutboxSenderDeps {
  db: Db;
  transport: MailTransport;
  from: string;
  /** The web app's address that links in mail point to (APP_URL). */
  appUrl: string;
  clock: Clock;
  logger: Logger;
  /** How often due messages are looked for (ms); default 1000. */
  pollMs?: number;
  /** Exponential backoff after a failed attempt (ms); default 2 s doubling up to 10 min. */
  initialBackoffMs?: number;
  maxBackoffMs?: number;
  random?: () => number;
  batchSize?: number;
}

export interface OutboxSender {
  /** Sends what is due now; resolves with how many were sent (tests call it directly). */
  drain(): Promise<number>;
  stop(): Promise<void>;
}

/**
 * Delivers the mail outbox: due messages are locked (SKIP LOCKED, so two senders never send one
 * twice), sent, and marked sent; a failure is recorded and retried after full-jitter exponential
 * backoff, so nothing is lost while SMTP is down. Delivery is at least once: a crash between the
 * SMTP reply and the commit resends that message.
 */
export function startOutboxSender(deps: OutboxSenderDeps): OutboxSender {
  const initial = deps.initialBackoffMs ?? 2000;
  const max = deps.maxBackoffMs ?? 10 * 60_000;
  const random = deps.random ?? Math.random;
  let current: Promise<number> | null = null;

  async function sendDue(): Promise<number> {
    return deps.db.transaction().execute(async (trx) => {
      const now = new Date(deps.clock.now());
      let sent = 0;
      for (const m of await lockDueMail(trx, now, deps.batchSize ?? 20)) {
        try {
          await deps.transport.sendMail({ from: deps.from, to: m.recipients, subject: m.subject, text: withAbsoluteLinks(m.body, deps.appUrl) });
          await markMailSent(trx, m.id, new Date(deps.clock.now()));
          sent++;
        } catch (err) {
          const wait = Math.max(backoffDelay(m.attempts, initial, max, random), initial / 2);
          const message = errorMessage(err);
          await markMailFailed(trx, m.id, message, new Date(deps.clock.now() + wait));
          deps.logger.warn(`mail ${m.id} not sent (attempt ${m.attempts + 1}), retry in ${Math.round(wait / 1000)} s: ${message}`);
        }
      }
      return sent;
    });
  }

  function drain(): Promise<number> {
    current ??= sendDue().finally(() => {
      current = null;
    });
    return current;
  }

  const timer: Timer = deps.clock.setInterval(() => {
    drain().catch((err: Error) => deps.logger.warn(`mail outbox: ${err.message}`));
  }, deps.pollMs ?? 1000);

  return {
    drain,
    async stop() {
      deps.clock.clearInterval(timer);
      // A failure of the run in progress is logged by whoever started it (the timer, or drain's caller).
      await current?.catch(() => undefined);
    },
  };
}
