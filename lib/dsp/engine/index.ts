export { filterSignal } from "./filter-signal";
export {
  createStreamingFilter,
  type InitialState,
  type StreamingFilter,
  type StreamingFilterOptions,
} from "./streaming-filter";
export { createFilterBank, type FilterBank } from "./filter-bank";
export { refuseCodeGeneration } from "./codegen";
export { NoSteadyState } from "./steady-state";
