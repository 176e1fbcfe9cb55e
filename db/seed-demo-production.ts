import { buildRevisionContent } from "@/lib/coefficients";
import type { SessionUser } from "@/lib/auth/guard";
import { DEMO_PRODUCTION } from "@/lib/demo/lab";
import type { Db } from "./client";
import { findChannelByPath } from "./queries/channels";
import { requestPromotion } from "./workflow/deployments";
import { transitionRevision } from "./workflow/review";
import { createSet } from "./workflow/sets";
import { findUserByEmail } from "./queries/users";

async function demoUser(db: Db, email: string): Promise<SessionUser> {
  const user = await findUserByEmail(db, email);
  if (!user) throw new Error(`the demo account ${email} is missing; seed the demo lab first`);
  return { id: user.id, email: user.email, name: user.display_name, role: user.role };
}

/**
 * Puts DEMO_PRODUCTION into production the way people would: the demo engineer saves and submits
 * it, the demo lead approves and promotes it; the sidecar's deployment worker then sends it and the
 * demo device acknowledges it. Only on a channel that has never had a coefficient set (idempotent,
 * and a demo that someone has worked on is left alone). Returns whether it requested a promotion.
 */
export async function seedDemoProduction(db: Db): Promise<boolean> {
  const channel = await findChannelByPath(db, DEMO_PRODUCTION.channel);
  if (!channel) throw new Error(`the demo channel ${DEMO_PRODUCTION.channel} is missing; seed the demo lab first`);
  const had = await db.selectFrom("coefficient_sets").select("id").where("channel_id", "=", channel.id).executeTakeFirst();
  if (had) return false;
  const engineer = await demoUser(db, "engineer@tapwright.test");
  const lead = await demoUser(db, "lead@tapwright.test");
  const { spec, name, notes } = DEMO_PRODUCTION;
  const content = buildRevisionContent(spec, channel.coefficientFormat);
  await db.transaction().execute(async (trx) => {
    const saved = await createSet(trx, engineer, channel.id, name, { spec, content, notes, format: channel.coefficientFormat, sampleRateHz: channel.sampleRateHz });
    await transitionRevision(trx, engineer, { revisionId: saved.revisionId, action: "submit", expectedVersion: 1 });
    await transitionRevision(trx, lead, { revisionId: saved.revisionId, action: "approve", expectedVersion: 2, comment: "Demo: approved for the lab." });
    await requestPromotion(trx, lead, saved.revisionId, [channel.path]);
  });
  return true;
}
