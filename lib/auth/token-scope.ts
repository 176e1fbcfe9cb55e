import { AppError } from "@/lib/errors";
import { roleAtLeast, type Role } from "./roles";

/**
 * API token scopes, lowest first: `read` (exports and reads) and `promote` (also requests the promotion
 * of an approved revision, for release pipelines). A token acts with its owner's current role as well.
 */
export const TOKEN_SCOPES = ["read", "promote"] as const;
export type TokenScope = (typeof TOKEN_SCOPES)[number];

/** The least role that may create a token of each scope (only leads, and admins above them, make promote tokens). */
export const SCOPE_CREATOR: Record<TokenScope, Role> = { read: "engineer", promote: "lead" };

/** Requests one token may make per minute; more are a 429 until the minute is over (product choice). */
export const TOKEN_RATE = { windowMs: 60_000, maxPerWindow: 60 } as const;

/** Throws 403 when a token's scope does not cover what the request needs (promote ⊃ read). */
export function requireScope(scope: TokenScope, needed: TokenScope): void {
  if (TOKEN_SCOPES.indexOf(scope) >= TOKEN_SCOPES.indexOf(needed)) return;
  throw new AppError("forbidden", `This token has the ${scope} scope; this request needs a ${needed} token.`);
}

/** Throws 403 when the actor's role may not create a token of the scope. */
export function requireScopeCreator(role: Role, scope: TokenScope): void {
  if (!roleAtLeast(role, SCOPE_CREATOR[scope])) throw new AppError("forbidden", `Only a ${SCOPE_CREATOR[scope]} or higher may create a ${scope} token.`);
}
