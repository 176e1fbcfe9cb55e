/**
 * Canonical JSON text of a value, the input of the configuration checksum: object keys sorted by
 * UTF-16 code units, no whitespace, strings and numbers as ECMAScript JSON.stringify writes them,
 * keys whose value is undefined left out (the rules of RFC 8785, JSON Canonicalization Scheme).
 * Throws for values JSON cannot carry (non-finite numbers, functions, bigint).
 */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value === "boolean" || typeof value === "string") return JSON.stringify(value);
  if (typeof value === "number") {
    if (!Number.isFinite(value)) throw new Error(`canonical JSON cannot hold ${value}`);
    return JSON.stringify(value);
  }
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(",")}]`;
  if (typeof value === "object") {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(",")}}`;
  }
  throw new Error(`canonical JSON cannot hold a ${typeof value}`);
}
