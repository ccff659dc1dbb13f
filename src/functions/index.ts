/** Every binding module, so hosts can find each function by its exported name. */
export * from "./units";
export * from "./cations";
export * from "./lime";
export * from "./bands";
export * from "./nitrogen";
export * from "./meta";
export * from "./lab";
