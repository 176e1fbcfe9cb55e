"use server";

import { revalidatePath } from "next/cache";
import { requireActionUser } from "@/app/_lib/auth";
import type { TokenCreateState } from "@/components/export/token-create-form";
import { db } from "@/db";
import { createToken, revokeToken } from "@/db/queries/tokens";
import { toErrorBody } from "@/lib/errors";
import type { ActionState } from "@/lib/http/action-state";
import { safeParseInput } from "@/lib/http/fields";
import { createTokenSchema, revokeTokenSchema } from "./schema";

function fail(err: unknown): ActionState {
  const { status, body } = toErrorBody(err);
  if (status >= 500) console.error("[tokens action]", err);
  return { ok: false, message: body.error.message };
}

/** Creates a token for the signed-in engineer (or higher; promote tokens: lead or higher); its text goes back once, in this answer only. */
export async function createTokenAction(_prev: TokenCreateState, form: FormData): Promise<TokenCreateState> {
  const parsed = safeParseInput(createTokenSchema, Object.fromEntries(form));
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { ok: false, message: issue?.message, fieldErrors: { [String(issue?.path[0] ?? "name")]: issue?.message ?? "" } };
  }
  try {
    const user = await requireActionUser("engineer");
    const { token, view } = await db().transaction().execute((trx) => createToken(trx, user, parsed.data.name, parsed.data.scope));
    revalidatePath("/tokens");
    return { ok: true, message: `Token "${view.name}" (${view.scope}) created.`, token };
  } catch (err) {
    return fail(err);
  }
}

export async function revokeTokenAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  const parsed = safeParseInput(revokeTokenSchema, Object.fromEntries(form));
  if (!parsed.success) return { ok: false, message: "No such token." };
  try {
    const user = await requireActionUser("engineer");
    const view = await db().transaction().execute((trx) => revokeToken(trx, user, parsed.data.tokenId));
    revalidatePath("/tokens");
    return { ok: true, message: `Token "${view.name}" revoked.` };
  } catch (err) {
    return fail(err);
  }
}
