// Sampling of lots by attributes (ISO 2859-1): pure data and functions, no database, React or clock.
export * from "./iso2859-tables";
export * from "./sampling-error";
export * from "./plan-sampling";
export * from "./decide-lot";
export * from "./draw-sample";
