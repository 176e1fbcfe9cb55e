import { withUnit } from "@/lib/bench/format";
import type { PhaseCost } from "@/lib/dsp/loop";
import type { LoopAnalysis } from "./analysis";
import { WITH_COLOR, WITHOUT_COLOR } from "./colors";

type Row = { name: string; color: string; a: LoopAnalysis };

const cells = (a: LoopAnalysis) => [
  withUnit(a.margins.gainMarginDb, "dB", 3),
  withUnit(a.margins.phaseCrossoverHz, "Hz", 4),
  withUnit(a.margins.phaseMarginDeg, "°", 3),
  withUnit(a.margins.gainCrossoverHz, "Hz", 4),
  withUnit(a.margins.delayMarginMs, "ms", 3),
  a.poles.stable ? `stable, max |z| ${withUnit(a.poles.maxRadius, "", 5)}` : `UNSTABLE, max |z| ${withUnit(a.poles.maxRadius, "", 5)}`,
];

function change(a: number | null, b: number | null, unit: string): string {
  if (a === null || b === null) return "—";
  const d = b - a;
  return `${d > 0 ? "+" : ""}${withUnit(d, unit, 3)}`;
}

/** Gain and phase margins, crossovers, delay margin and closed-loop stability, with and without the filter, and the change. */
export function MarginsTable({ without, withF, lag }: { without: LoopAnalysis; withF: LoopAnalysis | null; lag: PhaseCost | null }) {
  const rows: Row[] = [{ name: "Without filter", color: WITHOUT_COLOR, a: without }];
  if (withF) rows.push({ name: "With filter", color: WITH_COLOR, a: withF });
  const head = ["Gain margin", "Phase crossover", "Phase margin", "Gain crossover", "Delay margin", "Closed loop"];
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm" aria-label="Stability margins">
        <thead>
          <tr className="border-b border-slate-200 text-left text-xs uppercase tracking-wide text-slate-500 dark:border-slate-800">
            <th className="py-1.5 pr-3 font-medium">Loop</th>
            {head.map((h) => (
              <th key={h} className="py-1.5 pr-3 font-medium">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.name} data-testid={r.name === "With filter" ? "margins-with" : "margins-without"} className="border-b border-slate-100 dark:border-slate-800/60">
              <th scope="row" className="py-1.5 pr-3 text-left font-medium">
                <span className="mr-1.5 inline-block h-2.5 w-2.5 rounded-full align-middle" style={{ background: r.color }} />
                {r.name}
              </th>
              {cells(r.a).map((c, i) => (
                <td key={head[i]} className={`num py-1.5 pr-3 ${!r.a.poles.stable && i === 5 ? "text-red-700 dark:text-red-300" : ""}`}>
                  {c}
                </td>
              ))}
            </tr>
          ))}
          {withF && (
            <tr data-testid="margins-change" className="text-slate-600 dark:text-slate-300">
              <th scope="row" className="py-1.5 pr-3 text-left font-medium">
                Change
              </th>
              <td className="num py-1.5 pr-3">{change(without.margins.gainMarginDb, withF.margins.gainMarginDb, "dB")}</td>
              <td className="num py-1.5 pr-3">{change(without.margins.phaseCrossoverHz, withF.margins.phaseCrossoverHz, "Hz")}</td>
              <td className="num py-1.5 pr-3">{change(without.margins.phaseMarginDeg, withF.margins.phaseMarginDeg, "°")}</td>
              <td className="num py-1.5 pr-3">{change(without.margins.gainCrossoverHz, withF.margins.gainCrossoverHz, "Hz")}</td>
              <td className="num py-1.5 pr-3">{change(without.margins.delayMarginMs, withF.margins.delayMarginMs, "ms")}</td>
              <td className="num py-1.5 pr-3">{lag ? `filter lag at fc: ${withUnit(lag.lagDeg, "°", 3)} (${withUnit(lag.lagMs, "ms", 3)})` : "—"}</td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  );
}
