import { Swatch } from "@/components/ui/swatch";
import { deltaName, formatDelta, type CursorReadout, type Cursors } from "@/lib/charts/cursors";
import { valueText, xText } from "./chart-options";
import type { ChartSeries, ChartX } from "./chart-types";

/**
 * What the measurement cursors read: a one-line summary (where A and B are and their x difference, announced
 * when a cursor moves) and, per shown series, its value under A and B and the difference B − A.
 */
export function CursorReadoutView({ cursors, readout, series, x, onClear }: { cursors: Cursors; readout: CursorReadout | null; series: ChartSeries[]; x: ChartX; onClear: () => void }) {
  const placed = cursors.a !== null || cursors.b !== null;
  const parts = placed
    ? [cursors.a !== null && `A ${xText({ x }, cursors.a)}`, cursors.b !== null && `B ${xText({ x }, cursors.b)}`, cursors.a !== null && cursors.b !== null && `${deltaName(x)} ${formatDelta(x, cursors.b - cursors.a)}`].filter(Boolean)
    : [];
  const rows = series.map((s, i) => ({ s, i })).filter(({ s }) => s.show ?? true);
  return (
    <div className="tw-cursor-readout" data-testid="cursor-readout">
      <div className="flex flex-wrap items-center gap-x-3">
        <p role="status" aria-live="polite" className="num" data-testid="cursor-summary">
          {parts.join(" · ")}
        </p>
        {placed && (
          <button type="button" className="tw-chart-button" onClick={onClear}>
            Clear cursors
          </button>
        )}
      </div>
      {placed && readout && rows.length > 0 && (
        <table className="num mt-1">
          <thead>
            <tr>
              <th scope="col">
                <span className="sr-only">Trace</span>
              </th>
              <th scope="col">A</th>
              <th scope="col">B</th>
              <th scope="col">B − A</th>
            </tr>
          </thead>
          <tbody>
            {rows.map(({ s, i }) => (
              <tr key={`${s.label}-${i}`}>
                <th scope="row">
                  <span className="inline-flex items-center gap-1.5">
                    <Swatch color={s.color} dashed={Boolean(s.dash)} />
                    {s.label}
                  </span>
                </th>
                <td>{readout.a ? valueText(readout.a.values[i], s.unit) : "—"}</td>
                <td>{readout.b ? valueText(readout.b.values[i], s.unit) : "—"}</td>
                <td>{valueText(readout.dy[i], s.unit)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </div>
  );
}
