import { z } from "zod";
import { calendarDay, pageNumber } from "@/lib/http/fields";

const day = calendarDay;

/** Audit filters from a query string; `from`/`to` are whole UTC days, both inclusive. */
export const auditQuerySchema = z
  .object({
    actor: z.string().trim().max(120).optional(),
    entity: z.string().trim().max(40).optional(),
    action: z.string().trim().max(60).optional(),
    from: day.optional(),
    to: day.optional(),
    page: pageNumber,
    pageSize: z.coerce.number().int().min(1).max(200).default(50),
    format: z.enum(["json", "csv"]).default("json"),
  })
  .transform(({ from, to, ...rest }) => ({
    ...rest,
    from: from ? new Date(`${from}T00:00:00.000Z`) : undefined,
    to: to ? new Date(`${to}T23:59:59.999Z`) : undefined,
  }));
