import { requireCaller } from "@/app/_lib/api-caller";
import { db } from "@/db";
import { exportAudit, listAudit } from "@/db/queries/audit-read";
import { handler, parseWith } from "@/lib/http/handler";
import { auditCsv } from "./csv";
import { auditQuerySchema } from "./schema";

/** Most rows one CSV export carries. */
const EXPORT_LIMIT = 50_000;

/** The audit trail for leads and admins: JSON pages, or every match as CSV (`format=csv`). */
export const GET = handler(async (req) => {
  const { page, pageSize, format, ...filters } = parseWith(auditQuerySchema, Object.fromEntries(new URL(req.url).searchParams));
  await requireCaller(req, "lead");
  if (format === "json") return Response.json(await listAudit(db(), filters, page, pageSize));
  const csv = auditCsv(await exportAudit(db(), filters, EXPORT_LIMIT));
  return new Response(csv, {
    headers: {
      "content-type": "text/csv; charset=utf-8; header=present",
      "content-disposition": `attachment; filename="tapwright-audit-${new Date().toISOString().slice(0, 10)}.csv"`,
    },
  });
});
