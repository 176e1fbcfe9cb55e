/** One audit entry as read for the audit page and its CSV export; `actor` is null for the system. */
export interface AuditRow {
  id: string;
  at: Date;
  actor: string | null;
  actorEmail: string | null;
  action: string;
  entity: string;
  entityId: string | null;
  before: unknown;
  after: unknown;
}
