// The pure computation of a run's log: data in, data out (no database, no React, no clock).
export * from "./analysis-result";
export * from "./index-range";
export type { LogColumns } from "./log-columns";
export { integrate, type Integral } from "./integrate";
export * from "./segment";
export * from "./pulse-levels";
export * from "./internal-resistance";
export * from "./step-results";
export * from "./match-steps";
export * from "./downsample";
export * from "./cell-model";
export * from "./seeded-random";
export * from "./synthetic-log";
export * from "./write-log-csv";
export * from "./uncertainty";
export * from "./dc-resistance-uncertainty";
export * from "./discharge-end";
export * from "./capacity-budget-terms";
