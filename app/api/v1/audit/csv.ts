import type { AuditRow } from "@/db/queries/audit-read";

/**
 * A cell a spreadsheet would run as a formula (it starts with =, +, -, @, a tab or a CR) gets a
 * leading apostrophe, so it is shown as text (OWASP, "CSV Injection").
 */
export function neutralised(value: string): string {
  return /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
}

/** One CSV field per RFC 4180 §2, neutralised: quoted when it holds a quote, comma, CR or LF; quotes doubled. */
export function csvField(value: string): string {
  const safe = neutralised(value);
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

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
