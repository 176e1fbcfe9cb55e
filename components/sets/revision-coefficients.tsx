import { quantizedParts, type QuantizedDesign, type QuantizedPart } from "@/lib/dsp";
import { countOf } from "@/lib/format/plural";

/** A coefficient in full precision (meant to be copied): 17 significant digits round-trip a float64. */
const full = (v: number) => String(Number(v.toPrecision(17)));

function PartTable({ part, format, title }: { part: QuantizedPart; format: string; title: string }) {
  const fixed = format !== "f32";
  if (part.taps) {
    return (
      <div className="space-y-1">
        <h5 className="text-xs font-medium">
          {title}: FIR, {countOf(part.taps.length, "tap")}
          {fixed && <span className="font-normal text-slate-500"> · post-shift {part.shifts[0]}</span>}
        </h5>
        <ol className="num max-h-40 overflow-auto rounded bg-slate-50 p-2 text-xs dark:bg-slate-900" start={0} aria-label={`${title} taps`}>
          {part.taps.map((t, i) => (
            <li key={i} className="ml-8 list-decimal">
              {full(t)}
              {part.integers && <span className="ml-3 text-slate-500">word {part.integers[0][i]}</span>}
            </li>
          ))}
        </ol>
      </div>
    );
  }
  const sos = part.sos ?? [];
  return (
    <div className="space-y-1">
      <h5 className="text-xs font-medium">
        {title}: {countOf(sos.length, "section")} [b0, b1, b2, a1, a2], as the device runs them
      </h5>
      <div className="max-h-56 overflow-auto">
        <table className="num w-full text-xs" data-testid="revision-sections">
          <thead className="text-left text-slate-500">
            <tr>
              <th className="py-1 pr-2 font-medium">#</th>
              <th className="pr-2 font-medium">Coefficients</th>
              {fixed && <th className="pr-2 font-medium">{format.toUpperCase()} words</th>}
              {fixed && <th className="font-medium">Shift</th>}
            </tr>
          </thead>
          <tbody>
            {sos.map((row, i) => (
              <tr key={i} className="border-t border-slate-200 align-top dark:border-slate-800">
                <td className="py-1 pr-2">{i + 1}</td>
                <td className="pr-2">{[row[0], row[1], row[2], row[4], row[5]].map(full).join(", ")}</td>
                {fixed && <td className="pr-2" data-testid="fixed-words">{part.integers?.[i]?.join(", ") ?? "—"}</td>}
                {fixed && <td>{part.shifts[i]}</td>}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

/**
 * A revision's stored coefficients as its device runs them: per stage, the second-order sections (or
 * FIR taps) at their real values and, for Q15/Q31, the integer words with each section's post-shift.
 */
export function RevisionCoefficients({ quantized }: { quantized: QuantizedDesign | null }) {
  if (!quantized) return <p className="text-xs text-fault">No quantized form: this design could not be quantized for the device.</p>;
  const parts = quantizedParts(quantized);
  return (
    <section className="space-y-2" aria-label="Sections and fixed-point words">
      <h4 className="text-sm font-medium">Sections and fixed-point words ({quantized.format.toUpperCase()})</h4>
      {parts.map((part, k) => (
        <PartTable key={k} part={part} format={quantized.format} title={parts.length === 1 ? "Filter" : `Stage ${k + 1}`} />
      ))}
    </section>
  );
}
