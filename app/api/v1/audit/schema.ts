import { z } from "zod";

const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date like 2026-12-01.");

/** Audit filters from a query string; `from`/`to` are whole UTC days, both inclusive. */
export const auditQuerySchema = z
  .object({
    actor: z.string().trim().max(120).optional(),
    entity: z.string().trim().max(40).optional(),
    action: z.string().trim().max(60).optional(),
    from: day.optional(),
    to: day.optional(),
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(200).default(50),
    format: z.enum(["json", "csv"]).default("json"),
  })
  .transform(({ from, to, ...rest }) => ({
    ...rest,
    from: from ? new Date(`${from}T00:00:00.000Z`) : undefined,
    to: to ? new Date(`${to}T23:59:59.999Z`) : undefined,
  }));
