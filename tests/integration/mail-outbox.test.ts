import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { enqueueMail } from "@/db/queries/mail";
import { deploymentMail } from "@/lib/mail/templates";
import type { Clock, Logger } from "@/server/clock";
import { startFakeSmtp, type FakeSmtp } from "@/server/mail/fake-smtp";
import { smtpTransport, startOutboxSender } from "@/server/mail/outbox-sender";
import { setUpLab } from "./sets-fixture";

let lab: Awaited<ReturnType<typeof setUpLab>>;
const logger: Logger = { info: () => undefined, warn: () => undefined };
let now = Date.now() + 60_000; // ahead of the database clock, so rows written with now() are due
const manualClock: Clock = {
  now: () => now,
  setInterval: () => setTimeout(() => undefined, 0),
  clearInterval: () => undefined,
  setTimeout: () => setTimeout(() => undefined, 0),
  clearTimeout: () => undefined,
};

beforeAll(async () => {
  lab = await setUpLab("mail_outbox");
});
afterAll(() => lab.close());

const ref = { setId: 7, setName: "Torque LP", revision: 3, channel: "gearbox-endurance/torque-node/input-torque" };

async function mailbox() {
  return lab.db.selectFrom("mailbox").selectAll().orderBy("id").execute();
}

describe("mail through the outbox and the SMTP fake", () => {
  let smtp: FakeSmtp;

  it("delivers an outbox message with nodemailer to the fake, which stores it decoded in the mailbox", async () => {
    smtp = await startFakeSmtp({ db: lab.db, port: 0, logger });
    await enqueueMail(lab.db, ["engineer@tapwright.test", "lead@tapwright.test"], deploymentMail({ ...ref, target: "hydraulic-press/env-node/frame-strain" }, "promoted", "Checksum ab12."));
    const sender = startOutboxSender({ db: lab.db, transport: smtpTransport("127.0.0.1", smtp.port), from: "Tapwright <tapwright@tapwright.test>", appUrl: "https://tapwright.cobalt-ridge.test/", clock: manualClock, logger });
    expect(await sender.drain()).toBe(1);
    await sender.stop();
    const [m] = await mailbox();
    expect(m.subject).toBe(`Active: Torque LP r3 (${ref.channel}) → hydraulic-press/env-node/frame-strain`);
    expect(m.envelope_to).toEqual(["engineer@tapwright.test", "lead@tapwright.test"]);
    expect(m.envelope_from).toBe("tapwright@tapwright.test");
    expect(m.body).toContain("is now active on hydraulic-press/env-node/frame-strain; the device acknowledged it.");
    expect(m.body).toContain("— Tapwright");
    expect(m.body).toContain("Open it in Tapwright: https://tapwright.cobalt-ridge.test/sets/7\n");
    const outbox = await lab.db.selectFrom("mail_outbox").select(["sent_at", "attempts"]).executeTakeFirstOrThrow();
    expect(outbox.sent_at).not.toBeNull();
    expect(outbox.attempts).toBe(1);
    await smtp.close();
  });

  it("keeps a message through an SMTP outage and delivers it after the backoff", async () => {
    const port = smtp.port;
    await enqueueMail(lab.db, ["engineer@tapwright.test"], deploymentMail({ ...ref, target: ref.channel }, "failed", "Reason: no acknowledgement"));
    const sender = startOutboxSender({
      db: lab.db, transport: smtpTransport("127.0.0.1", port), from: "tapwright@tapwright.test", appUrl: "http://127.0.0.1:3000", clock: manualClock, logger,
      initialBackoffMs: 1000, random: () => 1,
    });
    expect(await sender.drain()).toBe(0);
    expect(await sender.drain()).toBe(0);
    const failed = await lab.db.selectFrom("mail_outbox").selectAll().where("sent_at", "is", null).executeTakeFirstOrThrow();
    expect(failed.attempts).toBe(1);
    expect(failed.last_error).toMatch(/ECONNREFUSED|connect/i);
    expect(failed.next_attempt_at.getTime()).toBe(now + 1000);

    now += 1000;
    expect(await sender.drain()).toBe(0);
    const twice = await lab.db.selectFrom("mail_outbox").select(["attempts", "next_attempt_at"]).where("id", "=", failed.id).executeTakeFirstOrThrow();
    expect(twice.attempts).toBe(2);
    expect(twice.next_attempt_at.getTime()).toBe(now + 2000); // doubled

    smtp = await startFakeSmtp({ db: lab.db, port, logger });
    now += 1999;
    expect(await sender.drain()).toBe(0); // not due yet
    now += 1;
    expect(await sender.drain()).toBe(1);
    await sender.stop();
    await smtp.close();
    const last = (await mailbox()).at(-1)!;
    expect(last.subject).toMatch(/^Deployment failed: Torque LP r3/);
    expect(last.body).toContain("the previous filter stays active");
  });
});
