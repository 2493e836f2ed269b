import { assertNever } from './assert-never';
import { resolveChargeRetention } from './charge-retention';
import type { CapacityCriterion } from './acceptance-criterion';
import type { CellSpecification } from './cell-specification';
import { readDecisionRule } from './decision-rule';
import { formatNumber, roundSignificant } from './format-number';
import type { Procedure } from './procedure';
import { resolveDuration, resolveResistance, type ResolvedValue } from './resolve-quantity';
import { resolveStep, type StepIssues } from './resolve-step';
import type { ProcedureResolution, ResolvedCriterion, ResolvedStep } from './resolved-procedure';
import { validateCellSpecification, validateProcedure, type FieldProblem } from './validate-input';

export interface ResolveProcedureInput {
  procedure: Procedure;
  cellSpecification: CellSpecification;
  /** Caution codes someone has acknowledged on this procedure version. */
  acknowledgedCautions?: readonly string[];
}

export type ResolveProcedureResult =
  | { ok: true; resolution: ProcedureResolution }
  | { ok: false; procedureProblems: FieldProblem[]; cellSpecificationProblems: FieldProblem[] };

function resolveCapacityLimit(criterion: CapacityCriterion, cell: CellSpecification): ResolvedValue | null {
  const capacityMah = criterion.of === 'rated' ? cell.ratedCapacityMah : cell.minimumCapacityMah;
  if (capacityMah === undefined) return null;
  // The limit is a share of a declared capacity; mAh → Ah by definition.
  const valueAh = roundSignificant((criterion.atLeastPercent / 100) * (capacityMah / 1000));
  return {
    value: valueAh,
    unit: 'Ah',
    source: { kind: 'capacity-share', percent: criterion.atLeastPercent, basis: criterion.of, capacityMah },
    explanation:
      `${formatNumber(criterion.atLeastPercent, { maxDecimals: 2 })} % of the ${criterion.of} capacity ` +
      `${formatNumber(capacityMah, { maxDecimals: 1 })} mAh = ${formatNumber(valueAh * 1000, { maxDecimals: 1 })} mAh`,
  };
}

interface ResolutionParts {
  procedure: Procedure;
  cell: CellSpecification;
  issues: StepIssues;
}

function resolveCriteria({ procedure, cell, issues }: ResolutionParts): ResolvedCriterion[] {
  const missing = (where: { index: number; id: string; field: string }, message: string) =>
    issues.errors.push({
      severity: 'error',
      kind: 'specification-value-missing',
      code: `specification-value-missing/${where.id}/${where.field}`,
      path: `acceptance.${where.index}.${where.field}`,
      criterionId: where.id,
      message: `Criterion "${where.id}": ${message}`,
    });

  return procedure.acceptance.map((criterion, index): ResolvedCriterion => {
    const { id, stepId } = criterion;
    switch (criterion.kind) {
      case 'capacity': {
        const minimum = resolveCapacityLimit(criterion, cell);
        if (minimum === null) {
          missing({ index, id, field: 'of' }, 'the cell specification does not state the minimum capacity');
        }
        return { kind: 'capacity', id, stepId, atLeastPercent: criterion.atLeastPercent, of: criterion.of, minimum };
      }
      case 'discharge-duration':
        return { kind: 'discharge-duration', id, stepId, minimum: resolveDuration(criterion.atLeast) };
      case 'resistance': {
        const resolution = resolveResistance(criterion.atMost, cell);
        if (!resolution.ok) missing({ index, id, field: 'atMost' }, resolution.message);
        return { kind: 'resistance', id, stepId, maximum: resolution.ok ? resolution.resolved : null };
      }
      default:
        return assertNever(criterion);
    }
  });
}

function resolveSteps({ procedure, cell, issues }: ResolutionParts): ResolvedStep[] {
  let precedingChargeVoltage: ResolvedValue | undefined;
  return procedure.steps.map((step, index) => {
    const resolved = resolveStep({ step, index, cell, header: procedure.header, issues, precedingChargeVoltage });
    if (resolved.kind === 'charge') precedingChargeVoltage = resolved.voltage ?? undefined;
    return resolved;
  });
}

/**
 * Turns a procedure's references into concrete set-points for one cell specification (A, V, s,
 * °C; limits in Ah, s, Ω), each with its origin, and lists what stops it from running: errors,
 * and safety cautions that need an acknowledgement. Pure and deterministic.
 */
export function resolveProcedure(input: ResolveProcedureInput): ResolveProcedureResult {
  const procedureCheck = validateProcedure(input.procedure);
  const cellCheck = validateCellSpecification(input.cellSpecification);
  if (!procedureCheck.ok || !cellCheck.ok) {
    return {
      ok: false,
      procedureProblems: procedureCheck.ok ? [] : procedureCheck.problems,
      cellSpecificationProblems: cellCheck.ok ? [] : cellCheck.problems,
    };
  }
  const procedure = procedureCheck.value;
  const cell = cellCheck.value;
  const issues: StepIssues = { errors: [], cautions: [] };
  const steps = resolveSteps({ procedure, cell, issues });
  const acceptance = resolveCriteria({ procedure, cell, issues });

  const acknowledged = new Set(input.acknowledgedCautions ?? []);
  const cautions = issues.cautions.map((caution) => ({ ...caution, acknowledged: acknowledged.has(caution.code) }));
  const cautionCodes = new Set(cautions.map((caution) => caution.code));
  const cautionsNeedingAcknowledgement = cautions
    .filter((caution) => !caution.acknowledged)
    .map((caution) => caution.code);
  const unmatchedAcknowledgements = [...acknowledged].filter((code) => !cautionCodes.has(code));

  return {
    ok: true,
    resolution: {
      steps,
      acceptance,
      decisionRule: readDecisionRule(procedure),
      ...(procedure.repeat && { repeat: procedure.repeat }),
      ...(procedure.retention && { retention: resolveChargeRetention(procedure.retention, cell.ratedCapacityMah) }),
      errors: issues.errors,
      cautions,
      cautionsNeedingAcknowledgement,
      unmatchedAcknowledgements,
      ready: issues.errors.length === 0 && cautionsNeedingAcknowledgement.length === 0,
    },
  };
}
