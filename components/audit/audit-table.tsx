import type { AuditRow } from "@/lib/audit";
import { formatDateTime } from "@/lib/format/date-time";
import { countOf } from "@/lib/format/plural";

interface Props {
  items: AuditRow[];
  total: number;
  page: number;
  pageSize: number;
  params: Record<string, string | undefined>;
}

const json = (v: unknown) => (v == null ? "" : JSON.stringify(v));

/** One page of audit entries, newest first, with before/after as compact JSON. */
export function AuditTable({ items, total, page, pageSize, params }: Props) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const link = (p: number) => `/audit?${new URLSearchParams({ ...(params as Record<string, string>), page: String(p) })}`;
  return (
    <div>
      <div className="overflow-x-auto">
        <table className="w-full text-sm" data-testid="audit-table">
          <thead className="text-left text-xs uppercase tracking-wide text-slate-500">
            <tr><th className="px-4 py-2">When</th><th className="px-2">Actor</th><th className="px-2">Action</th><th className="px-2">Entity</th><th className="px-2">Before</th><th className="px-2">After</th></tr>
          </thead>
          <tbody>
            {items.map((e) => (
              <tr key={e.id} className="border-t border-slate-100 align-top dark:border-slate-800">
                <td className="num whitespace-nowrap px-4 py-1.5 text-xs">{formatDateTime(e.at)}</td>
                <td className="px-2 text-xs" title={e.actorEmail ?? undefined}>{e.actor ?? <span className="text-slate-500">system</span>}</td>
                <td className="num px-2 text-xs">{e.action}</td>
                <td className="num px-2 text-xs">{e.entity}{e.entityId ? ` #${e.entityId}` : ""}</td>
                <td className="num max-w-xs break-all px-2 text-[11px] text-slate-500">{json(e.before)}</td>
                <td className="num max-w-md break-all px-2 text-[11px]">{json(e.after)}</td>
              </tr>
            ))}
          </tbody>
        </table>
        {items.length === 0 && <p className="px-4 py-6 text-sm text-slate-500">No entries match these filters. Widen the date range or clear a filter.</p>}
      </div>
      <nav className="flex items-center justify-between border-t border-slate-200 px-4 py-2 text-sm dark:border-slate-800" aria-label="Pages">
        <span className="text-slate-500">{countOf(total, "entry", "entries")}</span>
        <span className="flex items-center gap-2">
          {page > 1 && <a className="btn-quiet" href={link(page - 1)}>Newer</a>}
          <span className="num">{page} / {pages}</span>
          {page < pages && <a className="btn-quiet" href={link(page + 1)}>Older</a>}
        </span>
      </nav>
    </div>
  );
}
