"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import Link from "next/link";
import { useDeferredValue, useState } from "react";
import { SET_STATUSES, STATE_LABELS } from "@/lib/workflow";
import type { SetListItem } from "@/lib/workflow/set-list";
import { StateBadge } from "./state-badge";
import { formatDateTime } from "@/lib/format/date-time";
import { countOf } from "@/lib/format/plural";

/** A list row as GET /api/v1/sets sends it (dates as ISO strings). */
type SetRow = SetListItem<string>;

const PAGE_SIZE = 20;
const col = createColumnHelper<SetRow>();
const columns = [
  col.accessor("name", {
    header: "Name",
    cell: (c) => <Link href={`/sets/${c.row.original.id}`} className="font-medium text-brand-700 hover:underline dark:text-brand-300">{c.getValue()}</Link>,
  }),
  col.accessor("channel", { header: "Channel", cell: (c) => <span className="num text-xs">{c.getValue()}</span> }),
  col.accessor("status", { header: "Status", cell: (c) => <StateBadge state={c.getValue()} /> }),
  col.accessor("latestRevision", { header: "Latest", cell: (c) => <span className="num">r{c.getValue()}</span> }),
  col.accessor("author", { header: "Author" }),
  col.accessor("updatedAt", {
    header: "Updated",
    cell: (c) => <span className="num text-xs">{formatDateTime(c.getValue())}</span>,
  }),
];

async function fetchSets(params: URLSearchParams): Promise<{ items: SetRow[]; total: number }> {
  const res = await fetch(`/api/v1/sets?${params}`, { headers: { accept: "application/json" } });
  const body = await res.json();
  if (!res.ok) throw new Error(body?.error?.message ?? `The server answered ${res.status}.`);
  return body;
}

/** The coefficient sets, paged, sorted and filtered on the server through GET /api/v1/sets. */
export function SetsTable({ channels }: { channels: string[] }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "updatedAt", desc: true }]);
  const [page, setPage] = useState(1);
  const [filters, setFilters] = useState({ channel: "", status: "", author: "", q: "" });
  const typed = useDeferredValue(filters);
  const params = new URLSearchParams({ page: String(page), pageSize: String(PAGE_SIZE) });
  if (sorting[0]) {
    params.set("sort", sorting[0].id);
    params.set("dir", sorting[0].desc ? "desc" : "asc");
  }
  for (const [k, v] of Object.entries(typed)) if (v.trim()) params.set(k, v.trim());

  const query = useQuery({ queryKey: ["sets", params.toString()], queryFn: () => fetchSets(params), placeholderData: keepPreviousData, staleTime: 5_000 });
  // TanStack Table hands back fresh functions on every render by design; nothing here is memoized by a compiler.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: query.data?.items ?? [],
    columns,
    state: { sorting },
    manualSorting: true,
    manualPagination: true,
    enableSortingRemoval: false,
    onSortingChange: (s) => {
      setSorting(s);
      setPage(1);
    },
    getCoreRowModel: getCoreRowModel(),
  });
  const total = query.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
  const setFilter = (key: keyof typeof filters) => (e: { target: { value: string } }) => {
    setFilters((f) => ({ ...f, [key]: e.target.value }));
    setPage(1);
  };

  return (
    <div className="space-y-3">
      <div className="grid gap-3 px-4 pt-3 sm:grid-cols-4" role="search">
        <div>
          <label className="label" htmlFor="f-q">Search</label>
          <input id="f-q" className="field" placeholder="Name or channel" value={filters.q} onChange={setFilter("q")} />
        </div>
        <div>
          <label className="label" htmlFor="f-channel">Channel</label>
          <select id="f-channel" className="field" value={filters.channel} onChange={setFilter("channel")}>
            <option value="">All channels</option>
            {channels.map((c) => <option key={c} value={c}>{c}</option>)}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="f-status">Status</label>
          <select id="f-status" className="field" value={filters.status} onChange={setFilter("status")}>
            <option value="">Any status</option>
            {SET_STATUSES.map((s) => <option key={s} value={s}>{STATE_LABELS[s]}</option>)}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="f-author">Author</label>
          <input id="f-author" className="field" placeholder="Name or e-mail" value={filters.author} onChange={setFilter("author")} />
        </div>
      </div>
      <div className="overflow-x-auto">
        <table className="w-full text-sm" data-testid="sets-table" aria-busy={query.isFetching}>
          <thead className="text-left text-xs uppercase tracking-wide text-slate-500">
            {table.getHeaderGroups().map((g) => (
              <tr key={g.id}>
                {g.headers.map((h) => {
                  const dir = h.column.getIsSorted();
                  return (
                    <th key={h.id} className="px-4 py-2" aria-sort={dir === "asc" ? "ascending" : dir === "desc" ? "descending" : "none"}>
                      <button type="button" className="uppercase hover:text-slate-900 dark:hover:text-white" onClick={h.column.getToggleSortingHandler()}>
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        {dir === "asc" ? " ↑" : dir === "desc" ? " ↓" : ""}
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.id} className="border-t border-slate-100 dark:border-slate-800" data-testid={`set-row-${r.original.id}`}>
                {r.getVisibleCells().map((c) => (
                  <td key={c.id} className="px-4 py-2">{flexRender(c.column.columnDef.cell, c.getContext())}</td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
        {query.isError && <p className="px-4 py-6 text-sm text-fault">Could not load the sets: {query.error.message} Reload the page to try again.</p>}
        {query.isPending && <p className="px-4 py-6 text-sm text-slate-500">Loading coefficient sets…</p>}
        {query.isSuccess && total === 0 && (
          <p className="px-4 py-6 text-sm text-slate-500">No coefficient sets match. Save a filter from a channel&apos;s bench to start one, or clear the filters.</p>
        )}
      </div>
      <div className="flex items-center justify-between border-t border-slate-200 px-4 py-2 text-sm dark:border-slate-800">
        <span className="text-slate-500">{countOf(total, "set")}</span>
        <div className="flex items-center gap-2">
          <button type="button" className="btn-quiet" disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>Previous</button>
          <span className="num">{page} / {pages}</span>
          <button type="button" className="btn-quiet" disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>Next</button>
        </div>
      </div>
    </div>
  );
}
