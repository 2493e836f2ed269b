// Lot statistics on top of simple-statistics: pure functions, no database, React or clock.
export * from "./describe-results";
export * from "./histogram";
export * from "./group-by-current";
export * from "./describe-by-current";
