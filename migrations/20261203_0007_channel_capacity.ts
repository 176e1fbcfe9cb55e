import { sql, type Kysely } from "kysely";

/**
 * What each device channel can run: at most max_sections second-order sections and max_fir_taps FIR
 * taps over all the stages of its filter chain. The defaults keep every channel able to take what it
 * could take before chains (up to 64 sections) and add a moderate FIR budget; the upper bounds are the
 * device configuration document's (lib/protocol MAX_CONFIG_SECTIONS, MAX_CONFIG_TAPS). Adding columns
 * with constant defaults rewrites no stored revision or deployment.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await db.schema
    .alterTable("channels")
    .addColumn("max_sections", "integer", (c) => c.notNull().defaultTo(64).check(sql`max_sections between 0 and 64`))
    .addColumn("max_fir_taps", "integer", (c) => c.notNull().defaultTo(256).check(sql`max_fir_taps between 0 and 1024`))
    .execute();
}

export async function down(db: Kysely<any>): Promise<void> {
  await db.schema.alterTable("channels").dropColumn("max_fir_taps").dropColumn("max_sections").execute();
}
