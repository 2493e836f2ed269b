import { describe, expect, it } from 'vitest';
import {
  convertToAmperes,
  convertToBounds,
  convertToSeconds,
  convertToVolts,
  currentReferenceSchema,
  durationSchema,
  formatNumber,
  resistanceReferenceSchema,
  temperatureRangeSchema,
  voltageReferenceSchema,
} from '@/protocols';

function issuesOf(result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) {
  return (result.error?.issues ?? []).map((issue) => ({ path: issue.path.join('.'), message: issue.message }));
}

describe('current references', () => {
  it('accept the three forms of the step language', () => {
    expect(currentReferenceSchema.safeParse({ multipleOfIt: 0.2 }).success).toBe(true);
    expect(currentReferenceSchema.safeParse({ spec: 'maxContinuousDischargeCurrent' }).success).toBe(true);
    expect(currentReferenceSchema.safeParse({ value: 5, unit: 'A' }).success).toBe(true);
    expect(currentReferenceSchema.safeParse({ value: 600, unit: 'mA' }).success).toBe(true);
  });

  it('refuse a negative current at the value itself', () => {
    expect(issuesOf(currentReferenceSchema.safeParse({ value: -1, unit: 'A' }))).toEqual([
      { path: 'value', message: 'a current must be greater than 0' },
    ]);
    expect(issuesOf(currentReferenceSchema.safeParse({ multipleOfIt: -0.2 }))[0]?.path).toBe('multipleOfIt');
  });

  it('name an unknown or wrong-kind specification field at its path', () => {
    const [issue] = issuesOf(currentReferenceSchema.safeParse({ spec: 'chargeVoltage' }));
    expect(issue?.path).toBe('spec');
    expect(issue?.message).toContain('"chargeVoltage" is not a current field');
    expect(issuesOf(voltageReferenceSchema.safeParse({ spec: 'ratedVoltage' }))[0]?.path).toBe('spec');
    expect(issuesOf(resistanceReferenceSchema.safeParse({ spec: 'maxCharge' }))[0]?.path).toBe('spec');
  });

  it('refuse a voltage unit on a current and mixed forms', () => {
    expect(currentReferenceSchema.safeParse({ value: 1, unit: 'V' }).success).toBe(false);
    expect(issuesOf(currentReferenceSchema.safeParse({ multipleOfIt: 0.2, unit: 'A' }))[0]?.message).toContain('unit');
  });
});

describe('durations and temperatures', () => {
  it('refuse a zero duration and an unknown unit', () => {
    expect(durationSchema.safeParse({ value: 0, unit: 'h' }).success).toBe(false);
    expect(durationSchema.safeParse({ value: 1, unit: 'd' }).success).toBe(false);
  });

  it('accept nominal ± tolerance and min..max; refuse an inverted range at maxC', () => {
    expect(temperatureRangeSchema.safeParse({ nominalC: 20, toleranceC: 5 }).success).toBe(true);
    expect(temperatureRangeSchema.safeParse({ minC: 15, maxC: 25 }).success).toBe(true);
    expect(issuesOf(temperatureRangeSchema.safeParse({ minC: 25, maxC: 15 }))).toEqual([
      { path: 'maxC', message: 'the highest temperature must be above the lowest' },
    ]);
  });

  it('refuse a temperature below absolute zero (definition)', () => {
    expect(temperatureRangeSchema.safeParse({ nominalC: -300, toleranceC: 1 }).success).toBe(false);
  });
});

describe('conversion to SI (definitions of the units)', () => {
  it('converts milli-units and time units', () => {
    expect(convertToAmperes({ value: 600, unit: 'mA' })).toBe(0.6);
    expect(convertToVolts({ value: 2750, unit: 'mV' })).toBe(2.75);
    expect(convertToSeconds({ value: 1, unit: 'h' })).toBe(3600);
    expect(convertToSeconds({ value: 0.1, unit: 'h' })).toBe(360);
    expect(convertToSeconds({ value: 5, unit: 'min' })).toBe(300);
  });

  it('turns nominal ± tolerance into bounds', () => {
    expect(convertToBounds({ nominalC: 20, toleranceC: 5 })).toEqual({ minC: 15, maxC: 25 });
    expect(convertToBounds({ nominalC: -20, toleranceC: 2 })).toEqual({ minC: -22, maxC: -18 });
  });
});

describe('formatNumber', () => {
  it('groups thousands with a space, trims zeros, writes a true minus', () => {
    expect(formatNumber(3000)).toBe('3 000');
    expect(formatNumber(1234567.5, { maxDecimals: 1 })).toBe('1 234 567.5');
    expect(formatNumber(4.2, { minDecimals: 2 })).toBe('4.20');
    expect(formatNumber(0.6000000000000001)).toBe('0.6');
    expect(formatNumber(-20)).toBe('\u221220');
    expect(formatNumber(-0.00001)).toBe('0');
  });
});
