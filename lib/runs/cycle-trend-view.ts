import type { RetentionFit, StopCriterion } from "@/lib/analysis";

/** One cycle as the run page shows it. */
export interface CycleTrendRow {
  cycle: number;
  /** Discharge capacity, mAh. */
  dischargeMAh: number;
  chargeMAh: number;
  /** Discharge capacity / rated × 100 %. */
  retentionPercent: number;
  /** Q_discharge / Q_charge × 100 %. */
  coulombicEfficiencyPercent: number | null;
  energyEfficiencyPercent: number | null;
  dischargeWh: number;
  endOfChargeV: number | null;
  endOfDischargeV: number | null;
  dcResistanceMOhm: number | null;
  /** False while the cycle may still change (the next charge has not begun). */
  closed: boolean;
}

/** The run's capacity retention per cycle, its stop criterion, and where a straight-line fit says it will be met. */
export interface CycleTrendView {
  ratedCapacityMAh: number | null;
  /** Where the stop share and cycle limit come from; null when the procedure states none. */
  stop: (StopCriterion & { source: string }) | null;
  rows: CycleTrendRow[];
  /** The cycle where the stop criterion was met, with why. */
  stopReached: { cycle: number; words: string } | null;
  /** An extrapolation: the cycle where the fitted line falls below the stop share. */
  estimate: { cycle: number; fit: RetentionFit } | { cycle: null; why: string; fit: RetentionFit | null } | null;
  /** Samples read so far, and when the latest arrived (ISO time). */
  sampleCount: number;
  samplesArrivedAt: string | null;
}
