export * from "./canonical-json";
export * from "./device";
export * from "./faults";
export * from "./samples";
export * from "./topics";
export * from "./ws";
export * from "./overview";
export * from "./alarms";
