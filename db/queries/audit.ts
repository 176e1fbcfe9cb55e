import type { Db } from "../client";


export interface AuditEntry {
  actorId: number | null;
  action: string;
  entity: string;
  entityId?: string | number | null;
  before?: unknown;
  after?: unknown;
}

/** Appends one entry; call it inside the transaction of the change it records. */
export async function appendAudit(db: Db, entry: AuditEntry): Promise<void> {
  await db
    .insertInto("audit_log")
    .values({
      actor_id: entry.actorId,
      action: entry.action,
      entity: entry.entity,
      entity_id: entry.entityId == null ? null : String(entry.entityId),
      before: entry.before === undefined ? null : JSON.stringify(entry.before),
      after: entry.after === undefined ? null : JSON.stringify(entry.after),
    })
    .execute();
}
