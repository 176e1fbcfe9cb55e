import type { AuditRow } from "@/db/queries/audit-read";
import { csvField } from "@/lib/format/csv-field";

const HEADER = ["id", "at_utc", "actor", "actor_email", "action", "entity", "entity_id", "before", "after"];

/** The audit rows as RFC 4180 CSV: a header line, CRLF line ends, JSON for before/after. */
export function auditCsv(rows: AuditRow[]): string {
  const lines = rows.map((r) =>
    [
      r.id,
      r.at.toISOString(),
      r.actor ?? "system",
      r.actorEmail ?? "",
      r.action,
      r.entity,
      r.entityId ?? "",
      r.before == null ? "" : JSON.stringify(r.before),
      r.after == null ? "" : JSON.stringify(r.after),
    ].map(csvField).join(","),
  );
  return [HEADER.join(","), ...lines].join("\r\n") + "\r\n";
}
