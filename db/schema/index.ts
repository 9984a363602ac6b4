export * from "./auth";
export * from "./catalog";
export * from "./settings";
export * from "./quotes";
export * from "./quote-life";
export * from "./mail";
export * from "./security";
export * from "./records";
