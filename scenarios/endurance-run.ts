// An invented endurance run: the TPL-END400 template on the invented 3 000 mAh cell, with a synthetic
// cycler log of some tens of cycles whose capacity fades cycle by cycle. Shared by the seed and the tests.
import type { LogColumns } from "@/lib/analysis";
import { readCellRating, type RunEvaluationInput, type StepRecordInput } from "@/lib/conformance";
import { enduranceInCyclesTemplate, type Procedure, type ProcedureResolution } from "@/protocols";
import { inventedCell } from "./invented-cells";
import { atLogSecond, logStartedAt, resolveOrThrow } from "./rated-capacity-run";

export interface EnduranceLogOptions {
  /** Cycles in the log. */
  cycles: number;
  /** Discharge capacity of cycle 1 at the cycle current, mAh. */
  firstCapacityMah?: number;
  /** Capacity lost per cycle, mAh (linear fade). */
  fadeMahPerCycle?: number;
  /** Every this many cycles the discharge runs at the check current (as the block asks). */
  checkEveryCycles?: number;
  /** A capacity check delivers this much more than a cycle at the higher current, mAh. */
  checkBonusMah?: number;
  chargeCurrentA?: number;
  terminationCurrentA?: number;
  dischargeCurrentA?: number;
  checkCurrentA?: number;
  chargeVoltageV?: number;
  endVoltageV?: number;
  restS?: number;
  sampleIntervalS?: number;
  /** Seconds of rest logged before the first cycle (after the precondition discharge, when there is one). */
  leadInS?: number;
  /** A precondition discharge at the start of the log, at this current for this long, A and s. */
  precondition?: { currentA: number; durationS: number };
}

/** What the generator put into the log: each cycle's discharge capacity, the truth the evaluation must find. */
export interface EnduranceLog {
  columns: LogColumns;
  dischargeMah: number[];
  /** Seconds of the first and last sample of the cycles. */
  startS: number;
  endS: number;
  /** Seconds of the last sample of the precondition discharge, when there is one. */
  preconditionEndS: number | null;
}

/**
 * A cycler log of CC-CV charges, rests and constant-current discharges whose capacity fades linearly.
 * The shapes are simple (voltage straight lines, an exponential CV tail), enough for the segmentation
 * to find each phase; the discharge runs exactly Q / I, so its capacity is known to the sample.
 */
export function generateEnduranceLog(options: EnduranceLogOptions): EnduranceLog {
  const o = {
    firstCapacityMah: 2950,
    fadeMahPerCycle: 12,
    checkEveryCycles: 0,
    checkBonusMah: 60,
    chargeCurrentA: 1.5,
    terminationCurrentA: 0.06,
    dischargeCurrentA: 1.5,
    checkCurrentA: 0.6,
    chargeVoltageV: 4.2,
    endVoltageV: 2.5,
    restS: 1800,
    sampleIntervalS: 60,
    leadInS: 600,
    ...options,
  };
  const time: number[] = [];
  const current: number[] = [];
  const voltage: number[] = [];
  let t = 0;
  const push = (currentA: number, voltageV: number) => {
    time.push(t);
    current.push(currentA);
    voltage.push(voltageV);
    t += o.sampleIntervalS;
  };
  const dt = o.sampleIntervalS;
  let preconditionEndS: number | null = null;
  if (o.precondition) {
    const n = Math.max(3, Math.round(o.precondition.durationS / dt));
    for (let k = 0; k <= n; k++) push(-o.precondition.currentA, 3.6 - ((3.6 - o.endVoltageV) * k) / n);
    preconditionEndS = t - dt;
  }
  for (let s = 0; s < o.leadInS; s += dt) push(0, 3.1);
  const startS = t;
  const dischargeMah: number[] = [];
  for (let cycle = 1; cycle <= o.cycles; cycle++) {
    const isCheck = o.checkEveryCycles > 0 && cycle % o.checkEveryCycles === 0;
    const capacityMah = o.firstCapacityMah - o.fadeMahPerCycle * (cycle - 1) + (isCheck ? o.checkBonusMah : 0);
    // CC part: 85 % of the charge at the charge current, voltage rising to the charge voltage.
    const ccS = Math.round(((0.85 * capacityMah) / 1000 / o.chargeCurrentA) * 3600);
    for (let s = 0; s < ccS; s += dt) push(o.chargeCurrentA, 3.5 + ((o.chargeVoltageV - 3.5) * s) / ccS);
    // CV part: current decaying from the charge current to the termination current over 40 min.
    const cvS = 2400;
    for (let s = 0; s <= cvS; s += dt) push(o.chargeCurrentA * Math.pow(o.terminationCurrentA / o.chargeCurrentA, s / cvS), o.chargeVoltageV);
    for (let s = 0; s < o.restS; s += dt) push(0, o.chargeVoltageV - 0.05);
    const dischargeA = isCheck ? o.checkCurrentA : o.dischargeCurrentA;
    // Samples at 0, dt, …, n·dt: the trapezoid over n intervals of a constant current is exactly I·n·dt.
    const n = Math.max(3, Math.round(((capacityMah / 1000 / dischargeA) * 3600) / dt));
    for (let k = 0; k <= n; k++) push(-dischargeA, 4.05 - ((4.05 - o.endVoltageV) * k) / n);
    dischargeMah.push((dischargeA * n * dt * 1000) / 3600);
    for (let s = 0; s < o.restS; s += dt) push(0, 3.2);
  }
  const endS = t - dt;
  return {
    columns: {
      timeS: Float64Array.from(time),
      currentA: Float64Array.from(current),
      voltageV: Float64Array.from(voltage),
      length: time.length,
    },
    dischargeMah,
    startS,
    endS,
    preconditionEndS,
  };
}

export interface BuiltEnduranceRun {
  resolution: ProcedureResolution;
  log: EnduranceLog;
  input: RunEvaluationInput;
}

/**
 * An endurance run on the template (or a procedure given): the precondition discharge and the cycle
 * block, each recorded once with the log's times, and a log of `cycles` fading cycles.
 */
export function buildEnduranceRun(scenario: {
  procedure?: Procedure;
  cycles: number;
  fadeMahPerCycle?: number;
  firstCapacityMah?: number;
}): BuiltEnduranceRun {
  const procedure = scenario.procedure ?? enduranceInCyclesTemplate;
  const resolution = resolveOrThrow({ procedure, cell: inventedCell });
  const block = resolution.steps.find((step) => step.kind === "cycle-block");
  if (block?.kind !== "cycle-block") throw new Error("the procedure has no cycle block");
  const log = generateEnduranceLog({
    cycles: scenario.cycles,
    checkEveryCycles: block.capacityCheck?.everyCycles ?? 0,
    precondition: { currentA: 0.6, durationS: 1800 },
    ...(scenario.fadeMahPerCycle !== undefined && { fadeMahPerCycle: scenario.fadeMahPerCycle }),
    ...(scenario.firstCapacityMah !== undefined && { firstCapacityMah: scenario.firstCapacityMah }),
  });
  const reading = (seconds: number, celsius: number) => ({ at: atLogSecond(seconds), celsius, instrumentId: "TH-07" });
  const stepRecords: StepRecordInput[] = [
    {
      stepId: "precondition",
      cycle: 1,
      startedAt: atLogSecond(0),
      endedAt: atLogSecond(log.preconditionEndS ?? 0),
      ambientReadings: [reading(0, 21.5), reading(log.preconditionEndS ?? 0, 21.6)],
      programmed: { current: 0.6, endVoltage: 2.5 },
      completed: true,
    },
    {
      stepId: block.id,
      cycle: 1,
      startedAt: atLogSecond(log.startS),
      endedAt: atLogSecond(log.endS),
      ambientReadings: [reading(log.startS, 21.8), reading((log.startS + log.endS) / 2, 22.9), reading(log.endS, 22.4)],
      programmed: {},
      completed: true,
    },
  ];
  return {
    resolution,
    log,
    input: {
      resolution,
      cellRating: readCellRating(inventedCell),
      stepRecords,
      log: log.columns,
      logStartedAt,
      procedureSource: { standard: procedure.header.standard, clause: procedure.header.clause },
    },
  };
}
