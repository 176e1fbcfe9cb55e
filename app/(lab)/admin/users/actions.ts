"use server";

import { defineAction } from "@/app/_lib/action";
import { db } from "@/db";
import { appendAudit } from "@/db/queries/audit";
import { findUserByEmail, insertUser, updateUser } from "@/db/queries/users";
import { hashPassword } from "@/lib/auth/password";
import { AppError } from "@/lib/errors";
import type { ActionState } from "@/lib/http/action-state";
import type { z } from "zod";
import { changeUserSchema, createUserSchema } from "./schema";

function publicUser(u: { email: string; display_name: string; role: string; disabled: boolean }) {
  return { email: u.email, name: u.display_name, role: u.role, disabled: u.disabled };
}

/** The user forms show each field's message beside the field, and no form message. */
function fieldErrorsOnly(error: z.ZodError): ActionState {
  return { ok: false, fieldErrors: Object.fromEntries(error.issues.map((i) => [String(i.path[0]), i.message])) };
}

export const createUser = defineAction({
  name: "users action",
  schema: createUserSchema,
  role: "admin",
  invalid: fieldErrorsOnly,
  revalidate: ["/admin/users"],
  act: async ({ data: input, user: admin, transaction }) => {
    if (await findUserByEmail(db(), input.email)) throw new AppError("conflict", "That e-mail already has an account.");
    const passwordHash = await hashPassword(input.password);
    await transaction(async (trx) => {
      const user = await insertUser(trx, { email: input.email, displayName: input.displayName, passwordHash, role: input.role });
      await appendAudit(trx, { actorId: admin.id, action: "user.create", entity: "user", entityId: user.id, after: publicUser(user) });
    });
    return { ok: true, message: `Created ${input.email}.` };
  },
});

export const changeUser = defineAction({
  name: "users action",
  schema: changeUserSchema,
  input: (form) => Object.fromEntries([...form].filter(([, v]) => v !== "")),
  role: "admin",
  invalid: fieldErrorsOnly,
  revalidate: ["/admin/users"],
  act: async ({ data, user: admin, transaction }) => {
    const { id, role, disabled, password } = data;
    if (id === admin.id && (disabled || (role && role !== "admin"))) {
      throw new AppError("conflict", "You cannot disable yourself or give up your own admin role.");
    }
    const passwordHash = password ? await hashPassword(password) : undefined;
    await transaction(async (trx) => {
      const before = await trx.selectFrom("users").selectAll().where("id", "=", id).forUpdate().executeTakeFirst();
      if (!before) throw new AppError("not_found", "That user no longer exists.");
      const after = await updateUser(trx, id, { role, disabled, passwordHash });
      await appendAudit(trx, {
        actorId: admin.id, action: password ? "user.password" : "user.change", entity: "user", entityId: id,
        before: publicUser(before), after: after && publicUser(after),
      });
    });
    return { ok: true, message: "Saved." };
  },
});
