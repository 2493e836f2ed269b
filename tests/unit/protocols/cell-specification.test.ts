import { describe, expect, it } from 'vitest';
import { validateCellSpecification, type CellSpecification } from '@/protocols';
import { omitFields } from './cell-fixtures';
import { inventedCell, prismaticLcoCell } from '@/scenarios/invented-cells';

function problemsOf(input: unknown) {
  const result = validateCellSpecification(input);
  return result.ok ? [] : result.problems;
}

function pathsOf(input: unknown) {
  return problemsOf(input).map((problem) => problem.path);
}

describe('cell specification schema', () => {
  it('accepts the cylindrical and the prismatic fixture', () => {
    expect(validateCellSpecification(inventedCell)).toEqual({ ok: true, value: inventedCell });
    expect(validateCellSpecification(prismaticLcoCell).ok).toBe(true);
  });

  it('requires positive numbers', () => {
    expect(problemsOf({ ...inventedCell, ratedCapacityMah: 0 })).toEqual([
      { path: 'ratedCapacityMah', message: 'the rated capacity must be greater than 0' },
    ]);
    expect(pathsOf({ ...inventedCell, maxMassG: -3 })).toEqual(['maxMassG']);
  });

  it('says "required" for a missing field', () => {
    expect(problemsOf(omitFields(inventedCell, 'chargeVoltageV'))).toEqual([{ path: 'chargeVoltageV', message: 'required' }]);
  });

  it('needs end-of-discharge < nominal < charge voltage', () => {
    expect(pathsOf({ ...inventedCell, endOfDischargeVoltageV: 3.6 })).toEqual(['endOfDischargeVoltageV']);
    expect(pathsOf({ ...inventedCell, nominalVoltageV: 4.2 })).toEqual(['chargeVoltageV']);
  });

  it('needs minimum capacity ≤ rated capacity, termination < standard ≤ maximum charge current', () => {
    expect(pathsOf({ ...inventedCell, minimumCapacityMah: 3001 })).toEqual(['minimumCapacityMah']);
    expect(validateCellSpecification({ ...inventedCell, minimumCapacityMah: 3000 }).ok).toBe(true);
    expect(pathsOf({ ...inventedCell, chargeTerminationCurrentA: 1.5 })).toEqual(['chargeTerminationCurrentA']);
    expect(pathsOf({ ...inventedCell, maxChargeCurrentA: 1 })).toEqual(['maxChargeCurrentA']);
  });

  it('asks for the dimensions that fit the shape', () => {
    expect(pathsOf(omitFields(inventedCell, 'maxDiameterMm'))).toEqual(['maxDiameterMm']);
    expect(pathsOf({ ...inventedCell, maxWidthMm: 30 })).toEqual(['maxWidthMm']);
    const prismaticWithDiameter: CellSpecification = { ...prismaticLcoCell, maxDiameterMm: 10 };
    expect(pathsOf(prismaticWithDiameter)).toEqual(['maxDiameterMm']);
  });

  it('refuses a designation that does not match chemistry, shape and dimensions', () => {
    const problems = problemsOf({ ...inventedCell, designation: 'INR21/70' });
    expect(problems.map((problem) => problem.path)).toEqual(['designation']);
    expect(problems[0]?.message).toContain('INR22/71');
    expect(validateCellSpecification({ ...inventedCell, designation: 'inr22/71' }).ok).toBe(true);
  });

  it('accepts only the IEC 61960 and IECEE CTL positive-electrode letters and refuses unknown fields', () => {
    expect(pathsOf({ ...inventedCell, chemistry: { positiveElectrode: 'Q', label: 'NMC' } })).toEqual([
      'chemistry.positiveElectrode',
    ]);
    expect(problemsOf({ ...inventedCell, colour: 'blue' })).toEqual([{ path: '', message: 'unexpected field: colour' }]);
  });

  it('gives a typed result, not a throw, for input that is not an object', () => {
    expect(validateCellSpecification(null).ok).toBe(false);
    expect(validateCellSpecification('INR22/71').ok).toBe(false);
  });
});
