import { z } from 'zod';
import { explainTypeError } from './explain-type-error';
import { computeDesignation } from './designation';

/**
 * Positive-electrode letters of the IEC 61960 cell designation (clause 5.1): cobalt, nickel,
 * manganese, vanadium, titanium; and, from an IECEE CTL decision on cell designations under IEC
 * 62133 (which refers to IEC 61960 clause 5.1), iron (F), iron phosphate (Fp), manganese phosphate
 * (Mp) and any other material (X). See docs/references.md for the source and what is not confirmed.
 */
export const positiveElectrodeLetters = ['C', 'N', 'M', 'V', 'T', 'F', 'Fp', 'Mp', 'X'] as const;
export type PositiveElectrodeLetter = (typeof positiveElectrodeLetters)[number];

export const positiveElectrodeNames: Record<PositiveElectrodeLetter, string> = {
  C: 'cobalt',
  N: 'nickel',
  M: 'manganese',
  V: 'vanadium',
  T: 'titanium',
  F: 'iron',
  Fp: 'iron phosphate',
  Mp: 'manganese phosphate',
  X: 'other material',
};

export const cellShapes = ['cylindrical', 'prismatic'] as const;
export type CellShape = (typeof cellShapes)[number];

function requirePositive(what: string) {
  return z
    .number({ error: explainTypeError(`${what} is a number`) })
    .positive({ error: `${what} must be greater than 0` });
}

/**
 * The fields without the cross-field rules, for callers that add their own fields
 * (e.g. `.extend({ model }).superRefine(checkCellSpecification)`).
 */
export const cellSpecificationFieldsSchema = z.strictObject({
  /** IEC 61960 designation as the datasheet states it; when given it must match the dimensions. */
  designation: z.string().trim().min(1, { error: 'the designation is empty' }).max(40).optional(),
  chemistry: z.strictObject({
    positiveElectrode: z.enum(positiveElectrodeLetters, {
      error: explainTypeError('the positive electrode is one of the letters C, N, M, V, T, F, Fp, Mp, X'),
    }),
    /** The maker's or the trade's name for the chemistry, e.g. "NMC". */
    label: z.string().trim().min(1, { error: 'name the chemistry, e.g. NMC' }).max(40),
  }),
  shape: z.enum(cellShapes, { error: explainTypeError('the shape is cylindrical or prismatic') }),
  ratedCapacityMah: requirePositive('the rated capacity'),
  minimumCapacityMah: requirePositive('the minimum capacity').optional(),
  nominalVoltageV: requirePositive('the nominal voltage'),
  chargeVoltageV: requirePositive('the charge voltage'),
  standardChargeCurrentA: requirePositive('the standard charge current'),
  maxChargeCurrentA: requirePositive('the maximum charge current').optional(),
  chargeTerminationCurrentA: requirePositive('the charge termination current').optional(),
  maxContinuousDischargeCurrentA: requirePositive('the maximum continuous discharge current'),
  endOfDischargeVoltageV: requirePositive('the end-of-discharge voltage'),
  maxMassG: requirePositive('the maximum mass').optional(),
  maxDiameterMm: requirePositive('the maximum diameter').optional(),
  maxThicknessMm: requirePositive('the maximum thickness').optional(),
  maxWidthMm: requirePositive('the maximum width').optional(),
  maxHeightMm: requirePositive('the maximum height'),
  maxAcResistanceMOhm: requirePositive('the maximum AC resistance').optional(),
  maxDcResistanceMOhm: requirePositive('the maximum DC resistance').optional(),
});

type CellSpecificationFields = z.infer<typeof cellSpecificationFieldsSchema>;

type IssueSink = { addIssue: (issue: { code: 'custom'; path: string[]; message: string }) => void };

/** Cross-field rules skip values already refused as not positive, so one mistake gives one message. */
function isUsable(value: number | undefined): value is number {
  return value !== undefined && value > 0;
}

function checkVoltagesAndCurrents(cell: CellSpecificationFields, ctx: IssueSink): void {
  const { endOfDischargeVoltageV: endOfDischarge, nominalVoltageV: nominal, chargeVoltageV: charge } = cell;
  if (isUsable(endOfDischarge) && isUsable(nominal) && endOfDischarge >= nominal) {
    ctx.addIssue({
      code: 'custom',
      path: ['endOfDischargeVoltageV'],
      message: `the end-of-discharge voltage (${endOfDischarge} V) must be below the nominal voltage (${nominal} V)`,
    });
  }
  if (isUsable(nominal) && isUsable(charge) && nominal >= charge) {
    ctx.addIssue({
      code: 'custom',
      path: ['chargeVoltageV'],
      message: `the charge voltage (${charge} V) must be above the nominal voltage (${nominal} V)`,
    });
  }
  const { minimumCapacityMah: minimum, ratedCapacityMah: rated } = cell;
  if (isUsable(minimum) && isUsable(rated) && minimum > rated) {
    ctx.addIssue({
      code: 'custom',
      path: ['minimumCapacityMah'],
      message: `the minimum capacity (${minimum} mAh) must not exceed the rated capacity (${rated} mAh)`,
    });
  }
  const { chargeTerminationCurrentA: termination, standardChargeCurrentA: standard, maxChargeCurrentA: max } = cell;
  if (isUsable(max) && isUsable(standard) && max < standard) {
    ctx.addIssue({
      code: 'custom',
      path: ['maxChargeCurrentA'],
      message: `the maximum charge current (${max} A) is below the standard charge current (${standard} A)`,
    });
  }
  if (isUsable(termination) && isUsable(standard) && termination >= standard) {
    ctx.addIssue({
      code: 'custom',
      path: ['chargeTerminationCurrentA'],
      message: `the charge termination current (${termination} A) must be below the standard charge current (${standard} A)`,
    });
  }
}

function checkDimensionsAndDesignation(cell: CellSpecificationFields, ctx: IssueSink): void {
  const missing = (key: string, words: string) =>
    ctx.addIssue({ code: 'custom', path: [key], message: `a ${cell.shape} cell needs its ${words}` });
  const notUsed = (key: string, words: string) =>
    ctx.addIssue({ code: 'custom', path: [key], message: `a ${cell.shape} cell has no ${words}; leave it empty` });

  if (cell.shape === 'cylindrical') {
    if (cell.maxDiameterMm === undefined) missing('maxDiameterMm', 'maximum diameter');
    if (cell.maxThicknessMm !== undefined) notUsed('maxThicknessMm', 'thickness');
    if (cell.maxWidthMm !== undefined) notUsed('maxWidthMm', 'width');
  } else {
    if (cell.maxThicknessMm === undefined) missing('maxThicknessMm', 'maximum thickness');
    if (cell.maxWidthMm === undefined) missing('maxWidthMm', 'maximum width');
    if (cell.maxDiameterMm !== undefined) notUsed('maxDiameterMm', 'diameter');
  }
  if (cell.designation === undefined) return;
  const computed = computeDesignation(cell);
  if (computed.ok && computed.designation !== cell.designation.toUpperCase()) {
    ctx.addIssue({
      code: 'custom',
      path: ['designation'],
      message: `the designation should be ${computed.designation} for this chemistry, shape and these maximum dimensions (IEC 61960 rounds them up to whole mm)`,
    });
  }
}

/** Consistency rules of a cell specification: voltage order, capacities, currents, dimensions, designation. */
export function checkCellSpecification(cell: CellSpecificationFields, ctx: IssueSink): void {
  checkVoltagesAndCurrents(cell, ctx);
  checkDimensionsAndDesignation(cell, ctx);
}

/** Datasheet values of one cell type (docs/design.md §3), with their consistency rules. */
export const cellSpecificationSchema = cellSpecificationFieldsSchema.superRefine(checkCellSpecification);

export type CellSpecification = z.infer<typeof cellSpecificationSchema>;
