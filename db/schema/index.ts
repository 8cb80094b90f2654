export * from "./enums";
export * from "./auth";
export * from "./customers";
export * from "./sites";
export * from "./captures";
export * from "./audit";
export * from "./limits";
export * from "./results";
