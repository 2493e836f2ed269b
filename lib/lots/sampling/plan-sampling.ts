import { formatNumber } from "@/protocols/format-number";
import {
  codeLetters,
  inspectionLevels,
  offeredAqlColumns,
  standardAqlsNotOffered,
  table1LotSizeRanges,
  table2aNormal,
  table2aSampleSizes,
  type AqlColumn,
  type CodeLetter,
  type InspectionLevel,
  type LotSizeRange,
} from "./iso2859-tables";
import { refuse, type SamplingInputError } from "./sampling-error";

export const inspectionSeverities = ["normal", "tightened", "reduced"] as const;
export type InspectionSeverity = (typeof inspectionSeverities)[number];

export interface SamplingPlanInput {
  lotSize: number;
  inspectionLevel: InspectionLevel;
  /** Acceptance quality limit in percent nonconforming, one of the table's columns (0.65, 1.0, …). */
  aql: number;
  severity: InspectionSeverity;
}

export interface SamplingPlan {
  lotSize: number;
  inspectionLevel: InspectionLevel;
  aql: number;
  /** The AQL as the table heads its column, e.g. "0.010", "1.0". */
  aqlLabel: string;
  severity: "normal";
  /** The letter Table 1 gives for the lot size and inspection level. */
  initialCodeLetter: CodeLetter;
  /** The letter whose plan is used, after following an arrow of Table 2-A. */
  codeLetter: CodeLetter;
  arrow: "none" | "down" | "up";
  /** n of `codeLetter` in Table 2-A. */
  tableSampleSize: number;
  /** Specimens to inspect: n, or the whole lot when n reaches the lot size. */
  sampleSize: number;
  acceptanceNumber: number;
  rejectionNumber: number;
  hundredPercent: boolean;
  /** Each step in words, for the lot page and the certificate. */
  explanation: string[];
  source: string;
}

export type SamplingPlanResult = { ok: true; plan: SamplingPlan } | { ok: false; error: SamplingInputError };

export const samplingPlanSource = "ISO 2859-1:1999, Table 1 and Table 2-A (single sampling, normal inspection)";

function findAqlColumn(aql: number): AqlColumn | undefined {
  return offeredAqlColumns.find((column) => Math.abs(column.value - aql) <= 1e-9 * column.value);
}

function findLotSizeRange(lotSize: number): LotSizeRange {
  // A lot of 1 is below Table 1's first range (2 to 8); it is read there, and every plan then covers it whole.
  const range = table1LotSizeRanges.find((r) => lotSize <= (r.to ?? Infinity));
  if (!range) throw new Error(`Table 1 has no range for a lot of ${lotSize}`);
  return range;
}

function checkInput(input: SamplingPlanInput): SamplingInputError | null {
  const { lotSize, inspectionLevel, aql, severity } = input;
  if (!Number.isInteger(lotSize) || lotSize < 1) {
    return { field: "lotSize", message: `The lot size must be a whole number of specimens, at least 1 (got ${String(lotSize)}).` };
  }
  if (!inspectionLevels.includes(inspectionLevel)) {
    return { field: "inspectionLevel", message: `The inspection level is one of ${inspectionLevels.join(", ")} (got ${String(inspectionLevel)}).` };
  }
  if (!inspectionSeverities.includes(severity)) {
    return { field: "severity", message: `The inspection severity is normal, tightened or reduced (got ${String(severity)}).` };
  }
  if (severity !== "normal") {
    return {
      field: "severity",
      message: `${severity[0]?.toUpperCase()}${severity.slice(1)} inspection is not offered yet: plans start at normal inspection (Table 2-A), and the switching rules that lead to ${severity} inspection are not implemented.`,
    };
  }
  if (!Number.isFinite(aql) || findAqlColumn(aql) === undefined) {
    const offered = offeredAqlColumns.map((c) => c.label).join(", ");
    const isStandardButNotOffered = standardAqlsNotOffered.some((value) => Math.abs(value - aql) <= 1e-9 * value);
    return {
      field: "aql",
      message: isStandardButNotOffered
        ? `AQL ${String(aql)} is a column of Table 2-A for nonconformities per hundred items, which Cellwright does not offer; choose one of ${offered}.`
        : `AQL ${String(aql)} is not a column of Table 2-A; choose one of ${offered}.`,
    };
  }
  return null;
}

interface ResolvedCell {
  codeLetter: CodeLetter;
  arrow: SamplingPlan["arrow"];
  passed: CodeLetter[];
  acceptanceNumber: number;
  rejectionNumber: number;
}

/** Follows the arrows of Table 2-A in one column: "use the first sampling plan below (or above) the arrow". */
export function resolveTable2aCell(initial: CodeLetter, columnIndex: number): ResolvedCell {
  let row = codeLetters.indexOf(initial);
  let arrow: SamplingPlan["arrow"] = "none";
  const passed: CodeLetter[] = [];
  for (;;) {
    const letter = codeLetters[row];
    const cell = letter === undefined ? undefined : table2aNormal[letter][columnIndex];
    if (letter === undefined || cell === undefined) throw new Error(`Table 2-A has no cell at row ${row}, column ${columnIndex}`);
    if (typeof cell !== "string") {
      return { codeLetter: letter, arrow, passed, acceptanceNumber: cell[0], rejectionNumber: cell[1] };
    }
    if (arrow !== "none" && arrow !== cell) throw new Error(`Table 2-A arrows change direction at ${letter}, column ${columnIndex}`);
    if (arrow !== "none") passed.push(letter);
    arrow = cell;
    row += cell === "down" ? 1 : -1;
  }
}

function describeArrow(column: AqlColumn, initial: CodeLetter, resolved: ResolvedCell, n: number): string {
  const plan = `n = ${formatNumber(n)}, Ac ${resolved.acceptanceNumber}, Re ${resolved.rejectionNumber} (Table 2-A)`;
  if (resolved.arrow === "none") return `AQL ${column.label} at ${initial} → ${plan}`;
  const passing = resolved.passed.length > 0 ? ` past ${resolved.passed.join(", ")}` : "";
  return `AQL ${column.label} at ${initial}: arrow ${resolved.arrow}${passing} → ${resolved.codeLetter}, ${plan}`;
}

/**
 * The single sampling plan of ISO 2859-1 for a lot: Table 1 gives the code letter, Table 2-A the
 * sample size and the acceptance and rejection numbers, following an arrow to the first plan below
 * or above it; when n reaches the lot size, every specimen is inspected.
 */
export function planSampling(input: SamplingPlanInput): SamplingPlanResult {
  const problem = checkInput(input);
  if (problem) return refuse(problem.field, problem.message);
  const { lotSize, inspectionLevel, aql } = input;
  const column = findAqlColumn(aql) as AqlColumn;
  const range = findLotSizeRange(lotSize);
  const initialCodeLetter = range.codeLetters[inspectionLevel];
  const resolved = resolveTable2aCell(initialCodeLetter, offeredAqlColumns.indexOf(column));
  const tableSampleSize = table2aSampleSizes[resolved.codeLetter];
  const hundredPercent = tableSampleSize >= lotSize;
  const lotWords = `lot of ${formatNumber(lotSize)}`;
  const explanation = [
    lotSize < range.from
      ? `${lotWords} is below Table 1's first range (${range.from} to ${range.to}), read there at level ${inspectionLevel} → code letter ${initialCodeLetter} (Table 1)`
      : `${lotWords} at level ${inspectionLevel} → code letter ${initialCodeLetter} (Table 1)`,
    describeArrow(column, initialCodeLetter, resolved, tableSampleSize),
  ];
  if (hundredPercent) explanation.push(`n ≥ lot size → ${lotSize === 1 ? "inspect the one specimen" : `inspect all ${formatNumber(lotSize)}`}`);
  return {
    ok: true,
    plan: {
      lotSize,
      inspectionLevel,
      aql: column.value,
      aqlLabel: column.label,
      severity: "normal",
      initialCodeLetter,
      codeLetter: resolved.codeLetter,
      arrow: resolved.arrow,
      tableSampleSize,
      sampleSize: hundredPercent ? lotSize : tableSampleSize,
      acceptanceNumber: resolved.acceptanceNumber,
      rejectionNumber: resolved.rejectionNumber,
      hundredPercent,
      explanation,
      source: samplingPlanSource,
    },
  };
}
