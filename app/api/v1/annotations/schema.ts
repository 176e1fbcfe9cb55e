import { z } from "zod";
import { channelPathSchema } from "@/lib/protocol";

/** A numeric id from a route segment. */
export const idParam = z.coerce.number().int().positive();

/** Longest span one annotation may cover (7 days), ms. */
export const MAX_SPAN_MS = 7 * 24 * 3600 * 1000;

const time = (what: string) =>
  z.iso.datetime({ offset: true, error: `${what} is an ISO 8601 time with a zone, e.g. 2026-12-03T10:00:00.000Z` }).transform((s) => new Date(s));

export const createAnnotationSchema = z
  .object({
    channel: channelPathSchema,
    at: time("at"),
    endAt: time("endAt").nullable().default(null),
    text: z.string().trim().min(1, "Write a short note.").max(500, "Notes are limited to 500 characters."),
  })
  .strict()
  .superRefine((a, ctx) => {
    if (a.endAt === null) return;
    const span = a.endAt.getTime() - a.at.getTime();
    if (span <= 0) ctx.addIssue({ code: "custom", path: ["endAt"], message: "endAt must be after at." });
    else if (span > MAX_SPAN_MS) ctx.addIssue({ code: "custom", path: ["endAt"], message: "A span may cover at most 7 days." });
  });

export const listAnnotationsSchema = z
  .object({
    channel: channelPathSchema.optional(),
    q: z.string().trim().max(120, "Search for at most 120 characters.").optional(),
    from: time("from").optional(),
    to: time("to").optional(),
    limit: z.coerce.number().int().min(1).max(500).default(200),
  })
  .refine((f) => !f.from || !f.to || f.from < f.to, { error: "from must be before to", path: ["to"] });
