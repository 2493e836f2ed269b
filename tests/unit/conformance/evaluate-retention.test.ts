import { describe, expect, it } from "vitest";
import { computeStepResults, generateSyntheticLog, type Phase, type SyntheticStep } from "@/lib/analysis";
import { evaluateChargeRetention, evaluateRun, type RetentionStepInput } from "@/lib/conformance";
import { chargeRetentionTemplate, validateProcedure, type Procedure } from "@/protocols";
import { buildRatedCapacityRun, inventedCell, resolveOrThrow } from "@/scenarios/rated-capacity-run";

// The invented 3 000 mAh cell (scenarios/rated-capacity-run.ts) at 0.2 It = 0.6 A. The model cell has no
// self-discharge, so the loss in storage is made by construction: the discharge after storage is stopped
// after a set time, as a cell that lost charge would stop early. With no noise and no jitter each capacity
// is I × t exactly (trapezoid of a constant current): 0.6 A × 5.1 h = 3.060 Ah, 0.6 A × 4.25 h = 2.550 Ah,
// 0.6 A × 4.8 h = 2.880 Ah.
const currentA = 0.6;
const hours = { beforeStorage: 5.1, afterStorage: 4.25, recovery: 4.8 };
const charge: SyntheticStep = { kind: "charge", currentA: 1.5, voltageV: 4.2, terminationCurrentA: 0.06 };
const discharge = (h: number): SyntheticStep => ({ kind: "discharge", currentA, endVoltageV: 2.5, maxDurationS: h * 3600 });

/** The log of the procedure's steps (storage shortened: the model holds its charge), as evaluated steps. */
function runSyntheticLog(ids: readonly string[], steps: readonly SyntheticStep[]): RetentionStepInput[] {
  const log = generateSyntheticLog({
    cell: { capacityMAh: 3400, seriesResistanceOhm: 0.03, initialSoc: 1 },
    steps,
    seed: 7,
    sampleIntervalS: 5,
    samplingJitter: 0,
    noise: { voltageV: 0, currentA: 0, temperatureC: 0 },
  });
  if (!log.ok) throw new Error(log.error.message);
  return log.value.steps.map((span, k) => {
    // Only the discharges' capacities are read; the other steps are integrated as spans without a CC part.
    const phase: Phase =
      span.kind === "discharge"
        ? { kind: "discharge", from: span.from, to: span.to, startS: 0, endS: 0, pulse: null }
        : { kind: "rest", from: span.from, to: span.to, startS: 0, endS: 0 };
    const results = computeStepResults(log.value.columns, phase);
    if (!results.ok) throw new Error(results.error.message);
    return { stepId: ids[k] as string, cycle: 1, label: ids[k] as string, results: results.value };
  });
}

const templateIds = ["discharge", "recovery-charge", "recovery-rest", "recovery-discharge"];
const templateSteps = [discharge(hours.afterStorage), charge, { kind: "rest", durationS: 3600 } as const, discharge(hours.recovery)];

describe("charge retention and recovery (IEC 61960-3 7.4, recalled) against a synthetic log", () => {
  it("states both percentages of the rated capacity: 2.550 / 3.000 = 85.0 %, 2.880 / 3.000 = 96.0 %", () => {
    const resolution = resolveOrThrow({ procedure: chargeRetentionTemplate });
    expect(resolution.retention).toEqual({
      afterStorageStepId: "discharge",
      recoveryStepId: "recovery-discharge",
      basis: { kind: "rated capacity", capacityAh: inventedCell.ratedCapacityMah / 1000 },
    });
    const result = evaluateChargeRetention(resolution.retention!, runSyntheticLog(templateIds, templateSteps));
    expect(result.retention.capacityAh).toBeCloseTo(2.55, 9);
    expect(result.recovery.capacityAh).toBeCloseTo(2.88, 9);
    expect(result.retention.percent).toBeCloseTo(85, 7);
    expect(result.recovery.percent).toBeCloseTo(96, 7);
    expect(result.retention.statement).toBe("85.0 % of the rated capacity (2 550 mAh of 3 000 mAh)");
    expect(result.recovery.statement).toBe("96.0 % of the rated capacity (2 880 mAh of 3 000 mAh)");
  });

  it("states both percentages of the capacity measured before storage: 2.550 / 3.060 = 83.3 %, 2.880 / 3.060 = 94.1 %", () => {
    const procedure: Procedure = {
      ...chargeRetentionTemplate,
      steps: [
        ...chargeRetentionTemplate.steps.slice(0, 2),
        { kind: "discharge", id: "before-storage", label: "Discharge before storage", purpose: "measure", current: { multipleOfIt: 0.2 }, endVoltage: { spec: "endOfDischargeVoltage" } },
        { kind: "charge", id: "storage-charge", label: "Charge for storage", current: { spec: "standardChargeCurrent" }, voltage: { spec: "chargeVoltage" }, termination: { kind: "current", current: { spec: "chargeTerminationCurrent" } } },
        ...chargeRetentionTemplate.steps.slice(2),
      ],
      retention: { afterStorageStepId: "discharge", recoveryStepId: "recovery-discharge", basis: "capacity before storage", beforeStorageStepId: "before-storage" },
    };
    expect(validateProcedure(procedure).ok).toBe(true);
    const resolution = resolveOrThrow({ procedure });
    const steps = runSyntheticLog(["before-storage", "storage-charge", ...templateIds], [discharge(hours.beforeStorage), charge, ...templateSteps]);
    const result = evaluateChargeRetention(resolution.retention!, steps);
    expect(result.basis.capacityAh).toBeCloseTo(3.06, 9);
    // 2.55 / 3.06 = 0.833333…; 2.88 / 3.06 = 0.941176…
    expect(result.retention.percent).toBeCloseTo(83.3333333, 6);
    expect(result.recovery.percent).toBeCloseTo(94.1176471, 6);
    expect(result.retention.statement).toBe('83.3 % of the capacity measured before storage ("before-storage") (2 550 mAh of 3 060 mAh)');
  });

  it("says why a percentage is missing instead of inventing one", () => {
    const resolution = resolveOrThrow({ procedure: chargeRetentionTemplate });
    const steps = runSyntheticLog(templateIds, templateSteps).map((step) => (step.stepId === "recovery-discharge" ? { ...step, results: null } : step));
    const result = evaluateChargeRetention(resolution.retention!, steps);
    expect(result.retention.percent).toBeCloseTo(85, 7);
    expect(result.recovery).toMatchObject({ percent: null, statement: 'Not computed: the data log gave no capacity for "recovery-discharge".' });
  });

  it("refuses a retention that names a step that is not a measured discharge, or a basis before storage without its step", () => {
    const named = validateProcedure({ ...chargeRetentionTemplate, retention: { afterStorageStepId: "storage", recoveryStepId: "recovery-discharge", basis: "rated capacity" } });
    expect(named.ok || named.problems.map((problem) => problem.message)).toEqual(['the discharge after storage must be a measured discharge; "storage" is not']);
    const basis = validateProcedure({ ...chargeRetentionTemplate, retention: { afterStorageStepId: "discharge", recoveryStepId: "recovery-discharge", basis: "capacity before storage" } });
    expect(basis.ok || basis.problems.map((problem) => problem.message)).toEqual(["name the discharge before storage whose capacity is the basis"]);
    const order = validateProcedure({ ...chargeRetentionTemplate, retention: { afterStorageStepId: "recovery-discharge", recoveryStepId: "discharge", basis: "rated capacity" } });
    expect(order.ok || order.problems.map((problem) => problem.message)).toEqual(["the recovery discharge must come after the discharge named before it"]);
  });

  it("is part of the run evaluation when the resolution asks for it, named with the procedure's clause", () => {
    // A rated-capacity run whose two discharges stand in for the ones after storage and after recharging.
    const resolution = {
      ...resolveOrThrow({}),
      retention: { afterStorageStepId: "precondition", recoveryStepId: "discharge", basis: { kind: "rated capacity" as const, capacityAh: 3 } },
    };
    const { input } = buildRatedCapacityRun({ resolution });
    const evaluated = evaluateRun(input);
    if (!evaluated.ok) throw new Error(JSON.stringify(evaluated.problems));
    const { retention, steps } = evaluated.evaluation;
    const capacityOf = (id: string) => steps.find((s) => s.stepId === id)!.results!.capacityAh;
    expect(retention?.retention.percent).toBeCloseTo((capacityOf("precondition") / 3) * 100, 12);
    expect(retention?.recovery.percent).toBeCloseTo((capacityOf("discharge") / 3) * 100, 12);
    expect(retention?.citation).toBe("IEC 61960-3:2017 7.2, 7.3.1");
    const plain = evaluateRun(buildRatedCapacityRun().input);
    expect(plain.ok && "retention" in plain.evaluation).toBe(false);
  });
});
