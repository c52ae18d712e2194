export * from "./auth";
export * from "./shops";
export * from "./clients";
export * from "./audit";
export * from "./jobs";
