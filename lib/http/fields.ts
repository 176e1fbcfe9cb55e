import { z } from "zod";

/** Largest id PostgreSQL's integer and serial columns hold (2³¹ − 1). */
export const MAX_DB_ID = 2_147_483_647;

/** A database id or version from a path, query, body or form field: a positive integer that fits an integer column. */
export const dbId = z.coerce
  .number({ error: "Use a whole number." })
  .int("Use a whole number.")
  .positive("Use a number of 1 or more.")
  .max(MAX_DB_ID, `Use a number up to ${MAX_DB_ID}.`);

/** A page number: 1 up to a million (beyond that the offset means nothing). */
export const pageNumber = z.coerce.number().int().min(1).max(1_000_000).default(1);

/** A calendar day YYYY-MM-DD that exists (2026-02-30 is refused, not rolled over). */
export const calendarDay = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date like 2026-12-01.")
  .refine((day) => {
    const d = new Date(`${day}T00:00:00.000Z`);
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === day;
  }, "That date does not exist.");

// A NUL, or a UTF-16 surrogate without its pair: PostgreSQL text and JSON cannot store either.
const UNSAFE_TEXT = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/**
 * The first place in a parsed value (keys included) holding a string that cannot be stored: a NUL
 * or a lone surrogate. Returns its dotted path ("" for the value itself), or null when all is well.
 */
export function unstorableTextAt(value: unknown, path: string[] = []): string | null {
  if (typeof value === "string") return UNSAFE_TEXT.test(value) ? path.join(".") : null;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const found = unstorableTextAt(value[i], [...path, String(i)]);
      if (found !== null) return found;
    }
    return null;
  }
  if (value !== null && typeof value === "object" && !(value instanceof Blob)) {
    for (const [key, inner] of Object.entries(value)) {
      if (UNSAFE_TEXT.test(key)) return [...path, key].join(".");
      const found = unstorableTextAt(inner, [...path, key]);
      if (found !== null) return found;
    }
  }
  return null;
}

/** Why unstorable text is refused, shown on the field that holds it. */
export const UNSTORABLE_TEXT = "Text may not contain a NUL character or an unpaired UTF-16 surrogate.";

/**
 * schema.safeParse, with text that cannot be stored refused first as an issue on its path: the one
 * parse every route handler and server action runs, so each of them gets the check.
 */
export function safeParseInput<S extends z.ZodType>(schema: S, value: unknown): z.ZodSafeParseResult<z.output<S>> {
  const at = unstorableTextAt(value);
  if (at === null) return schema.safeParse(value);
  const path = at === "" ? [] : at.split(".");
  return z.any().superRefine((_, ctx) => ctx.addIssue({ code: "custom", path, message: UNSTORABLE_TEXT })).safeParse(value);
}
