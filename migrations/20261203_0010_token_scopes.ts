import { sql, type Kysely } from "kysely";

/**
 * API token scopes and their safety rules:
 * - scope `read` (exports and reads; what `export:read` was) or `promote` (may also request the
 *   promotion of an approved revision; only leads create one);
 * - why a token was revoked: `revoked` (by a person) or `owner_disabled`: disabling a user revokes
 *   every live token of theirs in the same statement (trigger below), so re-enabling the user brings
 *   none of them back;
 * - a fixed one-minute request window per token (start and count) for the rate limit.
 */
export async function up(db: Kysely<any>): Promise<void> {
  await sql`alter table api_tokens drop constraint api_tokens_scope_check`.execute(db);
  await sql`update api_tokens set scope = 'read'`.execute(db);
  await db.schema.alterTable("api_tokens").alterColumn("scope", (c) => c.setDefault("read")).execute();
  await db.schema.alterTable("api_tokens").addCheckConstraint("api_tokens_scope_check", sql`scope in ('read', 'promote')`).execute();
  await db.schema
    .alterTable("api_tokens")
    .addColumn("revoked_reason", "text", (c) => c.check(sql`revoked_reason in ('revoked', 'owner_disabled')`))
    .addColumn("window_start", "timestamptz")
    .addColumn("window_count", "integer", (c) => c.notNull().defaultTo(0))
    .execute();
  await sql`update api_tokens set revoked_reason = 'revoked' where revoked_at is not null`.execute(db);
  await db.schema
    .alterTable("api_tokens")
    .addCheckConstraint("api_tokens_revoked_reason", sql`(revoked_at is null) = (revoked_reason is null)`)
    .execute();
  await sql`
    create function api_tokens_revoke_on_disable() returns trigger language plpgsql as $$
    begin
      update api_tokens set revoked_at = now(), revoked_reason = 'owner_disabled'
      where user_id = new.id and revoked_at is null;
      return new;
    end $$`.execute(db);
  await sql`
    create trigger users_disable_revokes_tokens after update of disabled on users
    for each row when (new.disabled and not old.disabled) execute function api_tokens_revoke_on_disable()`.execute(db);
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop trigger users_disable_revokes_tokens on users`.execute(db);
  await sql`drop function api_tokens_revoke_on_disable()`.execute(db);
  await db.schema.alterTable("api_tokens").dropConstraint("api_tokens_revoked_reason").execute();
  await db.schema.alterTable("api_tokens").dropColumn("window_count").dropColumn("window_start").dropColumn("revoked_reason").execute();
  await sql`alter table api_tokens drop constraint api_tokens_scope_check`.execute(db);
  // Before scopes every token could read; a promote token keeps what it could do then.
  await sql`update api_tokens set scope = 'export:read'`.execute(db);
  await db.schema.alterTable("api_tokens").alterColumn("scope", (c) => c.setDefault("export:read")).execute();
  await db.schema.alterTable("api_tokens").addCheckConstraint("api_tokens_scope_check", sql`scope in ('export:read')`).execute();
}
