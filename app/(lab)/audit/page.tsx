import type { Metadata } from "next";
import { requirePageUser } from "@/app/_lib/auth";
import { auditQuerySchema } from "@/app/api/v1/audit/schema";
import { AuditFilters } from "@/components/audit/audit-filters";
import { AuditTable } from "@/components/audit/audit-table";
import { db } from "@/db";
import { auditVocabulary, listAudit } from "@/db/queries/audit-read";
import { safeParseInput } from "@/lib/http/fields";

export const metadata: Metadata = { title: "Audit trail" };

export default async function AuditPage(props: { searchParams: Promise<Record<string, string | undefined>> }) {
  await requirePageUser("lead");
  const raw = Object.fromEntries(Object.entries(await props.searchParams).filter(([, v]) => v));
  const parsed = safeParseInput(auditQuerySchema, raw);
  const query = parsed.success ? parsed.data : auditQuerySchema.parse({});
  const { page, pageSize, format: _format, ...filters } = query;
  const [{ items, total }, vocabulary] = await Promise.all([listAudit(db(), filters, page, pageSize), auditVocabulary(db())]);
  const csvParams = new URLSearchParams({ ...raw, format: "csv" });
  csvParams.delete("page");
  return (
    <section className="card">
      <header className="flex flex-wrap items-center gap-3 border-b border-slate-200 px-4 py-3 dark:border-slate-800">
        <div className="mr-auto">
          <h1 className="text-lg font-semibold">Audit trail</h1>
          <p className="text-sm text-slate-500">Every change, who made it and when (UTC), with the state before and after. Entries cannot be edited.</p>
        </div>
        <a className="btn-quiet" href={`/api/v1/audit?${csvParams}`} download>Export CSV</a>
      </header>
      {!parsed.success && <p className="px-4 pt-3 text-sm text-fault">Some filters were not understood and were ignored: {parsed.error.issues[0]?.message}</p>}
      <AuditFilters values={raw} vocabulary={vocabulary} />
      <AuditTable items={items} total={total} page={page} pageSize={pageSize} params={raw} />
    </section>
  );
}
