import type { CellShape, PositiveElectrodeLetter } from './cell-specification';

export interface DesignationInput {
  chemistry: { positiveElectrode: PositiveElectrodeLetter };
  shape: CellShape;
  maxDiameterMm?: number;
  maxThicknessMm?: number;
  maxWidthMm?: number;
  maxHeightMm: number;
}

export type DesignationResult = { ok: true; designation: string } | { ok: false; message: string };

/**
 * IEC 61960 clause 5.1 rounds maximum dimensions up to the next whole mm. The small epsilon keeps
 * a value like 22.000000000004 (decimal input through binary floating point) at 22.
 */
export function roundUpToWholeMm(valueMm: number): number {
  return Math.ceil(valueMm - 1e-9);
}

/**
 * One dimension as the designation writes it: whole mm rounded up; below 1 mm, tenths of a mm
 * rounded up with a leading "t" (IEC 61960 clause 5.1: 0.7 mm → t7).
 */
export function writeDimension(valueMm: number): string {
  if (valueMm < 1) return `t${Math.ceil(valueMm * 10 - 1e-9)}`;
  return String(roundUpToWholeMm(valueMm));
}

function checkDimension(value: number | undefined, words: string): string | undefined {
  if (value === undefined) return `the ${words} is needed for the designation`;
  if (!Number.isFinite(value) || value <= 0) return `the ${words} must be a positive number of mm`;
  return undefined;
}

/**
 * IEC 61960 clause 5.1 designation of a single cell: "I" (lithium ion), the positive-electrode
 * letter, R (cylindrical) or P (prismatic), then maximum diameter/height or
 * thickness/width/height in whole mm rounded up: Ø 21.4 × 70.3 mm, nickel → INR22/71.
 */
export function computeDesignation(cell: DesignationInput): DesignationResult {
  const prefix = `I${cell.chemistry.positiveElectrode}`;
  const heightProblem = checkDimension(cell.maxHeightMm, 'maximum height');
  if (cell.shape === 'cylindrical') {
    const problem = checkDimension(cell.maxDiameterMm, 'maximum diameter') ?? heightProblem;
    if (problem || cell.maxDiameterMm === undefined) return { ok: false, message: problem ?? '' };
    return {
      ok: true,
      designation: `${prefix}R${writeDimension(cell.maxDiameterMm)}/${writeDimension(cell.maxHeightMm)}`,
    };
  }
  const problem =
    checkDimension(cell.maxThicknessMm, 'maximum thickness') ??
    checkDimension(cell.maxWidthMm, 'maximum width') ??
    heightProblem;
  if (problem || cell.maxThicknessMm === undefined || cell.maxWidthMm === undefined) {
    return { ok: false, message: problem ?? '' };
  }
  const sizes = [cell.maxThicknessMm, cell.maxWidthMm, cell.maxHeightMm].map(writeDimension);
  return { ok: true, designation: `${prefix}P${sizes.join('/')}` };
}
