import type { FilterDesign } from "../types";
import { createStreamingFilter, type StreamingFilterOptions } from "./streaming-filter";

/**
 * Filter a whole signal in one pass (units of x in, same units out): the one-shot form of
 * createStreamingFilter, so it shares its kernels, initial conditions and fault handling.
 * SOS designs run as DF2T sections in scipy.signal `sosfilt` arithmetic order; FIR taps by direct convolution.
 */
export function filterSignal(
  design: FilterDesign,
  x: Float64Array,
  opts: StreamingFilterOptions = {},
): Float64Array {
  return createStreamingFilter(design, opts).process(x);
}
