export * from "./auth";
export * from "./shops";
export * from "./clients";
export * from "./audit";
export * from "./jobs";
export * from "./blanks";
export * from "./proofs";
export * from "./review";
