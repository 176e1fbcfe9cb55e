import type { FilterDesign } from "../types";
import { createStreamingFilter, type StreamingFilterOptions } from "./streaming-filter";

/** `out`: an array of x's length to write into (reused across calls, it saves the allocation). */
export interface FilterSignalOptions extends StreamingFilterOptions {
  out?: Float64Array;
}

/**
 * Filter a whole signal in one pass (units of x in, same units out): the one-shot form of
 * createStreamingFilter, so it shares its kernels, initial conditions and fault handling.
 * SOS designs run as DF2T sections in scipy.signal `sosfilt` arithmetic order; FIR taps by direct convolution.
 */
export function filterSignal(design: FilterDesign, x: Float64Array, opts: FilterSignalOptions = {}): Float64Array {
  const { out, ...filterOpts } = opts;
  return createStreamingFilter(design, filterOpts).process(x, out);
}
