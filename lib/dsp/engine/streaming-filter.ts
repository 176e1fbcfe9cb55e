import { runForm } from "../analysis/design-form";
import type { FilterDesign } from "../types";
import { CascadeState, type FilterState } from "./cascade-state";

/** 'zero': start at rest. 'step': start at the steady state of the first sample (scipy.signal sosfilt_zi / lfilter_zi × x[0]). */
export type InitialState = "zero" | "step";

export interface StreamingFilterOptions {
  initial?: InitialState;
}

/**
 * A filter that keeps its state between blocks: any split of a signal into blocks gives output
 * bit-identical to one pass. A NaN or ±Infinity input sample counts as a fault, gives NaN output
 * for that sample and restarts the state: at rest for 'zero'; for 'step', at the steady state of
 * the next finite sample (exactly what a fresh filter would do from there).
 */
export interface StreamingFilter {
  /**
   * Filter a block (same units as the input). `out`, if given, must have x.length entries and be
   * either x itself (in-place) or memory that does not overlap x.
   */
  process(x: Float64Array, out?: Float64Array): Float64Array;
  /** Back to the initial condition, as if just built; the fault count is kept. */
  reset(): void;
  /** Non-finite input samples seen so far. */
  readonly faults: number;
}

function buildState(design: FilterDesign, withStep: boolean): FilterState {
  return new CascadeState(runForm(design), withStep).simplest();
}

/** Index of the first non-finite sample in x[from..), or x.length if none (v − v ≠ 0 exactly for NaN and ±∞). */
function firstNonFinite(x: Float64Array, from: number): number {
  let i = from;
  while (i < x.length && x[i] - x[i] === 0) i++;
  return i;
}

/**
 * Build a streaming filter for an SOS, FIR or chain design (DF2T per section, scipy.signal sosfilt
 * order; a chain runs its stages one after the other).
 */
export function createStreamingFilter(design: FilterDesign, opts: StreamingFilterOptions = {}): StreamingFilter {
  const initial = opts.initial ?? "zero";
  if (initial !== "zero" && initial !== "step") {
    throw new Error(`initial must be 'zero' or 'step' (got ${String(initial)})`);
  }
  const step = initial === "step";
  const state = buildState(design, step);
  let awaitingSample = step;
  let faults = 0;

  function process(x: Float64Array, out?: Float64Array): Float64Array {
    const y = out ?? new Float64Array(x.length);
    if (y.length !== x.length) throw new Error(`out must have ${x.length} entries like x (got ${y.length})`);
    // The optimistic pass may write y before finding a bad sample, so it must not run in place.
    const inPlace = y.buffer === x.buffer;
    if (!awaitingSample && !inPlace && state.runIfFinite(x, y, 0, x.length)) return y;
    let i = 0;
    while (i < x.length) {
      const bad = firstNonFinite(x, i);
      if (bad > i && awaitingSample) {
        state.settle(x[i]);
        awaitingSample = false;
      }
      state.run(x, y, i, bad);
      if (bad === x.length) break;
      faults++;
      y[bad] = NaN;
      if (step) awaitingSample = true;
      else state.clear();
      i = bad + 1;
    }
    return y;
  }

  function reset(): void {
    state.clear();
    awaitingSample = step;
  }

  return {
    process,
    reset,
    get faults() {
      return faults;
    },
  };
}
