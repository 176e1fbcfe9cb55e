"use server";

import { revalidatePath } from "next/cache";
import { requireActionUser } from "@/app/_lib/auth";
import { revisionInput } from "@/app/api/v1/sets/content";
import { db } from "@/db";
import { requestPromotion, requestRollback } from "@/db/queries/deployments";
import { transitionRevision } from "@/db/queries/revisions";
import { addRevision, findSet, retireSet } from "@/db/queries/sets";
import { AppError, toErrorBody } from "@/lib/errors";
import type { ActionState } from "@/lib/http/action-state";
import { safeParseInput } from "@/lib/http/fields";
import type { z } from "zod";
import { promoteFormSchema, retireFormSchema, reviseFormSchema, rollbackFormSchema, transitionFormSchema } from "./schema";

function fail(err: unknown): ActionState {
  const { status, body } = toErrorBody(err);
  if (status >= 500) console.error("[sets action]", err);
  return { ok: false, message: body.error.message };
}

function invalid(error: z.ZodError): ActionState {
  const fieldErrors = Object.fromEntries(error.issues.map((i) => [String(i.path[0] ?? "form"), i.message]));
  return { ok: false, message: Object.values(fieldErrors)[0], fieldErrors };
}

function refresh(): void {
  revalidatePath("/sets", "layout");
  revalidatePath("/reviews");
}

export async function transitionAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  const parsed = safeParseInput(transitionFormSchema, Object.fromEntries(form));
  if (!parsed.success) return invalid(parsed.error);
  try {
    const user = await requireActionUser("engineer");
    const rev = await db().transaction().execute((trx) => transitionRevision(trx, user, parsed.data));
    refresh();
    return { ok: true, message: `Revision r${rev.revision} is now ${rev.state.replace("_", " ")}.` };
  } catch (err) {
    return fail(err);
  }
}

export async function promoteAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  const parsed = safeParseInput(promoteFormSchema, { ...Object.fromEntries(form), channels: form.getAll("channels") });
  if (!parsed.success) return invalid(parsed.error);
  try {
    const user = await requireActionUser("lead");
    const { deployments } = await db().transaction().execute((trx) => requestPromotion(trx, user, parsed.data.revisionId, parsed.data.channels));
    refresh();
    return { ok: true, message: `Sent to ${deployments.map((d) => d.channel).join(", ")}; waiting for the device to acknowledge.` };
  } catch (err) {
    return fail(err);
  }
}

export async function rollbackAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  const parsed = safeParseInput(rollbackFormSchema, Object.fromEntries(form));
  if (!parsed.success) return invalid(parsed.error);
  try {
    const user = await requireActionUser("lead");
    const { passThrough } = await db().transaction().execute((trx) => requestRollback(trx, user, parsed.data.channel, parsed.data.expectedActiveId));
    refresh();
    const what = passThrough ? `Returning ${parsed.data.channel} to no filter` : `Rolling back ${parsed.data.channel}`;
    return { ok: true, message: `${what}; waiting for the device to acknowledge.` };
  } catch (err) {
    return fail(err);
  }
}

export async function retireAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  const parsed = safeParseInput(retireFormSchema, Object.fromEntries(form));
  if (!parsed.success) return invalid(parsed.error);
  try {
    const user = await requireActionUser("lead");
    await db().transaction().execute((trx) => retireSet(trx, user, parsed.data.setId, parsed.data.expectedVersion));
    refresh();
    return { ok: true, message: "The set is retired." };
  } catch (err) {
    return fail(err);
  }
}

export async function reviseAction(_prev: ActionState, form: FormData): Promise<ActionState> {
  const parsed = safeParseInput(reviseFormSchema, Object.fromEntries(form));
  if (!parsed.success) return invalid(parsed.error);
  try {
    const user = await requireActionUser("engineer");
    const { setId, expectedLatestRevision, spec, notes } = parsed.data;
    const set = await findSet(db(), setId);
    if (!set) throw new AppError("not_found", "No such coefficient set.");
    const input = await revisionInput(spec, { path: set.channel, sampleRateHz: set.sampleRateHz, format: set.format }, notes, user.id);
    const saved = await db().transaction().execute((trx) => addRevision(trx, user, setId, expectedLatestRevision, input));
    refresh();
    return { ok: true, message: `Saved revision r${saved.revision} as a draft.` };
  } catch (err) {
    return fail(err);
  }
}
