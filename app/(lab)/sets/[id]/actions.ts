"use server";

import { defineAction } from "@/app/_lib/action";
import { revisionInput } from "@/app/api/v1/sets/content";
import { db } from "@/db";
import { requestPromotion, requestRollback } from "@/db/workflow/deployments";
import { transitionRevision } from "@/db/workflow/review";
import { findSet } from "@/db/queries/sets";
import { addRevision, retireSet } from "@/db/workflow/sets";
import { AppError } from "@/lib/errors";
import { stateWord } from "@/lib/workflow";
import { promoteFormSchema, retireFormSchema, reviseFormSchema, rollbackFormSchema, transitionFormSchema } from "./schema";

/** The set pages and the review queue show what these actions change. */
const SHOWN_IN = [["/sets", "layout"], "/reviews"] as const;

export const transitionAction = defineAction({
  name: "sets action",
  schema: transitionFormSchema,
  role: "engineer",
  revalidate: SHOWN_IN,
  act: async ({ data, user, transaction }) => {
    const rev = await transaction((trx) => transitionRevision(trx, user, data));
    return { ok: true, message: `Revision r${rev.revision} is now ${stateWord(rev.state)}.` };
  },
});

export const promoteAction = defineAction({
  name: "sets action",
  schema: promoteFormSchema,
  input: (form) => ({ ...Object.fromEntries(form), channels: form.getAll("channels") }),
  role: "lead",
  revalidate: SHOWN_IN,
  act: async ({ data, user, transaction }) => {
    const { deployments } = await transaction((trx) => requestPromotion(trx, user, data.revisionId, data.channels));
    return { ok: true, message: `Sent to ${deployments.map((d) => d.channel).join(", ")}; waiting for the device to acknowledge.` };
  },
});

export const rollbackAction = defineAction({
  name: "sets action",
  schema: rollbackFormSchema,
  role: "lead",
  revalidate: SHOWN_IN,
  act: async ({ data, user, transaction }) => {
    const { passThrough } = await transaction((trx) => requestRollback(trx, user, data.channel, data.expectedActiveId));
    const what = passThrough ? `Returning ${data.channel} to no filter` : `Rolling back ${data.channel}`;
    return { ok: true, message: `${what}; waiting for the device to acknowledge.` };
  },
});

export const retireAction = defineAction({
  name: "sets action",
  schema: retireFormSchema,
  role: "lead",
  revalidate: SHOWN_IN,
  act: async ({ data, user, transaction }) => {
    await transaction((trx) => retireSet(trx, user, data.setId, data.expectedVersion));
    return { ok: true, message: "The set is retired." };
  },
});

export const reviseAction = defineAction({
  name: "sets action",
  schema: reviseFormSchema,
  role: "engineer",
  revalidate: SHOWN_IN,
  act: async ({ data, user, transaction }) => {
    const { setId, expectedLatestRevision, spec, notes } = data;
    const set = await findSet(db(), setId);
    if (!set) throw new AppError("not_found", "No such coefficient set.");
    const input = await revisionInput(spec, { path: set.channel, sampleRateHz: set.sampleRateHz, format: set.format }, notes, user.id);
    const saved = await transaction((trx) => addRevision(trx, user, setId, expectedLatestRevision, input));
    return { ok: true, message: `Saved revision r${saved.revision} as a draft.` };
  },
});
