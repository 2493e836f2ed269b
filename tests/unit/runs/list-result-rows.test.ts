import { describe, expect, it } from "vitest";
import { evaluateRun } from "@/lib/conformance";
import { formatResultsCsv, listResultRows, RESULT_COLUMNS } from "@/lib/runs/list-result-rows";
import { buildRatedCapacityRun } from "@/scenarios/rated-capacity-run";

describe("results export", () => {
  const built = buildRatedCapacityRun({ sampleIntervalS: 10 });
  const result = evaluateRun(built.input);
  if (!result.ok) throw new Error("the built run should evaluate");
  const rows = listResultRows(result.evaluation);

  it("gives one row per evaluated step, Q in both mAh and Ah", () => {
    expect(rows).toHaveLength(result.evaluation.steps.length);
    const discharge = rows.find((r) => r.stepId === "discharge");
    expect(discharge?.capacityAh).toBeGreaterThan(0);
    expect(discharge?.capacityMAh).toBeCloseTo((discharge?.capacityAh ?? 0) * 1000, 6);
  });

  it("writes a header and one CSV line per row, empty cells for missing results", () => {
    const csv = formatResultsCsv([
      { stepId: "rest", cycle: 1, label: 'Rest, "settle"', kind: "rest", durationS: 3600, capacityMAh: null, capacityAh: null, energyWh: null, meanVoltageV: 3.6, endVoltageV: 3.6, maxTemperatureC: null, resistanceMOhm: 42.5 },
    ]);
    const lines = csv.split("\r\n");
    expect(lines[0]).toBe(RESULT_COLUMNS.map((c) => c.heading).join(","));
    expect(lines[1]).toBe('rest,1,"Rest, ""settle""",rest,3600,,,,3.6,3.6,,42.5');
    expect(lines[2]).toBe("");
  });
});
