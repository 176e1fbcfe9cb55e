import { Migrator, sql } from "kysely";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDb, type Db } from "@/db/client";
import { seedDemo } from "@/db/seed";
import { DEMO_RIGS } from "@/lib/demo/lab";
import { currentChannelConfig } from "@/lib/coefficients";
import { migrationProvider, migrations } from "@/migrations/all";
import { migrateToLatest, migrateToZero } from "@/migrations/migrator";
import { firLowpass255, legacyFirRevision } from "../unit/coefficients-support";
import { createTestDatabase } from "./support/fresh-db";

let db: Db;
let drop: () => Promise<void>;

beforeAll(async () => {
  const created = await createTestDatabase("migrations");
  drop = created.drop;
  db = createDb(created.url, 2);
});

afterAll(async () => {
  await db.destroy();
  await drop();
});

async function tables(): Promise<string[]> {
  const rows = await sql<{ name: string }>`
    select table_name as name from information_schema.tables
    where table_schema = 'public' and table_name not like 'kysely_%' order by 1`.execute(db);
  return rows.rows.map((r) => r.name);
}

describe("migrations on a real PostgreSQL", () => {
  it("go up, all the way down and up again", async () => {
    const applied = await migrateToLatest(db);
    expect(applied).toEqual(Object.keys(migrations));
    const afterUp = await tables();
    expect(afterUp).toEqual(expect.arrayContaining(["users", "rigs", "devices", "channels", "audit_log"]));
    await migrateToZero(db);
    expect(await tables()).toEqual([]);
    await migrateToLatest(db);
    expect(await tables()).toEqual(afterUp);
  });

  it("apply nothing when already current", async () => {
    expect(await migrateToLatest(db)).toEqual([]);
  });

  it("keep the audit log append-only", async () => {
    await db.insertInto("audit_log").values({ actor_id: null, action: "test", entity: "test", entity_id: null, before: null, after: null }).execute();
    await expect(db.updateTable("audit_log").set({ action: "changed" }).execute()).rejects.toThrow(/append-only/);
    await expect(db.deleteFrom("audit_log").execute()).rejects.toThrow(/append-only/);
  });

  it("refuse keys that cannot form a channel path", async () => {
    await expect(db.insertInto("rigs").values({ key: "Bad/Key", name: "x" }).execute()).rejects.toThrow();
  });

  it("seed the demo lab idempotently", async () => {
    await seedDemo(db, "tapwright-demo");
    await seedDemo(db, "tapwright-demo");
    const channels = await db.selectFrom("channels").select(({ fn }) => fn.countAll<string>().as("n")).executeTakeFirstOrThrow();
    const expected = DEMO_RIGS.flatMap((r) => r.devices.flatMap((d) => d.channels)).length;
    expect(Number(channels.n)).toBe(expected);
    const users = await db.selectFrom("users").select(["email", "role"]).orderBy("email").execute();
    expect(users.map((u) => u.role).sort()).toEqual(["admin", "engineer", "lead", "operator"]);
  });
});

describe("the channel capacity migration on a database written before chains", () => {
  let old: Db;
  let dropOld: () => Promise<void>;
  beforeAll(async () => {
    const created = await createTestDatabase("migrations_before_chains");
    dropOld = created.drop;
    old = createDb(created.url, 2);
  });
  afterAll(async () => {
    await old.destroy();
    await dropOld();
  });

  /** Every stored coefficient of revisions and deployments, as PostgreSQL holds them. */
  const storedText = async () =>
    (
      await sql<{ row: string }>`
        select concat_ws('|', r.spec::text, r.design::text, r.quantized::text, r.analysis::text, p.config::text, p.checksum) as row
        from revisions r join deployments p on p.revision_id = r.id order by r.id`.execute(old)
    ).rows.map((r) => r.row);

  it("adds capacity with its defaults and changes no stored revision or deployment, up, down and up again", async () => {
    const before = Object.keys(migrations).filter((name) => name < "20261203_0007_channel_capacity");
    const { error } = await new Migrator({ db: old, provider: migrationProvider }).migrateTo(before.at(-1)!);
    expect(error).toBeUndefined();
    // Rows as the version before chains wrote them: an FIR stored with its Q15 sections, and a v2 deployment entry.
    const rev = legacyFirRevision();
    const legacyEntry = { revisionId: "1", format: "q15", sampleRateHz: 1000, sections: (rev.quantized?.integers ?? []).map((words, i) => ({ words, shift: rev.quantized!.shifts[i] })) };
    await sql`insert into rigs (key, name) values ('rig', 'Rig')`.execute(old);
    await sql`insert into devices (rig_id, key, name, coefficient_format) values (1, 'node', 'Node', 'q15')`.execute(old);
    await sql`insert into channels (device_id, key, name, unit, sample_rate_hz, range_min, range_max) values (1, 'ch', 'Ch', 'V', 1000, -1, 1)`.execute(old);
    await sql`insert into users (email, display_name, password_hash, role) values ('e@x.test', 'E', 'x', 'engineer')`.execute(old);
    await sql`insert into coefficient_sets (channel_id, name, created_by, latest_revision) values (1, 'Old FIR', 1, 1)`.execute(old);
    await sql`insert into revisions (set_id, revision, spec, design, device_format, quantized, analysis, sample_rate_hz, author_id, state)
      values (1, 1, ${JSON.stringify({ ...firLowpass255, taps: 31 })}::jsonb, ${JSON.stringify(rev.design)}::jsonb, 'q15',
              ${JSON.stringify(rev.quantized)}::jsonb, '{"stable": true}'::jsonb, 1000, 1, 'approved')`.execute(old);
    await sql`insert into deployments (revision_id, channel_id, kind, state, format, config, checksum, requested_by)
      values (1, 1, 'promote', 'active', 'q15', ${JSON.stringify(legacyEntry)}::jsonb, ${"a".repeat(64)}, 1)`.execute(old);
    const stored = await storedText();

    await migrateToLatest(old);
    expect(await storedText()).toEqual(stored);
    expect(await old.selectFrom("channels").select(["max_sections", "max_fir_taps"]).executeTakeFirstOrThrow()).toEqual({ max_sections: 64, max_fir_taps: 256 });
    const { config } = await old.selectFrom("deployments").select("config").executeTakeFirstOrThrow();
    expect(currentChannelConfig(config)).toMatchObject({ stages: [{ kind: "sections", sections: legacyEntry.sections }] });

    const { error: down } = await new Migrator({ db: old, provider: migrationProvider }).migrateTo(before.at(-1)!);
    expect(down).toBeUndefined();
    await migrateToLatest(old);
    expect(await storedText()).toEqual(stored);
  });
});
