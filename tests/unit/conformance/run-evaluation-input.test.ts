import { describe, expect, it } from "vitest";
import { checkRunEvaluationInput, readCellRating, stepRecordSchema, storedRunEvaluationSchema } from "@/lib/conformance";
import { inventedCell, resolveOrThrow } from "@/scenarios/rated-capacity-run";

describe("stepRecordSchema", () => {
  it("fills in defaults and keeps SI set-points", () => {
    const record = stepRecordSchema.parse({ stepId: "rest", completed: true, programmed: { duration: 3600 } });
    expect(record).toEqual({ stepId: "rest", cycle: 1, completed: true, programmed: { duration: 3600 }, ambientReadings: [], acknowledgedCautionCodes: [] });
  });

  it("refuses times without a zone, which would read differently on each machine", () => {
    const result = stepRecordSchema.safeParse({ stepId: "rest", completed: true, startedAt: "2026-03-02T08:00:00" });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.path).toEqual(["startedAt"]);
    expect(stepRecordSchema.safeParse({ stepId: "rest", completed: true, startedAt: "2026-03-02T09:00:00+01:00" }).success).toBe(true);
  });

  it("refuses unknown fields, non-positive set-points and cycle 0", () => {
    expect(stepRecordSchema.safeParse({ stepId: "rest", completed: true, programmed: { currentA: 1 } }).success).toBe(false);
    expect(stepRecordSchema.safeParse({ stepId: "rest", completed: true, programmed: { current: 0 } }).success).toBe(false);
    expect(stepRecordSchema.safeParse({ stepId: "rest", completed: true, cycle: 0 }).success).toBe(false);
  });

  it("survives a JSON round trip as stored", () => {
    const stored = storedRunEvaluationSchema.parse({
      cellRating: readCellRating(inventedCell),
      stepRecords: [{ stepId: "rest", completed: true, ambientReadings: [{ at: "2026-03-02T08:00:00Z", celsius: 22.5 }] }],
    });
    expect(storedRunEvaluationSchema.parse(JSON.parse(JSON.stringify(stored)))).toEqual(stored);
    expect(stored.options).toEqual({ gapAllowanceS: 600, timeAgreementS: 300, currentExcursionAllowanceS: 10, chargeVoltageReadingAllowanceV: 0.005 });
  });
});

describe("checkRunEvaluationInput", () => {
  it("names the field path of each problem instead of throwing", () => {
    const result = checkRunEvaluationInput({
      resolution: resolveOrThrow({}),
      cellRating: { maxContinuousDischargeCurrentA: -1, chargeVoltageV: 4.2 },
      stepRecords: [{ stepId: "rest", completed: true }, { stepId: "bad id!", completed: "yes" } as never],
    });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.problems.map((problem) => problem.path)).toEqual(["cellRating.maxContinuousDischargeCurrentA", "stepRecords.1.stepId", "stepRecords.1.completed"]);
  });

  it("refuses a resolution that is not one", () => {
    const result = checkRunEvaluationInput({ resolution: {} as never, cellRating: readCellRating(inventedCell), stepRecords: [] });
    expect(result.ok || result.problems[0]?.path).toBe("resolution");
  });
});
