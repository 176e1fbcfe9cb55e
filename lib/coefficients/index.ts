export * from "./analysis";
export * from "./device-config";
export * from "./diff";
export * from "./revision-content";
export * from "./stored-config";
export * from "./stored-schemas";
