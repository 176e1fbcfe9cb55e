/**
 * The value of an <input type="datetime-local" step="1"> read as UTC, the zone every list and chart
 * of the app shows ("2026-12-03T10:15:30" for epoch ms), and back; "" or an unreadable value gives null.
 * The input itself knows no zone: its label says UTC.
 */
export function toUtcInput(ms: number): string {
  return new Date(ms).toISOString().slice(0, 19);
}

export function fromUtcInput(value: string): number | null {
  if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?$/.test(value)) return null;
  const ms = Date.parse(`${value}Z`);
  return Number.isFinite(ms) ? ms : null;
}
