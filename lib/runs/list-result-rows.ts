import type { RunEvaluation } from "@/lib/conformance";

/** One step's results in the units a report states them in (mAh and Ah, Wh, V, mΩ). */
export interface ResultRow {
  stepId: string;
  cycle: number;
  label: string;
  kind: string;
  durationS: number | null;
  capacityMAh: number | null;
  capacityAh: number | null;
  energyWh: number | null;
  meanVoltageV: number | null;
  endVoltageV: number | null;
  maxTemperatureC: number | null;
  resistanceMOhm: number | null;
}

export const RESULT_COLUMNS: { key: keyof ResultRow; heading: string }[] = [
  { key: "stepId", heading: "step" },
  { key: "cycle", heading: "cycle" },
  { key: "label", heading: "label" },
  { key: "kind", heading: "kind" },
  { key: "durationS", heading: "duration (s)" },
  { key: "capacityMAh", heading: "Q (mAh)" },
  { key: "capacityAh", heading: "Q (Ah)" },
  { key: "energyWh", heading: "E (Wh)" },
  { key: "meanVoltageV", heading: "mean U (V)" },
  { key: "endVoltageV", heading: "end U (V)" },
  { key: "maxTemperatureC", heading: "max T (°C)" },
  { key: "resistanceMOhm", heading: "R (mΩ)" },
];

/** The rows of the results table and of the exports: one per evaluated step of each cycle. */
export function listResultRows(evaluation: Pick<RunEvaluation, "steps">): ResultRow[] {
  return evaluation.steps.map((s) => ({
    stepId: s.stepId,
    cycle: s.cycle,
    label: s.label,
    kind: s.kind,
    durationS: s.results?.durationS ?? null,
    capacityMAh: s.results?.capacityMAh ?? null,
    capacityAh: s.results?.capacityAh ?? null,
    energyWh: s.results?.energyWh ?? null,
    meanVoltageV: s.results?.meanVoltageV ?? null,
    endVoltageV: s.results?.endVoltageV ?? null,
    maxTemperatureC: s.results?.maxTemperatureC ?? null,
    // 1 Ω = 1 000 mΩ (definition).
    resistanceMOhm: s.dcResistance ? s.dcResistance.resistanceOhm * 1000 : null,
  }));
}

function quoteCsv(cell: string): string {
  return /[",\n\r]/.test(cell) ? `"${cell.replaceAll('"', '""')}"` : cell;
}

/** RFC 4180 CSV: a header line, then one line per row; an empty cell where a step has no result. */
export function formatResultsCsv(rows: readonly ResultRow[]): string {
  const lines = [RESULT_COLUMNS.map((c) => quoteCsv(c.heading)).join(",")];
  for (const row of rows) {
    lines.push(RESULT_COLUMNS.map((c) => {
      const v = row[c.key];
      return v === null ? "" : quoteCsv(String(v));
    }).join(","));
  }
  return `${lines.join("\r\n")}\r\n`;
}
