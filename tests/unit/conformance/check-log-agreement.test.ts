import { describe, expect, it } from "vitest";
import { checkLogPhaseFound, checkUnexplainedLogPhases, type LogPhaseSummary } from "@/lib/conformance";
import { contextOf, evidenceOf, levelOf, logOf, steps } from "./context-fixtures";

const phase = (index: number, kind: LogPhaseSummary["kind"]): LogPhaseSummary => ({ index, kind, from: index * 10, to: index * 10 + 9, startS: index * 10, endS: index * 10 + 9 });

describe("checkLogPhaseFound", () => {
  it("meets for a matched phase, deviates for a missing one, and cannot judge without a log", () => {
    expect(checkLogPhaseFound(contextOf({ step: steps.rest, evidence: evidenceOf(logOf(levelOf(10, 4.1, 0))) }))[0]).toMatchObject({
      rule: "log-phase-found",
      outcome: "meets",
    });
    expect(checkLogPhaseFound(contextOf({ step: steps.rest, evidence: { kind: "not found", reason: "not there" } }))[0]?.outcome).toBe("deviates");
    expect(checkLogPhaseFound(contextOf({ step: steps.rest }))[0]?.outcome).toBe("not assessable");
  });

  it("does not look for soak and measure steps, which may leave no trace in the current", () => {
    expect(checkLogPhaseFound(contextOf({ step: steps.soak }))).toEqual([]);
    expect(checkLogPhaseFound(contextOf({ step: steps.measure }))).toEqual([]);
  });
});

describe("checkUnexplainedLogPhases", () => {
  it("deviates for a charge or discharge no step accounts for, but not for a left-over rest", () => {
    const phases = [phase(0, "rest"), phase(1, "discharge"), phase(2, "charge"), phase(3, "rest"), phase(4, "discharge")];
    const extraDischarge = checkUnexplainedLogPhases({ status: "analysed", samples: 50, phases, extraPhaseIndexes: [0, 1] }, null);
    expect(extraDischarge).toMatchObject({ id: "run/no-unexplained-log-phase", outcome: "deviates", stepId: null });
    expect(extraDischarge.observed.text).toBe("left over: discharge phase 2 at 10 s");
    expect(checkUnexplainedLogPhases({ status: "analysed", samples: 50, phases, extraPhaseIndexes: [0, 3] }, null).outcome).toBe("meets");
    expect(checkUnexplainedLogPhases({ status: "no log", reason: "no data log was uploaded" }, null).outcome).toBe("not assessable");
  });
});
