/** One discharge's voltage against the charge it delivered, for an overlay. */
export interface OverlaySeries {
  key: string;
  runNumber: string;
  specimenIdentifier: string;
  specificationName: string;
  stepLabel: string;
  currentA: number;
  multipleOfIt: number;
  aboveRating: boolean;
  /** Samples in the discharge; the curve holds `capacityMAh.length` of them, thinned by LTTB. */
  sampleCount: number;
  capacityMAh: number[];
  voltageV: number[];
}

/** What the series route answers: the curves it could draw, and the chosen discharges it could not, with why. */
export interface OverlaySeriesView {
  series: OverlaySeries[];
  missing: { key: string; reason: string }[];
}
