export * from "./analysis";
export * from "./device-config";
export * from "./revision-content";
export * from "./sections";
