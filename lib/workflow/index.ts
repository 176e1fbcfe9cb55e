export * from "./permissions";
export * from "./states";
