/** A step's stretch of the log, for shading a time plot. */
export interface SeriesStepBand {
  stepId: string;
  cycle: number;
  label: string;
  kind: string;
  startS: number;
  endS: number;
}

/** V, I (and T) against elapsed time, thinned on the server, with the steps' stretches. */
export interface TimeSeriesView {
  kind: "time";
  sampleCount: number;
  read: "every-sample" | "strided";
  timeS: number[];
  voltageV: number[];
  currentA: number[];
  temperatureC: number[] | null;
  steps: SeriesStepBand[];
}

/** Voltage against the charge passed since a discharge step began, thinned on the server. */
export interface CapacitySeriesView {
  kind: "capacity";
  stepId: string;
  cycle: number;
  label: string;
  sampleCount: number;
  read: "every-sample" | "strided";
  capacityMAh: number[];
  voltageV: number[];
}

export type RunSeriesView = TimeSeriesView | CapacitySeriesView;
