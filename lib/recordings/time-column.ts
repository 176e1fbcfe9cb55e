/**
 * ISO 8601 date-time with an explicit zone (Z or ±hh:mm): local times without a zone are ambiguous
 * and refused. Fractional seconds keep all their digits (Date.parse stops at milliseconds).
 */
const ISO_UTC = /^(\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2})(\.\d+)?(Z|[+-]\d{2}:?\d{2})$/;

/** Whether a cell reads as an ISO 8601 timestamp with a zone. */
export function isIsoTimestamp(cell: string): boolean {
  return ISO_UTC.test(cell.trim());
}

/** An ISO 8601 timestamp as whole milliseconds since the epoch plus a fraction of a second, or null. */
export function parseIsoTimestamp(cell: string): { epochMs: number; fractionS: number } | null {
  const m = ISO_UTC.exec(cell.trim());
  if (!m) return null;
  const zone = m[3] === "Z" ? "Z" : m[3].length === 5 ? `${m[3].slice(0, 3)}:${m[3].slice(3)}` : m[3];
  const epochMs = Date.parse(`${m[1]}${zone}`);
  if (Number.isNaN(epochMs)) return null;
  return { epochMs, fractionS: m[2] ? Number(`0${m[2]}`) : 0 };
}

/** The name and unit of a header like `torque[N·m]` (unit null when there are no brackets). */
export function splitHeader(header: string): { name: string; unit: string | null } {
  const m = /^(.*?)\s*\[([^\]]*)\]\s*$/.exec(header.trim());
  return m ? { name: m[1], unit: m[2] } : { name: header.trim(), unit: null };
}
