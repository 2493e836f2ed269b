import { describe, expect, it } from "vitest";
import { generateSyntheticLog } from "@/lib/analysis";
import { evaluateRun, evaluateStepUncertainties, readCellRating, type RunEvaluation, type RunEvaluationInput, type RunInstrument } from "@/lib/conformance";
import { dcResistanceTemplate, type DecisionRule, type ProcedureResolution } from "@/protocols";
import { atLogSecond, buildRatedCapacityRun, inventedCell, logStartedAt, resolveOrThrow } from "@/scenarios/rated-capacity-run";

// Invented instruments for the tests, of the order cycler channels state (not a published source).
const channel: RunInstrument = {
  identifier: "CH-07",
  kind: "cycler-channel",
  accuracy: {
    current: { percentOfReading: 0.05, percentOfRange: 0.05, range: 5 },
    voltage: { percentOfReading: 0.02, percentOfRange: 0.02, range: 5 },
    time: { ppm: 100 },
  },
};
const thermometer: RunInstrument = { identifier: "TH-07", kind: "thermometer", accuracy: { temperature: { halfWidth: 0.5 } } };

function evaluate(input: RunEvaluationInput): RunEvaluation {
  const result = evaluateRun(input);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.evaluation;
}

function withRule(resolution: ProcedureResolution, decisionRule: DecisionRule): ProcedureResolution {
  return { ...resolution, decisionRule };
}

describe("uncertainty budgets of a rated-capacity run", () => {
  const run = buildRatedCapacityRun();
  const evaluation = evaluate({ ...run.input, instruments: [thermometer, channel] });
  const discharge = evaluation.steps.find((step) => step.stepId === "discharge")!;
  const results = discharge.results!;

  it("makes a capacity and an energy budget for each logged discharge step, in step order", () => {
    expect(evaluation.uncertainty.map((entry) => [entry.stepId, entry.cycle, entry.quantity])).toEqual([
      ["precondition", 1, "capacity"],
      ["precondition", 1, "energy"],
      ["discharge", 1, "capacity"],
      ["discharge", 1, "energy"],
    ]);
    expect(evaluation.uncertaintyNotEvaluated).toEqual([]);
  });

  it("takes the step's mean current Q/t and duration as the readings, and the channel's limits as rectangular", () => {
    const capacity = evaluation.uncertainty.find((entry) => entry.stepId === "discharge" && entry.quantity === "capacity")!.budget;
    expect(capacity).toMatchObject({ measurand: "capacity", unit: "Ah", coverageFactor: 2 });
    expect(capacity.value).toBe(results.capacityAh);
    expect(capacity.rows.map((row) => [row.quantity, row.source, row.tolerance, row.unit, row.distribution])).toEqual([
      ["current", "CH-07 current accuracy", "±(0.05 % of reading + 0.05 % of 5 A range)", "A", "rectangular"],
      ["time", "CH-07 time accuracy", "±100 ppm of the elapsed time", "s", "rectangular"],
      // Issue 12, 2: where the discharge stops, through |dQ/dV| at the end of the log (the synthetic log writes
      // full-precision values, so no resolution line).
      ["end voltage", expect.stringMatching(/^CH-07 voltage accuracy, moving where the discharge stops \(\|dQ\/dV\| = [\d.]+ Ah\/V at the end of the log\)$/), "±(0.02 % of reading + 0.02 % of 5 V range)", "V", "rectangular"],
    ]);
    const meanA = (results.capacityAh * 3600) / results.durationS;
    // a(I) = 0.05 % of Ī + 0.05 % of 5 A; u = a/√3 (GUM 4.3.7); 100 ppm of t for the time base.
    expect(capacity.rows[0]!.halfWidth).toBeCloseTo(0.0005 * meanA + 0.0025, 12);
    expect(capacity.rows[0]!.relativeStandardUncertainty).toBeCloseTo((0.0005 * meanA + 0.0025) / Math.sqrt(3) / meanA, 12);
    expect(capacity.rows[1]!.halfWidth).toBeCloseTo(1e-4 * results.durationS, 9);
    const ur = Math.hypot(capacity.rows[0]!.relativeStandardUncertainty, capacity.rows[1]!.relativeStandardUncertainty, capacity.rows[2]!.relativeContribution);
    expect(capacity.relativeExpandedUncertainty).toBeCloseTo(2 * ur, 12);
    expect(capacity.expandedUncertainty).toBeCloseTo(2 * ur * results.capacityAh, 12);

    const energy = evaluation.uncertainty.find((entry) => entry.stepId === "discharge" && entry.quantity === "energy")!.budget;
    expect(energy.value).toBe(results.energyWh);
    expect(energy.rows.map((row) => row.quantity)).toEqual(["current", "voltage", "time"]);
    expect(energy.rows[1]!.halfWidth).toBeCloseTo(0.0002 * results.meanVoltageV! + 0.001, 12);
  });

  it("judges the capacity criterion with its step's budget", () => {
    const budget = evaluation.uncertainty.find((entry) => entry.stepId === "discharge" && entry.quantity === "capacity")!.budget;
    expect(evaluation.decisionRule).toBe("simple acceptance");
    expect(evaluation.acceptance[0]).toMatchObject({
      rule: "simple acceptance",
      outcome: "conforms",
      uncertainty: { evaluated: true, quantity: "capacity", coverageFactor: 2, relativeExpanded: budget.relativeExpandedUncertainty },
    });
    expect(evaluation.acceptance[0]!.expandedUncertainty).toBeCloseTo(budget.expandedUncertainty, 12);
    expect(evaluation.acceptance[0]!.statement).toContain("is reported but not subtracted");
  });

  it("is deterministic with instruments in any order", () => {
    const reversed = evaluate({ ...run.input, instruments: [channel, thermometer] });
    expect(JSON.stringify(reversed)).toBe(JSON.stringify(evaluation));
  });
});

describe("the procedure's decision rule with the budgets", () => {
  // The invented cell model delivers about 3.015 Ah against a limit of 3.000 Ah: inside the limit, but not clear of it by U.
  const close = buildRatedCapacityRun({ cellModel: { capacityMAh: 2880 } });
  const clauseFourChannel: RunInstrument = {
    identifier: "CH-C4",
    kind: "cycler-channel",
    // IEC 61960-3 clause 4 limits (docs/references.md §3) as a channel's accuracy: ±1 % current and voltage, ±0.1 % time.
    accuracy: { current: { percentOfReading: 1, percentOfRange: 0, range: 5 }, voltage: { percentOfReading: 1, percentOfRange: 0, range: 5 }, time: { ppm: 1000 } },
  };

  it("inside the guard band: binary rule does not conform, non-binary rule conditional pass, simple acceptance conforms (ILAC-G8:09/2019 4.2)", () => {
    const measured = evaluate({ ...close.input, instruments: [clauseFourChannel] }).acceptance[0]!.measured!.value;
    expect(measured).toBeGreaterThan(3);
    // U = 1.16 % of about 3.015 Ah is 0.035 Ah (docs/references.md §6 Example A limits): the guard band covers it.
    expect(measured).toBeLessThan(3.03);
    const guarded = evaluate({ ...close.input, resolution: withRule(close.resolution, "binary guard band"), instruments: [clauseFourChannel] });
    expect(guarded.decisionRule).toBe("binary guard band");
    expect(guarded.acceptance[0]).toMatchObject({ rule: "binary guard band", outcome: "does not conform" });
    expect(guarded.acceptance[0]!.statement).toContain("binary statement with guard band w = U (ILAC-G8:09/2019 4.2.2)");
    // The repeat rule could have run another cycle: the specimen is not decided (evaluate-repeat-rule.ts).
    expect(guarded.verdict.specimenConforms).toBe("not decided");
    const fourOutcomes = evaluate({ ...close.input, resolution: withRule(close.resolution, "non-binary guard band"), instruments: [clauseFourChannel] });
    expect(fourOutcomes.acceptance[0]).toMatchObject({ rule: "non-binary guard band", outcome: "conditional pass" });
    expect(fourOutcomes.verdict.specimenConforms).toBe("conditional pass");
    // A resolution frozen under the earlier name is read as the binary rule.
    const legacy = evaluate({ ...close.input, resolution: { ...close.resolution, decisionRule: "guarded acceptance" }, instruments: [clauseFourChannel] });
    expect(legacy.decisionRule).toBe("binary guard band");
    expect(legacy.acceptance[0]).toMatchObject({ outcome: "does not conform" });
    const simple = evaluate({ ...close.input, instruments: [clauseFourChannel] });
    expect(simple.acceptance[0]).toMatchObject({ rule: "simple acceptance", outcome: "conforms" });
  });

  it("a guard-band rule conforms when the result clears the limit by U", () => {
    const clear = buildRatedCapacityRun();
    const guarded = evaluate({ ...clear.input, resolution: withRule(clear.resolution, "binary guard band"), instruments: [channel] });
    expect(guarded.acceptance[0]).toMatchObject({ rule: "binary guard band", outcome: "conforms" });
    expect(guarded.verdict.specimenConforms).toBe("conforms");
  });

  it("without a cycler channel's accuracy there is no budget; a guard-band rule is not decided, simple acceptance decides", () => {
    const guarded = evaluate({ ...close.input, resolution: withRule(close.resolution, "binary guard band"), instruments: [thermometer] });
    expect(guarded.uncertainty).toEqual([]);
    expect(guarded.uncertaintyNotEvaluated.map((entry) => [entry.stepId, entry.quantity])).toEqual([
      ["precondition", "capacity"],
      ["precondition", "energy"],
      ["discharge", "capacity"],
      ["discharge", "energy"],
    ]);
    expect(guarded.uncertaintyNotEvaluated[0]!.reason).toBe("no cycler channel is among the run's instruments, so no accuracy applies to the log's readings");
    expect(guarded.acceptance[0]).toMatchObject({ outcome: "not decided", uncertainty: { evaluated: false }, expandedUncertainty: null });
    expect(guarded.acceptance[0]!.statement).toContain("a guard band w = U needs the expanded uncertainty, and it was not evaluated");

    const simple = evaluate({ ...close.input });
    expect(simple.acceptance[0]).toMatchObject({ outcome: "conforms", uncertainty: { evaluated: false } });
    expect(simple.acceptance[0]!.statement).toContain("Measurement uncertainty not evaluated: no cycler channel");
  });

  it("a channel that states no time accuracy gives no capacity budget, and says which accuracy is missing", () => {
    const noTime: RunInstrument = { ...channel, identifier: "CH-08", accuracy: { current: channel.accuracy.current, voltage: channel.accuracy.voltage } };
    const evaluation = evaluate({ ...close.input, instruments: [noTime] });
    expect(evaluation.uncertainty).toEqual([]);
    expect(evaluation.uncertaintyNotEvaluated[0]!.reason).toBe("the cycler channel CH-08 states no time accuracy in the instrument register");
  });

  it("reads a resolution frozen before procedures named a rule as simple acceptance", () => {
    const old: Partial<ProcedureResolution> = { ...close.resolution };
    delete old.decisionRule;
    const evaluation = evaluate({ ...close.input, resolution: old as ProcedureResolution, instruments: [channel] });
    expect(evaluation.decisionRule).toBe("simple acceptance");
    expect(evaluation.acceptance[0]!.rule).toBe("simple acceptance");
  });

  it("with two cycler channels on the run keeps the wider budget, and with one of them unstated makes none", () => {
    const both = evaluate({ ...close.input, instruments: [channel, clauseFourChannel] });
    const capacity = both.uncertainty.find((entry) => entry.stepId === "discharge" && entry.quantity === "capacity")!.budget;
    expect(capacity.rows[0]!.source).toBe("CH-C4 current accuracy");
    // Current and time alone give Example A's 1.1605 % (docs/references.md §6); the end-voltage term adds to it in quadrature.
    const [current, time, end] = capacity.rows;
    expect(2 * Math.hypot(current!.relativeContribution, time!.relativeContribution) * 100).toBeCloseTo(1.1605, 3);
    expect(capacity.relativeExpandedUncertainty).toBeCloseTo(2 * Math.hypot(current!.relativeContribution, time!.relativeContribution, end!.relativeContribution), 12);
    expect(capacity.relativeExpandedUncertainty * 100).toBeGreaterThan(1.1605);
    const noTime: RunInstrument = { ...channel, identifier: "CH-08", accuracy: { current: channel.accuracy.current, voltage: channel.accuracy.voltage } };
    const oneUnstated = evaluate({ ...close.input, instruments: [channel, noTime] });
    expect(oneUnstated.uncertainty).toEqual([]);
    expect(oneUnstated.uncertaintyNotEvaluated[0]!.reason).toContain("CH-08 states no time accuracy");
  });

  it("never makes a budget for a reading outside the range the channel's accuracy is stated for (issue 13, 4)", () => {
    const small: RunInstrument = { ...channel, identifier: "CH-05", accuracy: { ...channel.accuracy, current: { percentOfReading: 0.05, percentOfRange: 0.05, range: 0.5 } } };
    const evaluation = evaluate({ ...close.input, instruments: [small] });
    const capacity = evaluation.uncertaintyNotEvaluated.find((entry) => entry.stepId === "discharge" && entry.quantity === "capacity");
    expect(capacity?.reason).toMatch(/^the current of 0\.6\d* A is outside the range of CH-05 \(0\.5 A\), for which its accuracy is stated$/);
    expect(evaluation.uncertainty.filter((entry) => entry.stepId === "discharge")).toEqual([]);
    expect(evaluation.acceptance[0]!.statement).toContain("Measurement uncertainty not evaluated: the current of 0.6");
  });

  it("refuses an instrument whose accuracy is not a specification, with its path", () => {
    const bad = { identifier: "CH-09", kind: "cycler-channel", accuracy: { current: { percentOfReading: -1, percentOfRange: 0, range: 5 } } } as RunInstrument;
    const result = evaluateRun({ ...close.input, instruments: [bad] });
    expect(result.ok).toBe(false);
    expect(result.ok || result.problems.map((problem) => problem.path)).toEqual(["instruments.0.accuracy.current.percentOfReading"]);
  });
});

describe("DC resistance budget of a pulse step", () => {
  it("treats the channel's gain as common to both readings (docs/references.md §4 pulse: u_r = 0.8165 % with ±1 % limits)", () => {
    // U1 = 3.9000 V at 0.6 A, U2 = 3.8520 V at 3.0 A (discharge negative): Rdc = 20.0 mΩ (docs/references.md §4).
    const readings = { u1V: 3.9, i1A: -0.6, u2V: 3.852, i2A: -3 };
    const onePercent: RunInstrument = {
      identifier: "CH-1P",
      kind: "cycler-channel",
      accuracy: { current: { percentOfReading: 1, percentOfRange: 0, range: 5 }, voltage: { percentOfReading: 1, percentOfRange: 0, range: 5 }, time: { ppm: 100 } },
    };
    const pulse = { stepId: "pulse", cycle: 1, kind: "pulse" as const, results: null, dcResistance: { ...readings, resistanceOhm: 0.02 } as never };
    const { budgets, notEvaluated } = evaluateStepUncertainties({ steps: [pulse], instruments: [onePercent] });
    expect(notEvaluated).toEqual([]);
    expect(budgets).toHaveLength(1);
    const budget = budgets[0]!.budget;
    expect(budgets[0]).toMatchObject({ stepId: "pulse", cycle: 1, quantity: "dc-resistance" });
    expect(budget.value).toBeCloseTo(0.02, 12);
    expect(budget.rows.map((row) => row.source)).toEqual(["voltage channel gain, common to both readings (r = 1)", "current channel gain, common to both readings (r = 1)"]);
    expect(budget.relativeCombinedStandardUncertainty * 100).toBeCloseTo(0.8165, 4);
  });

  it("evaluates a logged pulse of the DC resistance template and judges its resistance criterion with that budget", () => {
    const procedure = {
      ...dcResistanceTemplate,
      acceptance: [{ kind: "resistance" as const, id: "dc-limit", stepId: "pulse", atMost: { value: 50, unit: "mOhm" as const } }],
      decisionRule: "binary guard band" as const,
    };
    const resolution = resolveOrThrow({ procedure });
    const log = generateSyntheticLog({
      cell: { capacityMAh: 3150, seriesResistanceOhm: 0.03, initialSoc: 0.5 },
      steps: [
        { kind: "charge", currentA: 1.5, voltageV: 4.2, terminationCurrentA: 0.06 },
        { kind: "rest", durationS: 7200 },
        { kind: "pulse", baseCurrentA: 0.6, baseDurationS: 10, pulseCurrentA: 3, pulseDurationS: 1, sampleIntervalS: 0.1 },
      ],
      seed: 7,
      sampleIntervalS: 5,
      noise: { voltageV: 0.0001, currentA: 0.0001 },
    });
    if (!log.ok) throw new Error(log.error.message);
    const t = log.value.columns.timeS;
    const stepRecords = ["charge", "rest", "pulse"].map((stepId, k) => ({
      stepId,
      cycle: 1,
      startedAt: atLogSecond(t[log.value.steps[k]!.from]!),
      endedAt: atLogSecond(t[log.value.steps[k]!.to]!),
      completed: true,
    }));
    const evaluation = evaluate({ resolution, cellRating: readCellRating(inventedCell), stepRecords, log: log.value.columns, logStartedAt, instruments: [channel] });
    const pulseStep = evaluation.steps.find((step) => step.stepId === "pulse")!;
    expect(pulseStep.dcResistance?.resistanceOhm).toBeCloseTo(0.03, 2);
    const entry = evaluation.uncertainty.find((candidate) => candidate.quantity === "dc-resistance");
    expect(entry).toMatchObject({ stepId: "pulse", cycle: 1 });
    expect(entry!.budget.value).toBe(pulseStep.dcResistance!.resistanceOhm);
    expect(evaluation.acceptance[0]).toMatchObject({ rule: "binary guard band", outcome: "conforms", uncertainty: { evaluated: true, quantity: "dc-resistance" } });
    expect(evaluation.acceptance[0]!.expandedUncertainty).toBeCloseTo(entry!.budget.expandedUncertainty, 12);
  });
});
