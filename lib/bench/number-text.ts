/** A plain decimal number as typed: optional sign, digits with a point, optional exponent (no commas, no hex). */
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;
/** A number written with a decimal comma, e.g. "12,5". */
const COMMA_DECIMAL = /^[+-]?\d*,\d+$/;

/**
 * What is wrong with a typed number, in plain words, or null when it reads as a number (or is empty).
 * A decimal comma is refused, never read as a thousands separator or dropped: "12,5" must not become 125.
 */
export function numberTextError(text: string): string | null {
  const t = text.trim();
  if (t === "" || DECIMAL.test(t)) return null;
  if (COMMA_DECIMAL.test(t)) return `Write decimals with a point: ${t.replace(",", ".")}, not ${t}.`;
  return `"${t}" is not a number; write it like 12.5 or 1e3.`;
}

/** The number a typed text holds: empty is absent when optional and NaN (refused) otherwise; anything not a plain number is NaN. */
export function readNumberText(text: unknown, optional: boolean): number | undefined {
  if (typeof text === "number") return text;
  const t = typeof text === "string" ? text.trim() : "";
  if (t === "") return optional ? undefined : Number.NaN;
  return DECIMAL.test(t) ? Number(t) : Number.NaN;
}
