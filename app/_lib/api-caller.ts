import { db } from "@/db";
import { auditTokenUse, spendToken, type TokenUse } from "@/db/queries/tokens";
import { requireRole, type SessionUser } from "@/lib/auth/guard";
import type { Role } from "@/lib/auth/roles";
import { requireScope, TOKEN_RATE, type TokenScope } from "@/lib/auth/token-scope";
import { AppError } from "@/lib/errors";
import { requireUser } from "./auth";

/** Who asks an API route: the user, and the token when the request came with one. */
export interface ApiCaller {
  user: SessionUser;
  token: TokenUse["token"] | null;
}

/**
 * The caller of an API route that also takes tokens: a `Bearer tw_…` token when an Authorization
 * header is sent (never falling back to the cookie then), otherwise the session cookie. 401 for a
 * missing, unknown or revoked token or one whose owner is disabled; 429 over the token's rate; 403
 * below the scope (promote ⊃ read) or the role (the owner's current role). Every use of a promote
 * token is audited with its name, refused ones too.
 */
export async function requireCaller(req: Request, role: Role, scope: TokenScope = "read"): Promise<ApiCaller> {
  const header = req.headers.get("authorization");
  if (header === null) return { user: await requireUser(role), token: null };
  const match = /^Bearer +(\S+)$/i.exec(header.trim());
  const use = match ? await spendToken(db(), match[1]) : null;
  if (!use) throw new AppError("unauthorized", "The API token is missing, unknown or revoked, or its owner is disabled.");
  if (use.limited) {
    throw new AppError("too_many_requests", `This token made more than ${TOKEN_RATE.maxPerWindow} requests within a minute. Wait a minute and try again.`);
  }
  if (use.token.scope === "promote") await auditTokenUse(db(), use, { method: req.method, path: new URL(req.url).pathname });
  requireScope(use.token.scope, scope);
  return { user: requireRole(use.user, role), token: use.token };
}
