import { assertNever } from './assert-never';
import type { CellSpecification } from './cell-specification';
import { compareNumbers } from './compare-references';
import { formatNumber } from './format-number';
import { clauseFourTolerances, setPointToleranceNames } from './measurement-tolerances';
import type { ProcedureHeader } from './procedure';
import {
  formatSiValue,
  resolveCurrent,
  resolveDuration,
  resolveFrequency,
  resolveTemperatureRange,
  resolveVoltage,
  type QuantityResolution,
  type ResolvedTemperatureRange,
  type ResolvedValue,
} from './resolve-quantity';
import type {
  CautionKind,
  ResolutionCaution,
  ResolutionError,
  ResolutionErrorKind,
  ResolvedChargeStep,
  ResolvedSetPoint,
  ResolvedStep,
  ResolvedTolerances,
} from './resolved-procedure';
import type { ChargeStep, ChargeTermination, CycleBlockStep, DischargeStep, PulseStep, Step } from './step';

export interface StepIssues {
  errors: ResolutionError[];
  cautions: Omit<ResolutionCaution, 'acknowledged'>[];
}

interface StepContext {
  step: Step;
  index: number;
  cell: CellSpecification;
  header: ProcedureHeader;
  issues: StepIssues;
  /** Charge voltage of the nearest preceding charge step, when it resolved. */
  precedingChargeVoltage?: ResolvedValue;
}

function nameStep(context: StepContext): string {
  return `Step ${context.index + 1} "${context.step.label}"`;
}

interface IssueDraft<Kind> {
  kind: Kind;
  /** Path of the set-point inside the step, e.g. "termination.current". */
  field: string;
  message: string;
}

function addError(context: StepContext, { kind, field, message }: IssueDraft<ResolutionErrorKind>): void {
  context.issues.errors.push({
    severity: 'error',
    kind,
    code: `${kind}/${context.step.id}/${field}`,
    path: `steps.${context.index}.${field}`,
    stepId: context.step.id,
    message: `${nameStep(context)}: ${message}`,
  });
}

function addCaution(context: StepContext, { kind, field, message }: IssueDraft<CautionKind>): void {
  context.issues.cautions.push({
    severity: 'caution',
    kind,
    code: `${kind}/${context.step.id}/${field}`,
    path: `steps.${context.index}.${field}`,
    stepId: context.step.id,
    message: `${nameStep(context)}: ${message}`,
  });
}

/** The resolved value, or null with an error when the cell specification cannot supply it. */
function take(
  context: StepContext,
  { field, resolution }: { field: string; resolution: QuantityResolution },
): ResolvedSetPoint {
  if (resolution.ok) return resolution.resolved;
  addError(context, { kind: 'specification-value-missing', field, message: resolution.message });
  return null;
}

function resolveTolerances(context: StepContext): ResolvedTolerances {
  const entries = setPointToleranceNames.map((name) => {
    const fromStep = context.step.tolerances?.[name];
    const fromProcedure = context.header.tolerances?.[name];
    if (fromStep !== undefined) return [name, { value: fromStep, from: 'step' }] as const;
    if (fromProcedure !== undefined) return [name, { value: fromProcedure, from: 'procedure' }] as const;
    return [name, { value: clauseFourTolerances[name], from: 'IEC 61960-3 clause 4' }] as const;
  });
  return Object.fromEntries(entries) as ResolvedTolerances;
}

function resolveAmbient(context: StepContext): ResolvedTemperatureRange {
  const step = context.step;
  if (step.kind === 'soak') return resolveTemperatureRange(step.temperature, 'step');
  return step.ambient
    ? resolveTemperatureRange(step.ambient, 'step')
    : resolveTemperatureRange(context.header.ambient, 'procedure');
}

function checkDischargeCurrent(context: StepContext, { current, field }: { current: ResolvedSetPoint; field: string }): void {
  const limit = context.cell.maxContinuousDischargeCurrentA;
  if (current === null || compareNumbers(current.value, limit) !== 'higher') return;
  addCaution(context, {
    kind: 'discharge-current-above-rating',
    field,
    message: `${formatSiValue(current.value, 'A')} is above the cell's maximum continuous discharge current ${formatSiValue(limit, 'A')}; outside the rating, acknowledge before running`,
  });
}

function checkBelowZero(
  context: StepContext,
  { range, kind, field }: { range: ResolvedTemperatureRange; kind: CautionKind; field: string },
): void {
  if (range.minC >= 0) return;
  const lowest = `${formatNumber(range.minC, { maxDecimals: 2 })} °C`;
  const message =
    kind === 'charge-below-zero-celsius'
      ? `the ambient range reaches ${lowest}, below 0 °C; charging a lithium cell below 0 °C is outside its rating, acknowledge before running`
      : `the soak temperature reaches ${lowest}, below 0 °C; no charge may start until the cell is back above 0 °C, acknowledge before running`;
  addCaution(context, { kind, field, message });
}

function resolveTermination(context: StepContext, termination: ChargeTermination): ResolvedChargeStep['termination'] {
  switch (termination.kind) {
    case 'current':
      return {
        kind: 'current',
        current: take(context, {
          field: 'termination.current',
          resolution: resolveCurrent(termination.current, context.cell),
        }),
      };
    case 'time':
      return { kind: 'time', duration: resolveDuration(termination.duration) };
    default:
      return assertNever(termination);
  }
}

function resolveCharge(context: StepContext, step: ChargeStep) {
  const { cell } = context;
  const current = take(context, { field: 'current', resolution: resolveCurrent(step.current, cell) });
  const voltage = take(context, { field: 'voltage', resolution: resolveVoltage(step.voltage, cell) });
  const termination = resolveTermination(context, step.termination);

  if (voltage && compareNumbers(voltage.value, cell.chargeVoltageV) === 'higher') {
    addError(context, {
      kind: 'charge-voltage-above-specification',
      field: 'voltage',
      message: `the charge voltage ${formatSiValue(voltage.value, 'V')} is above the cell's charge voltage ${formatSiValue(cell.chargeVoltageV, 'V')}`,
    });
  }
  if (termination.kind === 'current' && termination.current && current) {
    if (compareNumbers(termination.current.value, current.value) !== 'lower') {
      addError(context, {
        kind: 'termination-current-not-below-charge-current',
        field: 'termination.current',
        message: `the termination current ${formatSiValue(termination.current.value, 'A')} is not below the charge current ${formatSiValue(current.value, 'A')}`,
      });
    }
  }
  const limit = cell.maxChargeCurrentA ?? cell.standardChargeCurrentA;
  const limitWords =
    cell.maxChargeCurrentA === undefined ? 'standard charge current (no maximum stated)' : 'maximum charge current';
  if (current && compareNumbers(current.value, limit) === 'higher') {
    addCaution(context, {
      kind: 'charge-current-above-rating',
      field: 'current',
      message: `${formatSiValue(current.value, 'A')} is above the cell's ${limitWords} ${formatSiValue(limit, 'A')}; outside the rating, acknowledge before running`,
    });
  }
  return {
    kind: 'charge' as const,
    current,
    voltage,
    termination,
    ...(step.maxDuration && { maxDuration: resolveDuration(step.maxDuration) }),
  };
}

function resolveDischarge(context: StepContext, step: DischargeStep) {
  const { cell } = context;
  const current = take(context, { field: 'current', resolution: resolveCurrent(step.current, cell) });
  const endVoltage = take(context, { field: 'endVoltage', resolution: resolveVoltage(step.endVoltage, cell) });
  if (endVoltage && compareNumbers(endVoltage.value, cell.endOfDischargeVoltageV) === 'lower') {
    addError(context, {
      kind: 'end-voltage-below-specification',
      field: 'endVoltage',
      message: `the end voltage ${formatSiValue(endVoltage.value, 'V')} is below the cell's end-of-discharge voltage ${formatSiValue(cell.endOfDischargeVoltageV, 'V')}`,
    });
  }
  const chargeVoltage = context.precedingChargeVoltage?.value ?? cell.chargeVoltageV;
  if (endVoltage && compareNumbers(endVoltage.value, chargeVoltage) !== 'lower') {
    addError(context, {
      kind: 'end-voltage-not-below-charge-voltage',
      field: 'endVoltage',
      message: `the end voltage ${formatSiValue(endVoltage.value, 'V')} is not below the charge voltage ${formatSiValue(chargeVoltage, 'V')}`,
    });
  }
  checkDischargeCurrent(context, { current, field: 'current' });
  return {
    kind: 'discharge' as const,
    purpose: step.purpose,
    current,
    endVoltage,
    ...(step.maxDuration && { maxDuration: resolveDuration(step.maxDuration) }),
  };
}

function resolvePulse(context: StepContext, step: PulseStep) {
  const { cell } = context;
  const baseCurrent = take(context, { field: 'baseCurrent', resolution: resolveCurrent(step.baseCurrent, cell) });
  const pulseCurrent = take(context, { field: 'pulseCurrent', resolution: resolveCurrent(step.pulseCurrent, cell) });
  if (baseCurrent && pulseCurrent && compareNumbers(pulseCurrent.value, baseCurrent.value) !== 'higher') {
    addError(context, {
      kind: 'pulse-current-not-above-base-current',
      field: 'pulseCurrent',
      message: `the pulse current ${formatSiValue(pulseCurrent.value, 'A')} must be above the base current ${formatSiValue(baseCurrent.value, 'A')}`,
    });
  }
  checkDischargeCurrent(context, { current: baseCurrent, field: 'baseCurrent' });
  checkDischargeCurrent(context, { current: pulseCurrent, field: 'pulseCurrent' });
  return {
    kind: 'pulse' as const,
    baseCurrent,
    baseDuration: resolveDuration(step.baseDuration),
    pulseCurrent,
    pulseDuration: resolveDuration(step.pulseDuration),
  };
}

/**
 * Runs a resolver on one part of a cycle block (its charge or discharge), naming the part in the
 * issues' paths, codes and messages: "steps.3.charge.current", "Step 4 "Cycles" (charge): …".
 */
function resolvePart<Result>(context: StepContext, part: 'charge' | 'discharge', resolve: (inner: StepContext) => Result): Result {
  const inner: StepContext = { ...context, issues: { errors: [], cautions: [] } };
  const result = resolve(inner);
  const prefix = `steps.${context.index}.`;
  const named = <Issue extends { code: string; path: string; message: string }>(issue: Issue): Issue => {
    const [kind, id, ...field] = issue.code.split('/');
    return {
      ...issue,
      code: [kind, id, `${part}.${field.join('/')}`].join('/'),
      path: issue.path.startsWith(prefix) ? `${prefix}${part}.${issue.path.slice(prefix.length)}` : issue.path,
      message: issue.message.replace(nameStep(context), `${nameStep(context)} (${part} of each cycle)`),
    };
  };
  context.issues.errors.push(...inner.issues.errors.map(named));
  context.issues.cautions.push(...inner.issues.cautions.map(named));
  return result;
}

function resolveRestSpan(span: CycleBlockStep['restAfterCharge']) {
  return {
    minDuration: resolveDuration(span.minDuration),
    ...(span.maxDuration && { maxDuration: resolveDuration(span.maxDuration) }),
  };
}

function resolveCycleBlock(context: StepContext, step: CycleBlockStep, ambient: ResolvedTemperatureRange) {
  const { cell } = context;
  checkBelowZero(context, { range: ambient, kind: 'charge-below-zero-celsius', field: 'ambient' });
  const charge = resolvePart(context, 'charge', (inner) =>
    resolveCharge(inner, { kind: 'charge', id: step.id, label: step.label, ...step.charge }),
  );
  const discharge = resolvePart(context, 'discharge', (inner) =>
    resolveDischarge(
      { ...inner, precedingChargeVoltage: charge.voltage ?? undefined },
      { kind: 'discharge', id: step.id, label: step.label, purpose: 'measure', ...step.discharge },
    ),
  );
  const check = step.capacityCheck;
  let capacityCheck: { everyCycles: number; current: ResolvedSetPoint } | undefined;
  if (check !== undefined) {
    const current = take(context, { field: 'capacityCheck.current', resolution: resolveCurrent(check.current, cell) });
    checkDischargeCurrent(context, { current, field: 'capacityCheck.current' });
    capacityCheck = { everyCycles: check.everyCycles, current };
  }
  return {
    kind: 'cycle-block' as const,
    charge: { current: charge.current, voltage: charge.voltage, termination: charge.termination },
    restAfterCharge: resolveRestSpan(step.restAfterCharge),
    discharge: { current: discharge.current, endVoltage: discharge.endVoltage },
    restAfterDischarge: resolveRestSpan(step.restAfterDischarge),
    maxCycles: step.maxCycles,
    ...(capacityCheck && { capacityCheck }),
    stopBelowPercentOfRated: step.stopBelowPercentOfRated,
    acceptAtLeastPercentOfRated: step.acceptAtLeastPercentOfRated,
    ratedCapacityMah: cell.ratedCapacityMah,
  };
}

function resolveKindFields(context: StepContext, ambient: ResolvedTemperatureRange) {
  const step = context.step;
  switch (step.kind) {
    case 'charge':
      checkBelowZero(context, { range: ambient, kind: 'charge-below-zero-celsius', field: 'ambient' });
      return resolveCharge(context, step);
    case 'discharge':
      return resolveDischarge(context, step);
    case 'rest':
      return {
        kind: 'rest' as const,
        minDuration: resolveDuration(step.minDuration),
        ...(step.maxDuration && { maxDuration: resolveDuration(step.maxDuration) }),
      };
    case 'soak':
      checkBelowZero(context, { range: ambient, kind: 'soak-below-zero-celsius', field: 'temperature' });
      return {
        kind: 'soak' as const,
        temperature: ambient,
        minDuration: resolveDuration(step.minDuration),
        ...(step.maxDuration && { maxDuration: resolveDuration(step.maxDuration) }),
      };
    case 'pulse':
      return resolvePulse(context, step);
    case 'measure':
      return {
        kind: 'measure' as const,
        measurement: step.measurement,
        ...(step.measurement.quantity === 'acResistance' && {
          frequency: resolveFrequency(step.measurement.frequency),
        }),
      };
    case 'observe':
      return {
        kind: 'observe' as const,
        records: [...step.records],
        ...(step.compareWith !== undefined && { compareWith: step.compareWith }),
        ...(step.criteria !== undefined && { criteria: step.criteria }),
      };
    case 'cycle-block':
      return resolveCycleBlock(context, step, ambient);
    default:
      return assertNever(step);
  }
}

/** Concrete set-points of one step in SI units, adding its errors and cautions to `context.issues`. */
export function resolveStep(context: StepContext): ResolvedStep {
  const ambient = resolveAmbient(context);
  const { step, index } = context;
  return {
    id: step.id,
    label: step.label,
    index,
    ambient,
    tolerances: resolveTolerances(context),
    ...(step.instructions !== undefined && { instructions: step.instructions }),
    ...resolveKindFields(context, ambient),
  };
}
