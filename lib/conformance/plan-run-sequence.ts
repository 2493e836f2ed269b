import type { ProcedureResolution, ResolvedStep } from "@/protocols";
import type { StepRecord } from "./step-record";

/** One step of one cycle, in the order the run should have carried it out. */
export interface PlannedStep {
  step: ResolvedStep;
  cycle: number;
  record: StepRecord | null;
  inRepeatBlock: boolean;
}

export interface RunPlan {
  planned: PlannedStep[];
  /** Cycles of the repeated block the records show (the highest cycle recorded); 1 without a repeat rule. */
  cyclesRun: number;
  /** Records that fit no planned step, in words. */
  recordProblems: string[];
}

const keyOf = (stepId: string, cycle: number) => `${stepId}#${cycle}`;

/**
 * Lays the procedure out as the run went: the steps before the repeated block, the block once per
 * cycle recorded, the steps after it; and pairs each with its record. The repeat rule keeps the
 * block's steps consecutive (protocols' consistency rules), so it is laid out where its first step is.
 */
export function planRunSequence({
  resolution,
  stepRecords,
}: {
  resolution: ProcedureResolution;
  stepRecords: readonly StepRecord[];
}): RunPlan {
  const stepIds = new Set(resolution.steps.map((step) => step.id));
  const blockIds = new Set((resolution.repeat?.stepIds ?? []).filter((id) => stepIds.has(id)));
  const records = new Map<string, StepRecord>();
  const recordProblems: string[] = [];
  let cyclesRun = 1;

  stepRecords.forEach((record, index) => {
    const name = `Record ${index + 1} (step "${record.stepId}", cycle ${record.cycle})`;
    if (!stepIds.has(record.stepId)) {
      recordProblems.push(`${name}: the procedure has no such step`);
      return;
    }
    if (!blockIds.has(record.stepId) && record.cycle > 1) {
      recordProblems.push(`${name}: this step is not repeated, so it has only cycle 1`);
      return;
    }
    const key = keyOf(record.stepId, record.cycle);
    if (records.has(key)) {
      recordProblems.push(`${name}: a record for this step and cycle came earlier; only the first is used`);
      return;
    }
    records.set(key, record);
    if (blockIds.has(record.stepId)) cyclesRun = Math.max(cyclesRun, record.cycle);
  });

  const planned: PlannedStep[] = [];
  const plan = (step: ResolvedStep, cycle: number, inRepeatBlock: boolean) =>
    planned.push({ step, cycle, record: records.get(keyOf(step.id, cycle)) ?? null, inRepeatBlock });
  const block = resolution.steps.filter((step) => blockIds.has(step.id));
  for (const step of resolution.steps) {
    if (!blockIds.has(step.id)) plan(step, 1, false);
    else if (step.id === block[0]?.id) {
      for (let cycle = 1; cycle <= cyclesRun; cycle++) for (const blockStep of block) plan(blockStep, cycle, true);
    }
  }
  return { planned, cyclesRun, recordProblems };
}
