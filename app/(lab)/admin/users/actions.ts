"use server";

import { revalidatePath } from "next/cache";
import { requireActionUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { appendAudit } from "@/db/queries/audit";
import { findUserByEmail, insertUser, updateUser } from "@/db/queries/users";
import { hashPassword } from "@/lib/auth/password";
import { AppError, toErrorBody } from "@/lib/errors";
import type { ActionState } from "@/lib/http/action-state";
import { safeParseInput } from "@/lib/http/fields";
import { changeUserSchema, createUserSchema } from "./schema";

function fail(err: unknown): ActionState {
  const { body } = toErrorBody(err);
  return { ok: false, message: body.error.message };
}

function publicUser(u: { email: string; display_name: string; role: string; disabled: boolean }) {
  return { email: u.email, name: u.display_name, role: u.role, disabled: u.disabled };
}

export async function createUser(_prev: ActionState, form: FormData): Promise<ActionState> {
  const parsed = safeParseInput(createUserSchema, Object.fromEntries(form));
  if (!parsed.success) {
    return { ok: false, fieldErrors: Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), i.message])) };
  }
  try {
    const admin = await requireActionUser("admin");
    const input = parsed.data;
    if (await findUserByEmail(db(), input.email)) throw new AppError("conflict", "That e-mail already has an account.");
    const passwordHash = await hashPassword(input.password);
    await db().transaction().execute(async (trx) => {
      const user = await insertUser(trx, { email: input.email, displayName: input.displayName, passwordHash, role: input.role });
      await appendAudit(trx, { actorId: admin.id, action: "user.create", entity: "user", entityId: user.id, after: publicUser(user) });
    });
    revalidatePath("/admin/users");
    return { ok: true, message: `Created ${input.email}.` };
  } catch (err) {
    return fail(err);
  }
}

export async function changeUser(_prev: ActionState, form: FormData): Promise<ActionState> {
  const parsed = safeParseInput(changeUserSchema, Object.fromEntries([...form].filter(([, v]) => v !== "")));
  if (!parsed.success) {
    return { ok: false, fieldErrors: Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), i.message])) };
  }
  try {
    const admin = await requireActionUser("admin");
    const { id, role, disabled, password } = parsed.data;
    if (id === admin.id && (disabled || (role && role !== "admin"))) {
      throw new AppError("conflict", "You cannot disable yourself or give up your own admin role.");
    }
    const passwordHash = password ? await hashPassword(password) : undefined;
    await db().transaction().execute(async (trx) => {
      const before = await trx.selectFrom("users").selectAll().where("id", "=", id).forUpdate().executeTakeFirst();
      if (!before) throw new AppError("not_found", "That user no longer exists.");
      const after = await updateUser(trx, id, { role, disabled, passwordHash });
      await appendAudit(trx, {
        actorId: admin.id, action: password ? "user.password" : "user.change", entity: "user", entityId: id,
        before: publicUser(before), after: after && publicUser(after),
      });
    });
    revalidatePath("/admin/users");
    return { ok: true, message: "Saved." };
  } catch (err) {
    return fail(err);
  }
}
