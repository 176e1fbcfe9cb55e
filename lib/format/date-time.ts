/**
 * A moment as every page writes it: "2026-12-04 03:30:12 UTC" (ISO 8601 date and time to the second,
 * a space for the "T", always in UTC and saying so). "—" for none or an unreadable value.
 */
export function formatDateTime(at: Date | string | number | null | undefined): string {
  if (at === null || at === undefined) return "—";
  const d = at instanceof Date ? at : new Date(at);
  if (Number.isNaN(d.getTime())) return "—";
  return `${d.toISOString().slice(0, 19).replace("T", " ")} UTC`;
}
