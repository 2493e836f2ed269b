import { planRunSequence, type PlannedStep, type StepRecord } from "@/lib/conformance";
import type { ProcedureResolution } from "@/protocols";

export interface SheetEntry extends PlannedStep {
  /** "<step id>#<cycle>": unique on the sheet. */
  key: string;
  /** Position on the sheet, 1-based, as the operator counts the lines. */
  line: number;
  state: "done" | "current" | "waiting";
  /** Codes of the resolution's cautions that concern this step. */
  cautionCodes: string[];
}

export interface StepSheetLayout {
  entries: SheetEntry[];
  cyclesShown: number;
  /** The cycle the operator may open next, when the repeated block allows one more. */
  nextCycle: number | null;
  /** Every line on the sheet is ticked. */
  allTicked: boolean;
}

/**
 * The run as a paper checklist: the procedure's steps top to bottom, the repeated block once per
 * cycle (at least the cycles recorded, at most the rule's maximum), and the first unticked line as the
 * current one, so steps are done in order.
 */
export function layOutStepSheet({
  resolution,
  stepRecords,
  cyclesRequested = 1,
}: {
  resolution: ProcedureResolution;
  stepRecords: readonly StepRecord[];
  cyclesRequested?: number;
}): StepSheetLayout {
  const recorded = planRunSequence({ resolution, stepRecords }).cyclesRun;
  const maxCycles = resolution.repeat ? resolution.repeat.maxCycles : 1;
  const cyclesShown = Math.min(maxCycles, Math.max(recorded, Math.floor(cyclesRequested) || 1));
  // Placeholder records in the extra cycles make planRunSequence lay them out; they are dropped again below.
  const placeholders: StepRecord[] = [];
  const firstBlockStep = resolution.repeat?.stepIds[0];
  if (firstBlockStep && cyclesShown > recorded) {
    placeholders.push(placeholderRecord(firstBlockStep, cyclesShown));
  }
  const plan = planRunSequence({ resolution, stepRecords: [...stepRecords, ...placeholders] });
  let currentFound = false;
  const entries = plan.planned.map((planned, index): SheetEntry => {
    const record = planned.record && placeholders.includes(planned.record) ? null : planned.record;
    const done = record?.completed === true;
    const state = done ? "done" : currentFound ? "waiting" : "current";
    if (state === "current") currentFound = true;
    return {
      ...planned,
      record,
      key: `${planned.step.id}#${planned.cycle}`,
      line: index + 1,
      state,
      cautionCodes: resolution.cautions.filter((c) => c.stepId === planned.step.id).map((c) => c.code),
    };
  });
  const allTicked = entries.every((e) => e.state === "done");
  const lastBlockLines = entries.filter((e) => e.inRepeatBlock && e.cycle === cyclesShown);
  const lastCycleDone = lastBlockLines.length > 0 && lastBlockLines.every((e) => e.state === "done");
  return { entries, cyclesShown, nextCycle: lastCycleDone && cyclesShown < maxCycles ? cyclesShown + 1 : null, allTicked };
}

function placeholderRecord(stepId: string, cycle: number): StepRecord {
  return { stepId, cycle, ambientReadings: [], programmed: {}, completed: false, acknowledgedCautionCodes: [] };
}
