"use server";

import { defineAction } from "@/app/_lib/action";
import type { TokenCreateState } from "@/components/export/token-create-form";
import { createToken, revokeToken } from "@/db/queries/tokens";
import { createTokenSchema, revokeTokenSchema } from "./schema";

/** Creates a token for the signed-in engineer (or higher; promote tokens: lead or higher); its text goes back once, in this answer only. */
export const createTokenAction = defineAction({
  name: "tokens action",
  schema: createTokenSchema,
  role: "engineer",
  invalid: (error): TokenCreateState => {
    const issue = error.issues[0];
    return { ok: false, message: issue?.message, fieldErrors: { [String(issue?.path[0] ?? "name")]: issue?.message ?? "" } };
  },
  revalidate: ["/tokens"],
  act: async ({ data, user, transaction }): Promise<TokenCreateState> => {
    const { token, view } = await transaction((trx) => createToken(trx, user, data.name, data.scope));
    return { ok: true, message: `Token "${view.name}" (${view.scope}) created.`, token };
  },
});

export const revokeTokenAction = defineAction({
  name: "tokens action",
  schema: revokeTokenSchema,
  role: "engineer",
  invalid: () => ({ ok: false, message: "No such token." }),
  revalidate: ["/tokens"],
  act: async ({ data, user, transaction }) => {
    const view = await transaction((trx) => revokeToken(trx, user, data.tokenId));
    return { ok: true, message: `Token "${view.name}" revoked.` };
  },
});
