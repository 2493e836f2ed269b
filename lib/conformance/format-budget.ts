import type { UncertaintyBudget, UncertaintyBudgetRow } from "@/lib/analysis";
import { formatNumber } from "@/protocols";

/** One line of an uncertainty budget in words and figures, units beside the values (GUM 8 table). */
export interface BudgetTableRow {
  quantity: string;
  source: string;
  /** The limit as the instrument states it. */
  statedLimit: string;
  /** Half-width a at this reading, with unit. */
  halfWidth: string;
  distribution: string;
  /** "√3" for a rectangular limit, the certificate's k for a normal one. */
  divisor: string;
  /** u(xᵢ) with unit. */
  standardUncertainty: string;
  /** u(xᵢ)/|xᵢ| in percent. */
  relativeStandardUncertainty: string;
  /** Relative sensitivity coefficient cᵢ. */
  sensitivity: string;
  /** |cᵢ|·u(xᵢ)/|xᵢ| in percent: the row's share of u_c(y)/|y|. */
  contribution: string;
}

export interface BudgetTable {
  /** "Capacity" */
  measurand: string;
  /** "3 059.7 mAh" */
  value: string;
  rows: BudgetTableRow[];
  /** "1.35 mAh (0.0441 %)" */
  combined: string;
  /** "2" */
  coverageFactor: string;
  /** "±16.5 mAh" */
  expanded: string;
  /** "±0.539 %" */
  expandedPercent: string;
}

const MINUS = "\u2212";

/** x to `digits` significant figures, grouped, with a true minus sign; 0 as "0". */
export function formatSignificant(value: number, digits: number): string {
  if (!Number.isFinite(value)) return "—";
  if (value === 0) return "0";
  const magnitude = Math.floor(Math.log10(Math.abs(value)));
  const decimals = Math.min(12, Math.max(0, digits - 1 - magnitude));
  return formatNumber(value, { minDecimals: decimals, maxDecimals: decimals });
}

// Prefixes keep small readings readable: 0.0028 A is written 2.80 mA (SI brochure, decimal prefixes).
const PREFIXES = [
  { factor: 1, prefix: "" },
  { factor: 1e-3, prefix: "m" },
  { factor: 1e-6, prefix: "µ" },
] as const;

/** A value with its unit: A, V and Ω take m or µ below 1; Ah is written in mAh as the lab reads capacity; others as they are. */
export function formatMeasure(value: number, unit: string, digits = 3): string {
  if (value === 0) return `0 ${unit}`;
  if (unit === "Ah") return `${formatSignificant(value * 1000, digits)} mAh`;
  if (unit === "A" || unit === "V" || unit === "Ω") {
    const size = Math.abs(value);
    const chosen = PREFIXES.find((p) => size >= p.factor) ?? PREFIXES[2];
    const scaled = value === 0 ? 0 : value / chosen.factor;
    return `${formatSignificant(scaled, digits)} ${chosen.prefix}${unit}`;
  }
  return `${formatSignificant(value, digits)} ${unit}`;
}

/** A fraction as a percentage: 0.002694 → "0.2694 %". */
export function formatFractionPercent(fraction: number, digits = 4): string {
  return `${formatSignificant(fraction * 100, digits)} %`;
}

function formatDivisor(row: UncertaintyBudgetRow): string {
  return row.distribution === "rectangular" ? "√3" : formatSignificant(row.divisor, 3);
}

function formatSensitivity(value: number): string {
  // Exponents of a product model are small whole numbers; a pulse's ratio U1/(U1 − U2) is not.
  return Number.isInteger(value) ? `${value < 0 ? MINUS : ""}${Math.abs(value)}` : formatSignificant(value, 4);
}

const MEASURAND_WORDS: Record<string, string> = { capacity: "Capacity", energy: "Energy", "DC resistance": "DC resistance" };

/**
 * An uncertainty budget as the results page and the certificate print it: every row's stated limit,
 * half-width, divisor, standard and relative uncertainty, sensitivity and contribution, then u_c, k
 * and U, each figure with its unit (JCGM 100:2008 clause 8 lists what a budget reports).
 */
export function formatBudgetTable(budget: UncertaintyBudget): BudgetTable {
  const unit = budget.unit;
  return {
    measurand: MEASURAND_WORDS[budget.measurand] ?? budget.measurand,
    value: formatMeasure(budget.value, unit, 5),
    rows: budget.rows.map((row) => ({
      quantity: row.quantity,
      source: row.source,
      statedLimit: row.tolerance,
      halfWidth: formatMeasure(row.halfWidth, row.unit),
      distribution: row.distribution,
      divisor: formatDivisor(row),
      standardUncertainty: formatMeasure(row.standardUncertainty, row.unit),
      relativeStandardUncertainty: formatFractionPercent(row.relativeStandardUncertainty),
      sensitivity: formatSensitivity(row.sensitivity),
      contribution: formatFractionPercent(row.relativeContribution),
    })),
    combined: `${formatMeasure(budget.combinedStandardUncertainty, unit)} (${formatFractionPercent(budget.relativeCombinedStandardUncertainty)})`,
    coverageFactor: formatNumber(budget.coverageFactor, { maxDecimals: 3 }),
    expanded: `±${formatMeasure(budget.expandedUncertainty, unit)}`,
    expandedPercent: `±${formatFractionPercent(budget.relativeExpandedUncertainty, 3)}`,
  };
}
