import type { AuditRow } from "@/lib/audit";
import type { Db } from "../client";
import { escapeLike } from "./sets";


export interface AuditFilters {
  /** Actor e-mail or name, substring; "system" for entries without a person. */
  actor?: string;
  entity?: string;
  action?: string;
  /** Inclusive bounds on `at`. */
  from?: Date;
  to?: Date;
}

export type { AuditRow };

function filtered(db: Db, f: AuditFilters) {
  let q = db.selectFrom("audit_log as a").leftJoin("users as u", "u.id", "a.actor_id");
  if (f.actor === "system") q = q.where("a.actor_id", "is", null);
  else if (f.actor) {
    const needle = `%${escapeLike(f.actor)}%`;
    q = q.where((eb) => eb.or([eb("u.email", "ilike", needle), eb("u.display_name", "ilike", needle)]));
  }
  if (f.entity) q = q.where("a.entity", "=", f.entity);
  if (f.action) q = q.where("a.action", "like", `${escapeLike(f.action)}%`);
  if (f.from) q = q.where("a.at", ">=", f.from);
  if (f.to) q = q.where("a.at", "<=", f.to);
  return q;
}

const COLUMNS = [
  "a.id",
  "a.at",
  "u.display_name as actor",
  "u.email as actorEmail",
  "a.action",
  "a.entity",
  "a.entity_id as entityId",
  "a.before",
  "a.after",
] as const;

/** Newest first, one page at a time, with the total count of matches. */
export async function listAudit(db: Db, f: AuditFilters, page: number, pageSize: number): Promise<{ items: AuditRow[]; total: number }> {
  const { total } = await filtered(db, f).select((eb) => eb.fn.countAll<string>().as("total")).executeTakeFirstOrThrow();
  const items = await filtered(db, f)
    .select(COLUMNS)
    .orderBy("a.id", "desc")
    .limit(pageSize)
    .offset((page - 1) * pageSize)
    .execute();
  return { items, total: Number(total) };
}

/** Every match, oldest first, up to `limit` rows (the CSV export). */
export function exportAudit(db: Db, f: AuditFilters, limit: number): Promise<AuditRow[]> {
  return filtered(db, f).select(COLUMNS).orderBy("a.id").limit(limit).execute();
}

/** Distinct entity kinds and actions, for the filter menus. */
export async function auditVocabulary(db: Db): Promise<{ entities: string[]; actions: string[] }> {
  const entities = await db.selectFrom("audit_log").select("entity").distinct().orderBy("entity").execute();
  const actions = await db.selectFrom("audit_log").select("action").distinct().orderBy("action").execute();
  return { entities: entities.map((r) => r.entity), actions: actions.map((r) => r.action) };
}
