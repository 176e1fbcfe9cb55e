export { filterSignal } from "./filter-signal";
