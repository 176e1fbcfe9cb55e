import { z } from "zod";
import { EXPORT_FORMATS, EXPORT_TARGETS, FORMAT_TARGETS } from "@/lib/export";

/**
 * Query of both export routes: file format, number format (default: the channel's device format, or
 * f32 for cmsis-df2t), identifier prefix. A target the format does not take is a 400.
 */
export const exportQuerySchema = z
  .object({
    format: z.enum(EXPORT_FORMATS).default("c-header"),
    target: z.enum(EXPORT_TARGETS).optional(),
    prefix: z
      .string()
      .regex(/^[A-Za-z][A-Za-z0-9_]{0,39}$/, "prefix must be a C identifier: a letter, then up to 39 letters, digits or _")
      .optional(),
  })
  .superRefine((q, ctx) => {
    const allowed = FORMAT_TARGETS[q.format];
    if (q.target && !allowed.includes(q.target)) {
      ctx.addIssue({ code: "custom", path: ["target"], message: `format ${q.format} takes target ${allowed.join(", ")} (got ${q.target})` });
    }
  });
export type ExportQuery = z.infer<typeof exportQuerySchema>;

/** The query parameters of a request URL, for exportQuerySchema. */
export const queryOf = (req: Request) => Object.fromEntries(new URL(req.url).searchParams);
