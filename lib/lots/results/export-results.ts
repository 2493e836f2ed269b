import Papa from "papaparse";
import type { DischargeResultRow } from "@/db/discharge-results";
import { computeItA } from "@/lib/statistics";
import { RUN_STATUS_WORDS } from "@/lib/runs/run-status";
import type { CellSpecification } from "@/protocols";
import { isAboveRating } from "./summarise-results";

/** One discharge result as the exports state it, in report units. */
export interface ExportedResult {
  run: string;
  runStatus: string;
  procedure: string;
  specimen: string;
  /** Maker and model of the cell. */
  cell: string;
  lotPosition: number | null;
  step: string;
  cycle: number;
  currentA: number;
  /** currentA / It, It = rated capacity / 1 h (IEC 61434). */
  multipleOfIt: number;
  capacityMAh: number;
  energyWh: number;
  meanVoltageV: number;
  aboveRating: boolean;
  evaluationId: string;
  evaluatedAt: string;
}

export const EXPORT_COLUMNS: { key: keyof ExportedResult; heading: string }[] = [
  { key: "run", heading: "run" },
  { key: "runStatus", heading: "reviewed status" },
  { key: "procedure", heading: "procedure" },
  { key: "specimen", heading: "specimen" },
  { key: "cell", heading: "cell specification" },
  { key: "lotPosition", heading: "lot position" },
  { key: "step", heading: "step" },
  { key: "cycle", heading: "cycle" },
  { key: "currentA", heading: "current (A)" },
  { key: "multipleOfIt", heading: "current (× It)" },
  { key: "capacityMAh", heading: "capacity (mAh)" },
  { key: "energyWh", heading: "energy (Wh)" },
  { key: "meanVoltageV", heading: "mean voltage (V)" },
  { key: "aboveRating", heading: "above the rating" },
  { key: "evaluationId", heading: "evaluation" },
  { key: "evaluatedAt", heading: "evaluated at (UTC)" },
];

const round = (x: number, decimals: number) => Math.round(x * 10 ** decimals) / 10 ** decimals;

/** The rows of the exports, with the multiple of It and the above-the-rating mark worked out from the cell. */
export function listExportedResults(
  rows: readonly DischargeResultRow[],
  cell: Pick<CellSpecification, "ratedCapacityMah" | "maxContinuousDischargeCurrentA">,
): ExportedResult[] {
  const itA = computeItA(cell.ratedCapacityMah);
  return rows.map((r) => ({
    run: r.runNumber,
    runStatus: RUN_STATUS_WORDS[r.runStatus].words,
    procedure: r.procedureCode,
    specimen: r.specimenIdentifier,
    cell: r.specificationName,
    lotPosition: r.lotPosition,
    step: r.stepLabel,
    cycle: r.cycle,
    currentA: round(r.currentA, 4),
    multipleOfIt: round(r.currentA / itA, 3),
    // 1 Ah = 1 000 mAh (definition).
    capacityMAh: round(r.capacityAh * 1000, 1),
    energyWh: round(r.energyWh, 3),
    meanVoltageV: round(r.meanVoltageV, 4),
    aboveRating: isAboveRating(r, cell.maxContinuousDischargeCurrentA),
    evaluationId: r.evaluationId,
    evaluatedAt: r.evaluatedAt.toISOString(),
  }));
}

/** RFC 4180 CSV (papaparse): a header line, then one line per discharge result. */
export function formatResultsCsv(rows: readonly ExportedResult[]): string {
  return `${Papa.unparse({
    fields: EXPORT_COLUMNS.map((c) => c.heading),
    data: rows.map((r) =>
      EXPORT_COLUMNS.map(({ key }) => {
        const v = r[key];
        if (v === null) return "";
        if (typeof v === "boolean") return v ? "yes" : "no";
        return v;
      }),
    ),
  })}\r\n`;
}

/** A file name made of a record's identifier, safe in a content-disposition header. */
export function toFileName(identifier: string): string {
  return identifier.replace(/[^A-Za-z0-9._-]+/g, "_");
}
