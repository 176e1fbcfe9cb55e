import { filterSignal, type FilterDesign } from "@/lib/dsp";

/** Stretches [from, to) of samples without NaN, in order. */
export function finiteRuns(x: Float64Array): { from: number; to: number }[] {
  const runs: { from: number; to: number }[] = [];
  let start = -1;
  for (let i = 0; i <= x.length; i++) {
    const ok = i < x.length && !Number.isNaN(x[i]);
    if (ok && start < 0) start = i;
    if (!ok && start >= 0) {
      runs.push({ from: start, to: i });
      start = -1;
    }
  }
  return runs;
}

/** The longest stretch without NaN (the first of equals); { from: 0, to: 0 } when there is none. */
export function longestRun(x: Float64Array): { from: number; to: number } {
  let best = { from: 0, to: 0 };
  for (const r of finiteRuns(x)) if (r.to - r.from > best.to - best.from) best = r;
  return best;
}

/**
 * A recording replayed through a filter offline: each stretch between missing samples is filtered on
 * its own, starting at the steady state of its first sample (initial 'step'), so a gap neither
 * poisons the filter state with NaN nor swings the output in from zero; missing samples stay NaN.
 */
export function replayThrough(design: FilterDesign, x: Float64Array): Float64Array {
  const out = new Float64Array(x.length).fill(NaN);
  for (const { from, to } of finiteRuns(x)) out.set(filterSignal(design, x.subarray(from, to), { initial: "step" }), from);
  return out;
}
