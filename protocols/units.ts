import { roundSignificant } from './format-number';
import type {
  AbsoluteCurrent,
  AbsoluteResistance,
  AbsoluteVoltage,
  Duration,
  Frequency,
  TemperatureRange,
} from './quantity';

// Unit conversions to SI (definitions). Milli-units divide by 1000 rather than multiply by 0.001,
// which is exact more often in binary floating point; the result is rounded to 12 significant digits.

export function convertToAmperes(current: AbsoluteCurrent): number {
  return roundSignificant(current.unit === 'mA' ? current.value / 1000 : current.value);
}

export function convertToVolts(voltage: AbsoluteVoltage): number {
  return roundSignificant(voltage.unit === 'mV' ? voltage.value / 1000 : voltage.value);
}

const secondsPerUnit = { s: 1, min: 60, h: 3600 } as const;

export function convertToSeconds(duration: Duration): number {
  return roundSignificant(duration.value * secondsPerUnit[duration.unit]);
}

export function convertToOhms(resistance: AbsoluteResistance): number {
  return roundSignificant(resistance.unit === 'mOhm' ? resistance.value / 1000 : resistance.value);
}

export function convertToHertz(frequency: Frequency): number {
  return roundSignificant(frequency.unit === 'kHz' ? frequency.value * 1000 : frequency.value);
}

/** Lowest and highest temperature of a range, °C. */
export function convertToBounds(range: TemperatureRange): { minC: number; maxC: number } {
  if ('nominalC' in range) {
    return {
      minC: roundSignificant(range.nominalC - range.toleranceC),
      maxC: roundSignificant(range.nominalC + range.toleranceC),
    };
  }
  return { minC: range.minC, maxC: range.maxC };
}
