import { formatNumber } from "@/protocols/format-number";
import { describeResults } from "@/lib/statistics/describe-results";
import { defaultCurrentTolerance } from "@/lib/statistics/group-by-current";
import { fail, succeed, type AnalysisResult } from "./analysis-result";

/** The datasheet values of a cell specification that the measurements can answer. */
export interface DatasheetClaims {
  ratedCapacityMah: number;
  minimumCapacityMah?: number;
  nominalVoltageV: number;
  /** The datasheet's energy, when it states one; otherwise rated capacity × nominal voltage is used. */
  nominalEnergyWh?: number;
  maxMassG?: number;
  maxContinuousDischargeCurrentA: number;
}

/** What was measured on the specimens of the cell specification. */
export interface DatasheetMeasurements {
  /** Capacity of the 0.2 It discharge, one result per specimen, mAh. */
  capacityMah: readonly number[];
  /** Energy of the 0.2 It discharge, one result per specimen, Wh. */
  energyWh: readonly number[];
  massG: readonly number[];
  /** Currents of the completed discharges at any rate, A. */
  dischargeCurrentsA: readonly number[];
}

export type ClaimKey = "ratedCapacity" | "minimumCapacity" | "nominalEnergy" | "maxMass" | "maxContinuousDischargeCurrent";
export type ClaimVerdict = "meets the claim" | "below the claim" | "above the claim" | "not measured";

export interface MeasuredSummary {
  count: number;
  unit: string;
  mean: number;
  /** Sample standard deviation; null for a single result. */
  standardDeviation: number | null;
  min: number;
  max: number;
  /** e.g. "12 results: mean 3 061 mAh, s 12 mAh, 3 040 mAh to 3 080 mAh". */
  text: string;
}

export interface ClaimLine {
  key: ClaimKey;
  /** The claim in words, e.g. "rated capacity". */
  claim: string;
  claimed: { value: number; unit: string; text: string };
  /** "derived" when Cellwright computed the claim from other datasheet values. */
  claimOrigin: "datasheet" | "derived";
  claimNote: string | null;
  measured: MeasuredSummary | null;
  verdict: ClaimVerdict;
  /** Why this verdict, in plain words. */
  basis: string;
}

export interface DatasheetComparison {
  lines: ClaimLine[];
  decisionRule: string;
}

export interface CompareWithDatasheetInput {
  claims: DatasheetClaims;
  measured: DatasheetMeasurements;
  relativeTolerance?: number;
}

const decimalsByUnit: Record<string, number> = { mAh: 0, Wh: 2, g: 1, A: 2 };

function formatValue(value: number, unit: string): string {
  const decimals = decimalsByUnit[unit] ?? 3;
  return `${formatNumber(value, { minDecimals: decimals, maxDecimals: decimals })} ${unit}`;
}

function summarise(values: readonly number[], unit: string): MeasuredSummary | null {
  if (values.length === 0) return null;
  if (values.length === 1) {
    const only = values[0] as number;
    return { count: 1, unit, mean: only, standardDeviation: null, min: only, max: only, text: `1 result: ${formatValue(only, unit)}` };
  }
  const described = describeResults({ values, unit });
  if (!described.ok) return null;
  const { count, mean, standardDeviation, min, max } = described.value;
  const text = `${count} results: mean ${formatValue(mean, unit)}, s ${formatValue(standardDeviation, unit)}, ${formatValue(min, unit)} to ${formatValue(max, unit)}`;
  return { count, unit, mean, standardDeviation, min, max, text };
}

interface LimitClaim {
  key: ClaimKey;
  claim: string;
  value: number;
  unit: string;
  side: "at least" | "at most";
  values: readonly number[];
  claimOrigin?: ClaimLine["claimOrigin"];
  claimNote?: string | null;
}

/** A claim every cell must meet: each result is compared with it (simple acceptance, no guard band). */
function compareLimit(c: LimitClaim): ClaimLine {
  const claimedText = formatValue(c.value, c.unit);
  const head = {
    key: c.key,
    claim: c.claim,
    claimed: { value: c.value, unit: c.unit, text: claimedText },
    claimOrigin: c.claimOrigin ?? "datasheet",
    claimNote: c.claimNote ?? null,
    measured: summarise(c.values, c.unit),
  };
  if (c.values.length === 0) return { ...head, verdict: "not measured", basis: `No ${c.claim === "maximum mass" ? "mass" : "0.2 It result"} on record.` };
  const isAtMost = c.side === "at most";
  const outside = c.values.filter((x) => (isAtMost ? x > c.value : x < c.value)).length;
  const where = isAtMost ? "above" : "below";
  if (outside === 0) {
    return { ...head, verdict: "meets the claim", basis: `All ${c.values.length} results ${c.side} ${claimedText}.` };
  }
  return {
    ...head,
    verdict: isAtMost ? "above the claim" : "below the claim",
    basis: `${outside} of ${c.values.length} results ${where} ${claimedText}; the claim holds for every cell.`,
  };
}

/** Discharges within the tolerance of the claimed current answer the claim; higher ones are outside the rating and do not. */
function compareCurrent(claims: DatasheetClaims, currents: readonly number[], tolerance: number): ClaimLine {
  const claimed = claims.maxContinuousDischargeCurrentA;
  const claimedText = formatValue(claimed, "A");
  const atClaim = currents.filter((a) => Math.abs(a - claimed) <= tolerance * claimed);
  const head = {
    key: "maxContinuousDischargeCurrent" as const,
    claim: "maximum continuous discharge current",
    claimed: { value: claimed, unit: "A", text: claimedText },
    claimOrigin: "datasheet" as const,
    claimNote: null,
    measured: summarise(atClaim, "A"),
  };
  const percent = formatNumber(tolerance * 100, { maxDecimals: 1 });
  if (atClaim.length === 0) {
    const highest = currents.length === 0 ? "no discharge on record" : `highest current discharged: ${formatValue(Math.max(...currents), "A")}`;
    const above = currents.some((a) => a > claimed * (1 + tolerance)) ? "; discharges above the claim are outside the rating and do not answer it" : "";
    return { ...head, verdict: "not measured", basis: `No discharge at ${claimedText} (within ${percent} %); ${highest}${above}.` };
  }
  return {
    ...head,
    verdict: "meets the claim",
    basis: `${atClaim.length} discharge${atClaim.length === 1 ? "" : "s"} completed at ${claimedText} (within ${percent} %). The datasheet claims no capacity at this current, so the line records that the current was sustained.`,
  };
}

function checkInput({ claims, measured, relativeTolerance }: CompareWithDatasheetInput): string | null {
  const required = [claims.ratedCapacityMah, claims.nominalVoltageV, claims.maxContinuousDischargeCurrentA];
  const optional = [claims.minimumCapacityMah, claims.nominalEnergyWh, claims.maxMassG].filter((x) => x !== undefined);
  if (![...required, ...optional].every((x) => Number.isFinite(x) && x > 0)) return "Every datasheet value must be a number greater than 0.";
  const all = [...measured.capacityMah, ...measured.energyWh, ...measured.massG, ...measured.dischargeCurrentsA];
  if (!all.every((x) => Number.isFinite(x) && x >= 0)) return "Every measured value must be a number of 0 or more.";
  if (relativeTolerance !== undefined && !(relativeTolerance >= 0 && relativeTolerance < 0.5)) return "The current tolerance must be a fraction from 0 to below 0.5.";
  return null;
}

/**
 * Each datasheet claim beside the measured distribution, with a verdict in words: rated and minimum
 * capacity and energy (at 0.2 It), maximum mass, maximum continuous discharge current.
 */
export function compareWithDatasheet(input: CompareWithDatasheetInput): AnalysisResult<DatasheetComparison> {
  const problem = checkInput(input);
  if (problem) return fail("invalid-input", problem);
  const { claims, measured, relativeTolerance = defaultCurrentTolerance } = input;
  const lines: ClaimLine[] = [
    compareLimit({ key: "ratedCapacity", claim: "rated capacity", value: claims.ratedCapacityMah, unit: "mAh", side: "at least", values: measured.capacityMah }),
  ];
  if (claims.minimumCapacityMah !== undefined) {
    lines.push(compareLimit({ key: "minimumCapacity", claim: "minimum capacity", value: claims.minimumCapacityMah, unit: "mAh", side: "at least", values: measured.capacityMah }));
  }
  const derivedEnergyWh = (claims.ratedCapacityMah / 1000) * claims.nominalVoltageV;
  lines.push(
    compareLimit({
      key: "nominalEnergy",
      claim: "energy",
      value: claims.nominalEnergyWh ?? derivedEnergyWh,
      unit: "Wh",
      side: "at least",
      values: measured.energyWh,
      claimOrigin: claims.nominalEnergyWh === undefined ? "derived" : "datasheet",
      claimNote:
        claims.nominalEnergyWh === undefined
          ? `The datasheet states no energy: rated capacity × nominal voltage = ${formatValue(claims.ratedCapacityMah, "mAh")} × ${formatNumber(claims.nominalVoltageV, { minDecimals: 2 })} V = ${formatValue(derivedEnergyWh, "Wh")}.`
          : null,
    }),
  );
  if (claims.maxMassG !== undefined) {
    lines.push(compareLimit({ key: "maxMass", claim: "maximum mass", value: claims.maxMassG, unit: "g", side: "at most", values: measured.massG }));
  }
  lines.push(compareCurrent(claims, measured.dischargeCurrentsA, relativeTolerance));
  return succeed({
    lines,
    decisionRule:
      "Each result is compared with the claim by simple acceptance, without a guard band: a claim of at least a value is met when every result is at or above it, a maximum when every result is at or below it. Capacity and energy are the 0.2 It results.",
  });
}
