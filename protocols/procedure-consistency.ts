import { findCriterionStepProblem, type AcceptanceCriterion } from './acceptance-criterion';
import { compareVoltagesWithoutSpecification } from './compare-references';
import { checkChargeRetentionSteps, type ChargeRetention } from './charge-retention';
import { checkObservationSteps } from './observation';
import type { RepeatRule } from './repeat-rule';
import type { CurrentReference } from './quantity';
import type { ChargeStep, Step } from './step';

type Path = (string | number)[];
type IssueSink = { addIssue: (issue: { code: 'custom'; path: Path; message: string }) => void };

interface ProcedureParts {
  steps: Step[];
  acceptance: AcceptanceCriterion[];
  repeat?: RepeatRule | undefined;
  retention?: ChargeRetention | undefined;
}

function checkUniqueIds(
  { items, listKey, words }: { items: { id: string }[]; listKey: string; words: string },
  ctx: IssueSink,
): void {
  const firstIndex = new Map<string, number>();
  items.forEach((item, index) => {
    const first = firstIndex.get(item.id);
    if (first === undefined) {
      firstIndex.set(item.id, index);
      return;
    }
    ctx.addIssue({
      code: 'custom',
      path: [listKey, index, 'id'],
      message: `the id "${item.id}" is already used by ${words} ${first + 1}`,
    });
  });
}

function checkCriteria(parts: ProcedureParts, ctx: IssueSink): void {
  const stepsById = new Map(parts.steps.map((step) => [step.id, step]));
  parts.acceptance.forEach((criterion, index) => {
    const step = stepsById.get(criterion.stepId);
    const path = ['acceptance', index, 'stepId'];
    if (step === undefined) {
      ctx.addIssue({ code: 'custom', path, message: `no step has the id "${criterion.stepId}"` });
      return;
    }
    const problem = findCriterionStepProblem(criterion, step);
    if (problem) ctx.addIssue({ code: 'custom', path, message: problem });
  });
}

function checkRepeatRule(parts: ProcedureParts, ctx: IssueSink): void {
  const rule = parts.repeat;
  if (rule === undefined) return;
  const positions = new Map(parts.steps.map((step, index) => [step.id, index]));
  const seen = new Set<string>();
  let blockIsValid = true;
  rule.stepIds.forEach((stepId, index) => {
    const path = ['repeat', 'stepIds', index];
    if (!positions.has(stepId)) {
      ctx.addIssue({ code: 'custom', path, message: `the repeated block names "${stepId}", but no step has that id` });
      blockIsValid = false;
    } else if (seen.has(stepId)) {
      ctx.addIssue({ code: 'custom', path, message: `the repeated block names "${stepId}" twice` });
      blockIsValid = false;
    }
    seen.add(stepId);
  });
  if (blockIsValid) {
    const first = positions.get(rule.stepIds[0] ?? '') ?? 0;
    const consecutive = rule.stepIds.every((stepId, offset) => positions.get(stepId) === first + offset);
    if (!consecutive) {
      ctx.addIssue({
        code: 'custom',
        path: ['repeat', 'stepIds'],
        message: 'the repeated block must list consecutive steps in procedure order',
      });
    }
  }
  const criterion = parts.acceptance.find((candidate) => candidate.id === rule.stopWhenMet);
  if (criterion === undefined) {
    ctx.addIssue({
      code: 'custom',
      path: ['repeat', 'stopWhenMet'],
      message: `no acceptance criterion has the id "${rule.stopWhenMet}"`,
    });
  } else if (!rule.stepIds.includes(criterion.stepId)) {
    ctx.addIssue({
      code: 'custom',
      path: ['repeat', 'stopWhenMet'],
      message: `criterion "${criterion.id}" judges step "${criterion.stepId}", which is outside the repeated block`,
    });
  }
}

/** One cycle block per procedure (its results and limits are the run's endurance), never inside a repeat rule. */
function checkCycleBlocks(parts: ProcedureParts, ctx: IssueSink): void {
  let seen = false;
  parts.steps.forEach((step, index) => {
    if (step.kind !== 'cycle-block') return;
    if (seen) {
      ctx.addIssue({ code: 'custom', path: ['steps', index, 'kind'], message: 'a procedure has at most one cycle block' });
    }
    seen = true;
    if (parts.repeat?.stepIds.includes(step.id)) {
      ctx.addIssue({
        code: 'custom',
        path: ['steps', index, 'kind'],
        message: `the cycle block "${step.id}" repeats itself; leave it out of the repeated block`,
      });
    }
  });
}

/** A discharge must end below the voltage the preceding charge reached, where that is known. */
function checkEndVoltages(parts: ProcedureParts, ctx: IssueSink): void {
  let lastCharge: ChargeStep | undefined;
  parts.steps.forEach((step, index) => {
    if (step.kind === 'charge') lastCharge = step;
    if (step.kind !== 'discharge' || lastCharge === undefined) return;
    const order = compareVoltagesWithoutSpecification(step.endVoltage, lastCharge.voltage);
    if (order === 'equal' || order === 'higher') {
      ctx.addIssue({
        code: 'custom',
        path: ['steps', index, 'endVoltage'],
        message: `the end voltage must be below the charge voltage of step "${lastCharge.id}"`,
      });
    }
  });
}

/**
 * Multiples of It a step's title states as its own current: "Capacity discharge at 0.2 It" → [0.2].
 * A multiple after "the" names another step ("Charge before the 0.2 It discharge") and is skipped.
 */
export function findStatedItMultiples(label: string): number[] {
  return [...label.matchAll(/(?<!\bthe\s)(?<![\d.,])(\d+(?:[.,]\d+)?)\s*(?:×\s*)?It\b/gi)].map((m) => Number(m[1]!.replace(',', '.')));
}

function stepCurrents(step: Step): { words: string; reference: CurrentReference }[] {
  switch (step.kind) {
    case 'charge':
      return [{ words: 'charge current', reference: step.current }];
    case 'discharge':
      return [{ words: 'discharge current', reference: step.current }];
    case 'pulse':
      return [
        { words: 'base current', reference: step.baseCurrent },
        { words: 'pulse current', reference: step.pulseCurrent },
      ];
    default:
      return [];
  }
}

function isUsableCurrent(reference: CurrentReference | undefined): boolean {
  if (!reference || typeof reference !== 'object') return false;
  if ('multipleOfIt' in reference) return typeof reference.multipleOfIt === 'number' && reference.multipleOfIt > 0;
  if ('value' in reference) return typeof reference.value === 'number' && reference.value > 0;
  return 'spec' in reference;
}

function describeCurrent(reference: CurrentReference): string {
  if ('multipleOfIt' in reference) return `${reference.multipleOfIt} It`;
  if ('spec' in reference) return 'taken from the cell specification';
  return `${reference.value} ${reference.unit}`;
}

/**
 * A step's title cannot contradict its set-points: "Capacity discharge at 0.2 It" programmed at
 * 3 It would carry a false statement into the step sheet, the findings and the certificate. Every
 * multiple of It the title states must be one of the step's currents, set as that multiple.
 */
function checkLabelsAgainstSetPoints(parts: ProcedureParts, ctx: IssueSink): void {
  parts.steps.forEach((step, index) => {
    const currents = stepCurrents(step);
    // A current that is itself invalid has its own problem; judging the title against it would only add noise.
    if (!currents.every((c) => isUsableCurrent(c.reference))) return;
    const stated = currents.length > 0 && typeof step.label === 'string' ? findStatedItMultiples(step.label) : [];
    for (const multiple of stated) {
      const matches = currents.some((c) => 'multipleOfIt' in c.reference && Math.abs(c.reference.multipleOfIt - multiple) < 1e-9);
      if (matches) continue;
      const actual = currents.map((c) => `the ${c.words} is ${describeCurrent(c.reference)}`).join(' and ');
      ctx.addIssue({
        code: 'custom',
        path: ['steps', index, 'label'],
        message: `step ${index + 1} “${step.label}”: the title says ${multiple} It, but ${actual}; change the title or the current`,
      });
    }
  });
}

/** Rules that span steps, criteria and the repeat rule; each problem names its field path. */
export function checkProcedureConsistency(parts: ProcedureParts, ctx: IssueSink): void {
  checkUniqueIds({ items: parts.steps, listKey: 'steps', words: 'step' }, ctx);
  checkUniqueIds({ items: parts.acceptance, listKey: 'acceptance', words: 'criterion' }, ctx);
  checkCriteria(parts, ctx);
  checkRepeatRule(parts, ctx);
  checkChargeRetentionSteps(parts.retention, parts.steps, ctx);
  checkObservationSteps(parts.steps, ctx);
  checkCycleBlocks(parts, ctx);
  checkEndVoltages(parts, ctx);
  checkLabelsAgainstSetPoints(parts, ctx);
}
