import type { Transaction } from "kysely";
import type { SessionUser } from "@/lib/auth/guard";
import { AppError } from "@/lib/errors";
import { decide } from "@/lib/workflow";
import { enforce } from "@/lib/workflow/enforce";
import type { Database } from "../types";
import { appendAudit } from "../queries/audit";
import { insertRevision, insertSet, lockSet, markSetRetired, touchSet, type NewRevisionInput, type SavedRevision } from "../queries/sets";

function revisionAudit(setId: number, revision: number, input: NewRevisionInput) {
  return { setId, revision, spec: input.spec, notes: input.notes, format: input.format, deployable: input.content.analysis.deployable };
}

/** Creates a set on a channel with its first (draft) revision. */
export async function createSet(
  trx: Transaction<Database>,
  actor: SessionUser,
  channelId: number,
  name: string,
  input: NewRevisionInput,
): Promise<SavedRevision> {
  enforce(decide("create_set", { role: actor.role, actorId: actor.id }));
  const set = await insertSet(trx, { channelId, name, createdBy: actor.id });
  const rev = await insertRevision(trx, set.id, 1, actor.id, input);
  await appendAudit(trx, { actorId: actor.id, action: "set.create", entity: "set", entityId: set.id, after: { name, channelId } });
  await appendAudit(trx, { actorId: actor.id, action: "revision.create", entity: "revision", entityId: rev.id, after: revisionAudit(set.id, 1, input) });
  return { setId: set.id, revisionId: rev.id, revision: 1 };
}

/** Adds the next revision; 409 when `expectedLatestRevision` is no longer the latest (someone saved first). */
export async function addRevision(
  trx: Transaction<Database>,
  actor: SessionUser,
  setId: number,
  expectedLatestRevision: number,
  input: NewRevisionInput,
): Promise<SavedRevision> {
  const set = await lockSet(trx, setId);
  if (!set) throw new AppError("not_found", "No such coefficient set.");
  enforce(decide("save_revision", { role: actor.role, actorId: actor.id, retired: set.retired_at !== null }));
  if (set.latest_revision !== expectedLatestRevision) {
    throw new AppError(
      "conflict",
      `This set has moved on: its latest revision is r${set.latest_revision}, you edited from r${expectedLatestRevision}. Reload and save again.`,
    );
  }
  const revision = set.latest_revision + 1;
  const rev = await insertRevision(trx, setId, revision, actor.id, input);
  await touchSet(trx, setId, revision);
  await appendAudit(trx, { actorId: actor.id, action: "revision.create", entity: "revision", entityId: rev.id, after: revisionAudit(setId, revision, input) });
  return { setId, revisionId: rev.id, revision };
}

/** Retires a set (no further revisions, reviews or promotions); 409 on a stale version. */
export async function retireSet(trx: Transaction<Database>, actor: SessionUser, setId: number, expectedVersion: number): Promise<void> {
  const set = await lockSet(trx, setId);
  if (!set) throw new AppError("not_found", "No such coefficient set.");
  if (set.version !== expectedVersion) throw new AppError("conflict", "This set changed since you opened it. Reload and try again.");
  enforce(decide("retire", { role: actor.role, actorId: actor.id, retired: set.retired_at !== null }));
  await markSetRetired(trx, setId);
  await appendAudit(trx, { actorId: actor.id, action: "set.retire", entity: "set", entityId: setId, before: { retired: false }, after: { retired: true } });
}
