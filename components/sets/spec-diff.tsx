import type { FieldChange } from "@/lib/coefficients";

const show = (v: unknown) => (v === undefined ? "—" : typeof v === "string" ? v : JSON.stringify(v));

/** The spec fields that differ between two revisions. */
export function SpecDiff({ changes, a, b }: { changes: FieldChange[]; a: number; b: number }) {
  if (changes.length === 0) return <p className="text-sm text-slate-500">The two specs are identical.</p>;
  return (
    <table className="w-full text-sm" data-testid="spec-diff">
      <thead className="text-left text-xs uppercase tracking-wide text-slate-500">
        <tr>
          <th className="py-1 pr-4">Field</th>
          <th className="py-1 pr-4">r{a}</th>
          <th className="py-1">r{b}</th>
        </tr>
      </thead>
      <tbody>
        {changes.map((c) => (
          <tr key={c.field} className="border-t border-slate-100 dark:border-slate-800">
            <td className="num py-1 pr-4 text-xs">{c.field}</td>
            <td className="num py-1 pr-4 text-xs">{show(c.before)}</td>
            <td className="num py-1 text-xs">{show(c.after)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
