export * from "./rule";
export * from "./limit-state";
export * from "./tracker";
export * from "./replay";
