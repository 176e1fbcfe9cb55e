import { createHash, randomBytes } from "node:crypto";
import { sql, type Transaction } from "kysely";
import type { SessionUser } from "@/lib/auth/guard";
import { roleAtLeast } from "@/lib/auth/roles";
import { requireScopeCreator, TOKEN_RATE } from "@/lib/auth/token-scope";
import { AppError } from "@/lib/errors";
import type { Db } from "../client";
import type { Database, TokenScope } from "../types";
import { appendAudit } from "./audit";


/** `tw_` and 32 random bytes in base64url (43 characters): 256 bits, never guessable. */
const TOKEN_PATTERN = /^tw_[A-Za-z0-9_-]{43}$/;

/** A new API token: 256 bits from the OS random source, recognisable by its `tw_` prefix. */
export function generateToken(): string {
  return `tw_${randomBytes(32).toString("base64url")}`;
}

/**
 * Lowercase hex SHA-256 of a token, the only form stored. Usual practice for high-entropy API
 * tokens: a slow password hash (scrypt) only helps against guessable secrets, and a fast hash
 * lets every request look the token up by an indexed equality.
 */
export function hashToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

export interface TokenView {
  id: number;
  userId: number;
  owner: string;
  name: string;
  scope: TokenScope;
  createdAt: Date;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
  revokedReason: "revoked" | "owner_disabled" | null;
}

function tokenQuery(db: Db) {
  return db
    .selectFrom("api_tokens as t")
    .innerJoin("users as u", "u.id", "t.user_id")
    .select([
      "t.id",
      "t.user_id as userId",
      "u.display_name as owner",
      "t.name",
      "t.scope",
      "t.created_at as createdAt",
      "t.last_used_at as lastUsedAt",
      "t.revoked_at as revokedAt",
      "t.revoked_reason as revokedReason",
    ]);
}

/** Engineers see their own tokens; leads and admins see everyone's. Newest first. */
export function listTokens(db: Db, actor: SessionUser): Promise<TokenView[]> {
  const q = tokenQuery(db).orderBy("t.id", "desc");
  return roleAtLeast(actor.role, "lead") ? q.execute() : q.where("t.user_id", "=", actor.id).execute();
}

/**
 * Creates a token of a scope for the actor (read: engineer or higher; promote: lead or higher) and
 * audits it; the token text is returned once and never stored.
 */
export async function createToken(
  trx: Transaction<Database>,
  actor: SessionUser,
  name: string,
  scope: TokenScope,
): Promise<{ token: string; view: TokenView }> {
  requireScopeCreator(actor.role, scope);
  const token = generateToken();
  const row = await trx
    .insertInto("api_tokens")
    .values({ user_id: actor.id, name, token_hash: hashToken(token), scope })
    .returning("id")
    .executeTakeFirstOrThrow();
  await appendAudit(trx, { actorId: actor.id, action: "token.create", entity: "api_token", entityId: row.id, after: { name, scope } });
  const view = await tokenQuery(trx).where("t.id", "=", row.id).executeTakeFirstOrThrow();
  return { token, view };
}

/** Revokes a token: its owner, or a lead/admin for anyone's. Audited; revoking twice is a 409. */
export async function revokeToken(trx: Transaction<Database>, actor: SessionUser, id: number): Promise<TokenView> {
  const found = await tokenQuery(trx).where("t.id", "=", id).executeTakeFirst();
  if (!found || (found.userId !== actor.id && !roleAtLeast(actor.role, "lead"))) throw new AppError("not_found", "No such token.");
  if (found.revokedAt) throw new AppError("conflict", `Token "${found.name}" is already revoked.`);
  const revoked = await trx
    .updateTable("api_tokens")
    .set({ revoked_at: sql`now()`, revoked_reason: "revoked" })
    .where("id", "=", id)
    .where("revoked_at", "is", null)
    .returning("revoked_at")
    .executeTakeFirst();
  if (!revoked) throw new AppError("conflict", `Token "${found.name}" is already revoked.`);
  await appendAudit(trx, {
    actorId: actor.id,
    action: "token.revoke",
    entity: "api_token",
    entityId: id,
    before: { name: found.name, owner: found.userId },
    after: { revokedAt: revoked.revoked_at },
  });
  return { ...found, revokedAt: revoked.revoked_at };
}

/** A token that authenticated a request: who it acts for, which token, and whether it is over its rate. */
export interface TokenUse {
  user: SessionUser;
  token: { id: number; name: string; scope: TokenScope };
  /** More than TOKEN_RATE.maxPerWindow requests inside the current window (answer 429). */
  limited: boolean;
}

/**
 * The use of a bearer token, or null when it is malformed, unknown, revoked or its owner is disabled
 * (disabling revokes it for good, see migration 0010). Counts the request in the token's one-minute
 * window and records it as the last use, in one atomic update.
 */
export async function spendToken(db: Db, token: string): Promise<TokenUse | null> {
  if (!TOKEN_PATTERN.test(token)) return null;
  const fresh = sql<boolean>`t.window_start is null or t.window_start <= now() - ${TOKEN_RATE.windowMs} * interval '1 millisecond'`;
  const row = await db
    .updateTable("api_tokens as t")
    .from("users as u")
    .whereRef("u.id", "=", "t.user_id")
    .where("t.token_hash", "=", hashToken(token))
    .where("t.revoked_at", "is", null)
    .where("u.disabled", "=", false)
    .set({
      window_start: sql`case when ${fresh} then now() else t.window_start end`,
      window_count: sql`case when ${fresh} then 1 else t.window_count + 1 end`,
      last_used_at: sql`now()`,
    })
    .returning(["t.id as tokenId", "t.name as tokenName", "t.scope", "t.window_count as count", "u.id", "u.email", "u.display_name as name", "u.role"])
    .executeTakeFirst();
  if (!row) return null;
  return {
    user: { id: row.id, email: row.email, name: row.name, role: row.role },
    token: { id: row.tokenId, name: row.tokenName, scope: row.scope },
    limited: row.count > TOKEN_RATE.maxPerWindow,
  };
}

/** Audits one use of a token (every use of a promote token is audited, with its name); `what` says what it did. */
export async function auditTokenUse(db: Db, use: Pick<TokenUse, "user" | "token">, what: Record<string, unknown>): Promise<void> {
  await appendAudit(db, {
    actorId: use.user.id,
    action: "token.use",
    entity: "api_token",
    entityId: use.token.id,
    after: { token: use.token.name, scope: use.token.scope, ...what },
  });
}
