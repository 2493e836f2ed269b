import { compareNumbers, roundSignificant } from "@/protocols";

export interface Band {
  min: number;
  max: number;
}

/** value ± percent of value (a set-point and its relative tolerance, IEC 61960-3 clause 4 form). */
export function createBand(value: number, percent: number): Band {
  const halfWidth = (Math.abs(value) * percent) / 100;
  return { min: roundSignificant(value - halfWidth), max: roundSignificant(value + halfWidth) };
}

/** Inside [min, max], treating a relative difference below 1e-9 as equal (floating-point noise). */
export function isInsideBand(value: number, band: Partial<Band>): boolean {
  if (band.min !== undefined && compareNumbers(value, band.min) === "lower") return false;
  if (band.max !== undefined && compareNumbers(value, band.max) === "higher") return false;
  return true;
}
