import { createHash, randomBytes } from "node:crypto";
import { sql, type Transaction } from "kysely";
import type { SessionUser } from "@/lib/auth/guard";
import { roleAtLeast } from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";
import type { Db } from "../client";
import type { Database, TokenScope } from "../types";
import { appendAudit } from "./audit";

type Conn = Db | Transaction<Database>;

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
}

function tokenQuery(db: Conn) {
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
    ]);
}

/** Engineers see their own tokens; leads and admins see everyone's. Newest first. */
export function listTokens(db: Conn, actor: SessionUser): Promise<TokenView[]> {
  const q = tokenQuery(db).orderBy("t.id", "desc");
  return roleAtLeast(actor.role, "lead") ? q.execute() : q.where("t.user_id", "=", actor.id).execute();
}

/** Creates a token for the actor (engineer or higher) and audits it; the token text is returned once and never stored. */
export async function createToken(trx: Transaction<Database>, actor: SessionUser, name: string): Promise<{ token: string; view: TokenView }> {
  if (!roleAtLeast(actor.role, "engineer")) throw new AppError("forbidden", "API tokens need the engineer role or higher.");
  const token = generateToken();
  const row = await trx
    .insertInto("api_tokens")
    .values({ user_id: actor.id, name, token_hash: hashToken(token) })
    .returning("id")
    .executeTakeFirstOrThrow();
  await appendAudit(trx, { actorId: actor.id, action: "token.create", entity: "api_token", entityId: row.id, after: { name, scope: "export:read" } });
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
    .set({ revoked_at: sql`now()` })
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

/**
 * The user a bearer token acts for, or null when the token is malformed, unknown, revoked, lacks
 * the scope, or its owner is disabled. Records the use (last_used_at, at most once a minute).
 */
export async function userForToken(db: Conn, token: string, scope: TokenScope): Promise<SessionUser | null> {
  if (!TOKEN_PATTERN.test(token)) return null;
  const row = await db
    .selectFrom("api_tokens as t")
    .innerJoin("users as u", "u.id", "t.user_id")
    .select(["t.id as tokenId", "u.id", "u.email", "u.display_name as name", "u.role"])
    .where("t.token_hash", "=", hashToken(token))
    .where("t.revoked_at", "is", null)
    .where("t.scope", "=", scope)
    .where("u.disabled", "=", false)
    .executeTakeFirst();
  if (!row) return null;
  await db
    .updateTable("api_tokens")
    .set({ last_used_at: sql`now()` })
    .where("id", "=", row.tokenId)
    .where((eb) => eb.or([eb("last_used_at", "is", null), eb("last_used_at", "<", sql<Date>`now() - interval '1 minute'`)]))
    .execute();
  return { id: row.id, email: row.email, name: row.name, role: row.role };
}
