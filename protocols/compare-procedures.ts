import type { AcceptanceCriterion } from './acceptance-criterion';
import { readDecisionRule, type DecisionRule } from './decision-rule';
import type { Procedure } from './procedure';
import type { ChargeRetention } from './charge-retention';
import type { RepeatRule } from './repeat-rule';
import type { Step } from './step';

export type ItemChange = 'added' | 'removed' | 'changed' | 'unchanged';

export interface StepComparison {
  stepId: string;
  change: ItemChange;
  before?: Step;
  after?: Step;
  /** 0-based positions in each version. */
  beforeIndex?: number;
  afterIndex?: number;
  /** The step kept its id but its order relative to the other kept steps changed. */
  moved: boolean;
  /** Dot paths of the values that differ, e.g. "current.multipleOfIt". */
  changedFields: string[];
}

export interface CriterionComparison {
  criterionId: string;
  change: ItemChange;
  before?: AcceptanceCriterion;
  after?: AcceptanceCriterion;
  changedFields: string[];
}

export interface ProcedureComparison {
  identical: boolean;
  headerChangedFields: string[];
  /** Steps in the order of the second version, removed steps placed after their former neighbour. */
  steps: StepComparison[];
  acceptance: CriterionComparison[];
  /** The decision rule of each version; a definition that names none is read as simple acceptance. */
  decisionRule: { change: 'changed' | 'unchanged'; before: DecisionRule; after: DecisionRule };
  repeat: { change: ItemChange; before?: RepeatRule; after?: RepeatRule; changedFields: string[] };
  /** The charge retention and recovery setting of each version. */
  retention: { change: ItemChange; before?: ChargeRetention; after?: ChargeRetention; changedFields: string[] };
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null;
}

function collectChangedPaths({ before, after, prefix }: { before: unknown; after: unknown; prefix: string }): string[] {
  if (Object.is(before, after)) return [];
  if (!isRecord(before) || !isRecord(after) || Array.isArray(before) !== Array.isArray(after)) {
    return [prefix];
  }
  const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])];
  return keys.flatMap((key) =>
    collectChangedPaths({ before: before[key], after: after[key], prefix: prefix ? `${prefix}.${key}` : key }),
  );
}

/** Leaf paths whose values differ between two plain-data values (arrays compared by position). */
export function listChangedPaths(before: unknown, after: unknown): string[] {
  return collectChangedPaths({ before, after, prefix: '' });
}

/** Ids of the kept items that are not in a longest common subsequence of both orders: those moved. */
function findMovedIds(beforeIds: string[], afterIds: string[]): Set<string> {
  const kept = new Set(afterIds);
  const a = beforeIds.filter((id) => kept.has(id));
  const keptBefore = new Set(a);
  const b = afterIds.filter((id) => keptBefore.has(id));
  const lengths = Array.from({ length: a.length + 1 }, () => new Array<number>(b.length + 1).fill(0));
  for (let i = a.length - 1; i >= 0; i--) {
    for (let j = b.length - 1; j >= 0; j--) {
      const row = lengths[i]!;
      row[j] = a[i] === b[j] ? lengths[i + 1]![j + 1]! + 1 : Math.max(lengths[i + 1]![j]!, row[j + 1]!);
    }
  }
  const inOrder = new Set<string>();
  for (let i = 0, j = 0; i < a.length && j < b.length; ) {
    if (a[i] === b[j]) {
      inOrder.add(a[i]!);
      i++;
      j++;
    } else if (lengths[i + 1]![j]! >= lengths[i]![j + 1]!) i++;
    else j++;
  }
  return new Set(a.filter((id) => !inOrder.has(id)));
}

function compareSteps(before: Step[], after: Step[]): StepComparison[] {
  const beforeById = new Map(before.map((step, index) => [step.id, { step, index }]));
  const afterIds = new Set(after.map((step) => step.id));
  const moved = findMovedIds(before.map((step) => step.id), [...afterIds]);
  const result: StepComparison[] = after.map((step, afterIndex) => {
    const old = beforeById.get(step.id);
    if (old === undefined) {
      return { stepId: step.id, change: 'added', after: step, afterIndex, moved: false, changedFields: [] };
    }
    const changedFields = listChangedPaths(old.step, step);
    return {
      stepId: step.id,
      change: changedFields.length > 0 ? 'changed' : 'unchanged',
      before: old.step,
      after: step,
      beforeIndex: old.index,
      afterIndex,
      moved: moved.has(step.id),
      changedFields,
    };
  });
  let anchor = -1;
  before.forEach((step, beforeIndex) => {
    if (afterIds.has(step.id)) {
      anchor = result.findIndex((entry) => entry.stepId === step.id && entry.change !== 'removed');
      return;
    }
    anchor += 1;
    const removed: StepComparison = {
      stepId: step.id,
      change: 'removed',
      before: step,
      beforeIndex,
      moved: false,
      changedFields: [],
    };
    result.splice(anchor, 0, removed);
  });
  return result;
}

function compareCriteria(before: AcceptanceCriterion[], after: AcceptanceCriterion[]): CriterionComparison[] {
  const beforeById = new Map(before.map((criterion) => [criterion.id, criterion]));
  const afterIds = new Set(after.map((criterion) => criterion.id));
  const kept = after.map((criterion): CriterionComparison => {
    const old = beforeById.get(criterion.id);
    if (old === undefined) return { criterionId: criterion.id, change: 'added', after: criterion, changedFields: [] };
    const changedFields = listChangedPaths(old, criterion);
    const change = changedFields.length ? 'changed' : 'unchanged';
    return { criterionId: criterion.id, change, before: old, after: criterion, changedFields };
  });
  const removed = before
    .filter((criterion) => !afterIds.has(criterion.id))
    .map((criterion): CriterionComparison => ({
      criterionId: criterion.id,
      change: 'removed',
      before: criterion,
      changedFields: [],
    }));
  return [...kept, ...removed];
}

/** An optional part of a procedure (repeat rule, retention setting): added, removed, changed or the same. */
function compareOptional<T extends object>(before: T | undefined, after: T | undefined): { change: ItemChange; before?: T; after?: T; changedFields: string[] } {
  if (before === undefined && after === undefined) return { change: 'unchanged', changedFields: [] };
  if (before === undefined) return { change: 'added', after, changedFields: [] };
  if (after === undefined) return { change: 'removed', before, changedFields: [] };
  const changedFields = listChangedPaths(before, after);
  return { change: changedFields.length ? 'changed' : 'unchanged', before, after, changedFields };
}

/** Step-by-step differences between two procedures (steps and criteria matched by id). */
export function compareProcedures(before: Procedure, after: Procedure): ProcedureComparison {
  const headerChangedFields = listChangedPaths(before.header, after.header);
  const steps = compareSteps(before.steps, after.steps);
  const acceptance = compareCriteria(before.acceptance, after.acceptance);
  const repeat = compareOptional(before.repeat, after.repeat);
  const retention = compareOptional(before.retention, after.retention);
  const rules = { before: readDecisionRule(before), after: readDecisionRule(after) };
  const decisionRule = { change: rules.before === rules.after ? ('unchanged' as const) : ('changed' as const), ...rules };
  const identical =
    headerChangedFields.length === 0 &&
    steps.every((entry) => entry.change === 'unchanged' && !entry.moved) &&
    acceptance.every((entry) => entry.change === 'unchanged') &&
    before.acceptance.map((c) => c.id).join('\n') === after.acceptance.map((c) => c.id).join('\n') &&
    repeat.change === 'unchanged' &&
    retention.change === 'unchanged' &&
    decisionRule.change === 'unchanged';
  return { identical, headerChangedFields, steps, acceptance, decisionRule, repeat, retention };
}
