import { fail, succeed, type AnalysisResult } from "./analysis-result";

/** How an instrument or a standard states a limit of error. Percentages are in percent (1 = 1 %). */
export type Tolerance =
  | { form: "percent-of-reading"; percent: number }
  | { form: "percent-of-reading-and-range"; percentOfReading: number; percentOfRange: number; range: number }
  | { form: "absolute"; halfWidth: number };

/** Rectangular for a stated limit ±a; normal for a calibration certificate's U with its coverage factor. */
export type Distribution = { kind: "rectangular" } | { kind: "normal"; coverageFactor: number };

export const rectangular: Distribution = { kind: "rectangular" };

export type InputQuantity = "current" | "voltage" | "time";

/** One source of error of one input quantity, e.g. the current channel's accuracy. */
export interface UncertaintySource {
  quantity: InputQuantity;
  source: string;
  tolerance: Tolerance;
  distribution?: Distribution;
  /** The limit in the words the instrument states it, e.g. "±50 ppm of the elapsed time"; else described from `tolerance`. */
  statedLimit?: string;
}

/** One line of an uncertainty budget (GUM 8: the table shown on the certificate). */
export interface UncertaintyBudgetRow {
  quantity: string;
  source: string;
  /** The limit as stated, e.g. "±(0.05 % of reading + 0.05 % of 5 A range)". */
  tolerance: string;
  /** Half-width a of the limit at this reading, in `unit`. */
  halfWidth: number;
  unit: string;
  distribution: Distribution["kind"];
  /** √3 for rectangular, k for normal. */
  divisor: number;
  /** u(xᵢ) = a / divisor, in `unit`. */
  standardUncertainty: number;
  /** u(xᵢ) / |xᵢ|, a fraction (0.01 = 1 %). */
  relativeStandardUncertainty: number;
  /** Relative sensitivity coefficient (∂y/∂xᵢ)·(xᵢ/y): the exponent of xᵢ in a product model. */
  sensitivity: number;
  /** |sensitivity| × relative standard uncertainty: this row's share of u(y)/|y|, a fraction. */
  relativeContribution: number;
}

export interface UncertaintyBudget {
  measurand: string;
  value: number;
  unit: string;
  rows: UncertaintyBudgetRow[];
  /** u_c(y) / |y|, a fraction. */
  relativeCombinedStandardUncertainty: number;
  combinedStandardUncertainty: number;
  coverageFactor: number;
  /** U / |y| = k·u_c(y) / |y|, a fraction. */
  relativeExpandedUncertainty: number;
  expandedUncertainty: number;
}

/** Half-width a of a tolerance at a reading, in the reading's unit. */
export function computeHalfWidth(tolerance: Tolerance, reading: number): number {
  switch (tolerance.form) {
    case "percent-of-reading":
      return (tolerance.percent / 100) * Math.abs(reading);
    case "percent-of-reading-and-range":
      return (tolerance.percentOfReading / 100) * Math.abs(reading) + (tolerance.percentOfRange / 100) * tolerance.range;
    case "absolute":
      return tolerance.halfWidth;
    default: {
      const unknown: never = tolerance;
      throw new Error(`Unknown tolerance ${JSON.stringify(unknown)}`);
    }
  }
}

/** The divisor that turns a half-width into a standard uncertainty: √3 (GUM 4.3.7) or the certificate's k (GUM 4.3.3). */
export function computeDivisor(distribution: Distribution): number {
  switch (distribution.kind) {
    case "rectangular":
      return Math.sqrt(3);
    case "normal":
      return distribution.coverageFactor;
    default: {
      const unknown: never = distribution;
      throw new Error(`Unknown distribution ${JSON.stringify(unknown)}`);
    }
  }
}

/** u = a / √3 for a rectangular limit ±a (GUM 4.3.7), or U / k for a normal one. */
export function computeStandardUncertainty(halfWidth: number, distribution: Distribution = rectangular): number {
  return halfWidth / computeDivisor(distribution);
}

export function describeTolerance(tolerance: Tolerance, unit: string): string {
  switch (tolerance.form) {
    case "percent-of-reading":
      return `±${tolerance.percent} % of reading`;
    case "percent-of-reading-and-range":
      return `±(${tolerance.percentOfReading} % of reading + ${tolerance.percentOfRange} % of ${tolerance.range} ${unit} range)`;
    case "absolute":
      return `±${tolerance.halfWidth} ${unit}`;
    default: {
      const unknown: never = tolerance;
      throw new Error(`Unknown tolerance ${JSON.stringify(unknown)}`);
    }
  }
}

export function checkTolerance(tolerance: Tolerance, distribution: Distribution | undefined): string | null {
  const values = (() => {
    switch (tolerance.form) {
      case "percent-of-reading":
        return [tolerance.percent];
      case "percent-of-reading-and-range":
        return [tolerance.percentOfReading, tolerance.percentOfRange, tolerance.range];
      case "absolute":
        return [tolerance.halfWidth];
      default: {
        const unknown: never = tolerance;
        return [Number.NaN, unknown];
      }
    }
  })();
  if (!values.every((x) => typeof x === "number" && Number.isFinite(x) && x >= 0)) return "Tolerances must be numbers of zero or more.";
  if (distribution?.kind === "normal" && !(distribution.coverageFactor > 0)) return "A normal distribution needs a coverage factor above zero.";
  return null;
}

/** Builds one budget row for an input of value `reading` entering the result with relative sensitivity `sensitivity`. */
export function createBudgetRow(input: {
  quantity: string;
  source: string;
  tolerance: Tolerance;
  distribution?: Distribution;
  reading: number;
  unit: string;
  sensitivity: number;
  statedLimit?: string;
}): UncertaintyBudgetRow {
  const distribution = input.distribution ?? rectangular;
  const halfWidth = computeHalfWidth(input.tolerance, input.reading);
  const divisor = computeDivisor(distribution);
  const standardUncertainty = halfWidth / divisor;
  const relativeStandardUncertainty = standardUncertainty / Math.abs(input.reading);
  return {
    quantity: input.quantity,
    source: input.source,
    tolerance: input.statedLimit ?? describeTolerance(input.tolerance, input.unit),
    halfWidth,
    unit: input.unit,
    distribution: distribution.kind,
    divisor,
    standardUncertainty,
    relativeStandardUncertainty,
    sensitivity: input.sensitivity,
    relativeContribution: Math.abs(input.sensitivity) * relativeStandardUncertainty,
  };
}

/** Sums independent rows in quadrature (GUM 5.1.2 in relative form) and expands with k (GUM 6.2.1). */
export function combineBudget(input: {
  measurand: string;
  value: number;
  unit: string;
  rows: UncertaintyBudgetRow[];
  coverageFactor: number;
}): UncertaintyBudget {
  const relative = Math.sqrt(input.rows.reduce((sum, row) => sum + row.relativeContribution ** 2, 0));
  const magnitude = Math.abs(input.value);
  return {
    ...input,
    relativeCombinedStandardUncertainty: relative,
    combinedStandardUncertainty: relative * magnitude,
    relativeExpandedUncertainty: input.coverageFactor * relative,
    expandedUncertainty: input.coverageFactor * relative * magnitude,
  };
}

const unitOf: Record<InputQuantity, string> = { current: "A", voltage: "V", time: "s" };

/**
 * Budget for a result that is a product of powers of its inputs, y = c·∏ xᵢ^pᵢ: then
 * u_r(y)² = Σ (pᵢ·u_r(xᵢ))² for independent inputs (GUM 5.1.6). Sources of one quantity are
 * independent of each other. Readings for percent-of-reading terms are the step's mean values.
 */
function evaluateProductBudget(input: {
  measurand: string;
  value: number;
  unit: string;
  readings: Partial<Record<InputQuantity, number>>;
  sources: readonly UncertaintySource[];
  coverageFactor: number;
}): AnalysisResult<UncertaintyBudget> {
  if (!Number.isFinite(input.value) || input.value === 0) return fail("invalid-input", `The ${input.measurand} must be a number other than zero.`);
  if (!(input.coverageFactor > 0)) return fail("invalid-input", "The coverage factor must be above zero.");
  for (const [quantity, reading] of Object.entries(input.readings)) {
    if (!Number.isFinite(reading) || reading === 0) return fail("invalid-input", `The ${quantity} reading must be a number other than zero.`);
  }
  const rows: UncertaintyBudgetRow[] = [];
  for (const source of input.sources) {
    const reading = input.readings[source.quantity];
    if (reading === undefined) return fail("invalid-input", `The ${source.quantity} does not enter the ${input.measurand}.`);
    const problem = checkTolerance(source.tolerance, source.distribution);
    if (problem) return fail("invalid-input", `${source.source}: ${problem}`);
    rows.push(createBudgetRow({ ...source, reading, unit: unitOf[source.quantity], sensitivity: 1 }));
  }
  return succeed(combineBudget({ measurand: input.measurand, value: input.value, unit: input.unit, rows, coverageFactor: input.coverageFactor }));
}

/** Capacity Q = I·t (definition, CC step): u_r(Q)² = u_r(I)² + u_r(t)² (GUM 5.1.6), expanded with k (default 2). */
export function evaluateCapacityUncertainty(input: {
  capacityAh: number;
  currentA: number;
  durationS: number;
  sources: readonly UncertaintySource[];
  coverageFactor?: number;
}): AnalysisResult<UncertaintyBudget> {
  return evaluateProductBudget({
    measurand: "capacity",
    value: input.capacityAh,
    unit: "Ah",
    readings: { current: input.currentA, time: input.durationS },
    sources: input.sources,
    coverageFactor: input.coverageFactor ?? 2,
  });
}

/**
 * Energy E = U·I·t (definition, CC step, U the mean voltage): u_r(E)² = u_r(U)² + u_r(I)² + u_r(t)²
 * (GUM 5.1.6). A percent-of-reading error scales every sample alike, so for it the product rule is
 * exact for the integral too; range terms are taken at the mean reading.
 */
export function evaluateEnergyUncertainty(input: {
  energyWh: number;
  meanVoltageV: number;
  currentA: number;
  durationS: number;
  sources: readonly UncertaintySource[];
  coverageFactor?: number;
}): AnalysisResult<UncertaintyBudget> {
  return evaluateProductBudget({
    measurand: "energy",
    value: input.energyWh,
    unit: "Wh",
    readings: { voltage: input.meanVoltageV, current: input.currentA, time: input.durationS },
    sources: input.sources,
    coverageFactor: input.coverageFactor ?? 2,
  });
}
