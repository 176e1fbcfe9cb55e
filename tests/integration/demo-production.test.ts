import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seed";
import { seedDemoProduction } from "@/db/seed-demo-production";
import { DEMO_PRODUCTION } from "@/lib/demo/lab";
import { freshDb } from "./support/fresh-db";

let lab: Awaited<ReturnType<typeof freshDb>>;

beforeAll(async () => {
  lab = await freshDb("demo_production");
  await seedDemo(lab.db, "demo-password");
}, 60_000);
afterAll(() => lab?.close());

describe("the demo's production filter (npm start)", () => {
  it("is saved by the engineer, approved by the lead and promoted on the supply pressure, once", async () => {
    expect(await seedDemoProduction(lab.db)).toBe(true);
    const rows = await lab.db
      .selectFrom("deployments as d")
      .innerJoin("revisions as r", "r.id", "d.revision_id")
      .innerJoin("coefficient_sets as s", "s.id", "r.set_id")
      .innerJoin("users as author", "author.id", "r.author_id")
      .innerJoin("users as lead", "lead.id", "d.requested_by")
      .select(["d.state", "d.kind", "r.state as revisionState", "s.name", "author.email as author", "lead.email as lead"])
      .execute();
    expect(rows).toEqual([
      { state: "pending", kind: "promote", revisionState: "approved", name: DEMO_PRODUCTION.name, author: "engineer@tapwright.test", lead: "lead@tapwright.test" },
    ]);
    const reviews = await lab.db.selectFrom("audit_log").select("action").where("action", "like", "revision.%").orderBy("id").execute();
    expect(reviews.map((r) => r.action)).toEqual(expect.arrayContaining(["revision.create", "revision.submit", "revision.approve"]));
    // A second start leaves the demo as it is.
    expect(await seedDemoProduction(lab.db)).toBe(false);
    expect(await lab.db.selectFrom("deployments").select("id").execute()).toHaveLength(1);
  });
});
