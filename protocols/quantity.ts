import { z } from 'zod';
import { explainTypeError } from './explain-type-error';
import {
  currentSpecificationFieldNames,
  resistanceSpecificationFieldNames,
  voltageSpecificationFieldNames,
} from './specification-fields';

export const currentUnits = ['A', 'mA'] as const;
export const voltageUnits = ['V', 'mV'] as const;
export const durationUnits = ['s', 'min', 'h'] as const;
export const resistanceUnits = ['mOhm', 'Ohm'] as const;
export const frequencyUnits = ['Hz', 'kHz'] as const;

export type CurrentUnit = (typeof currentUnits)[number];
export type VoltageUnit = (typeof voltageUnits)[number];
export type DurationUnit = (typeof durationUnits)[number];
export type ResistanceUnit = (typeof resistanceUnits)[number];
export type FrequencyUnit = (typeof frequencyUnits)[number];

function requirePositive(what: string) {
  return z
    .number({ error: explainTypeError(`${what} is a number`) })
    .positive({ error: `${what} must be greater than 0` });
}

/** A field name checked as a refinement first, so an unknown name is reported at its own path. */
function requireSpecificationField<const Names extends readonly [string, ...string[]]>(names: Names, what: string) {
  return z
    .string({ error: explainTypeError('a specification field is named in text') })
    .refine((name) => (names as readonly string[]).includes(name), {
      error: (issue) =>
        `"${String(issue.input)}" is not a ${what} field of the cell specification; use one of: ${names.join(', ')}`,
    })
    .pipe(z.enum(names));
}

function requireUnit<const Units extends readonly [string, ...string[]]>(units: Units) {
  return z.enum(units, { error: explainTypeError(`the unit is one of ${units.join(', ')}`) });
}

export const itMultipleSchema = z.strictObject({
  multipleOfIt: requirePositive('a multiple of It'),
});

export const currentSpecificationReferenceSchema = z.strictObject({
  spec: requireSpecificationField(currentSpecificationFieldNames, 'current'),
});

export const absoluteCurrentSchema = z.strictObject({
  value: requirePositive('a current'),
  unit: requireUnit(currentUnits),
});

/** A current: a multiple of It, a field of the cell specification, or a value in A or mA. */
export const currentReferenceSchema = z.union(
  [itMultipleSchema, currentSpecificationReferenceSchema, absoluteCurrentSchema],
  {
    error: explainTypeError(
      'a current is a multiple of It ({ multipleOfIt }), a cell specification field ({ spec }) or a value with unit A or mA ({ value, unit })',
    ),
  },
);

export const voltageSpecificationReferenceSchema = z.strictObject({
  spec: requireSpecificationField(voltageSpecificationFieldNames, 'voltage'),
});

export const absoluteVoltageSchema = z.strictObject({
  value: requirePositive('a voltage'),
  unit: requireUnit(voltageUnits),
});

/** A voltage: a field of the cell specification or a value in V or mV. */
export const voltageReferenceSchema = z.union([voltageSpecificationReferenceSchema, absoluteVoltageSchema], {
  error: explainTypeError('a voltage is a cell specification field ({ spec }) or a value with unit V or mV ({ value, unit })'),
});

export const durationSchema = z.strictObject(
  { value: requirePositive('a duration'), unit: requireUnit(durationUnits) },
  { error: explainTypeError('a duration is a value with unit s, min or h ({ value, unit })') },
);

const requireCelsius = (what: string) =>
  z
    .number({ error: explainTypeError(`${what} is a number of °C`) })
    .min(-273.15, { error: `${what} is below absolute zero` });

export const nominalTemperatureSchema = z.strictObject({
  nominalC: requireCelsius('the nominal temperature'),
  toleranceC: requirePositive('the temperature tolerance'),
});

export const temperatureBoundsSchema = z
  .strictObject({ minC: requireCelsius('the lowest temperature'), maxC: requireCelsius('the highest temperature') })
  .refine((range) => range.maxC > range.minC, {
    path: ['maxC'],
    error: 'the highest temperature must be above the lowest',
  });

/** A temperature range: nominal ± tolerance, or lowest..highest. */
export const temperatureRangeSchema = z.union([nominalTemperatureSchema, temperatureBoundsSchema], {
  error: explainTypeError('a temperature range is { nominalC, toleranceC } or { minC, maxC }'),
});

export const resistanceSpecificationReferenceSchema = z.strictObject({
  spec: requireSpecificationField(resistanceSpecificationFieldNames, 'resistance'),
});

export const absoluteResistanceSchema = z.strictObject({
  value: requirePositive('a resistance'),
  unit: requireUnit(resistanceUnits),
});

/** A resistance limit: a field of the cell specification or a value in mOhm or Ohm. */
export const resistanceReferenceSchema = z.union(
  [resistanceSpecificationReferenceSchema, absoluteResistanceSchema],
  { error: explainTypeError('a resistance is a cell specification field ({ spec }) or a value with unit mOhm or Ohm ({ value, unit })') },
);

export const frequencySchema = z.strictObject(
  { value: requirePositive('a frequency'), unit: requireUnit(frequencyUnits) },
  { error: explainTypeError('a frequency is a value with unit Hz or kHz ({ value, unit })') },
);

export type ItMultiple = z.infer<typeof itMultipleSchema>;
export type AbsoluteCurrent = z.infer<typeof absoluteCurrentSchema>;
export type CurrentReference = z.infer<typeof currentReferenceSchema>;
export type AbsoluteVoltage = z.infer<typeof absoluteVoltageSchema>;
export type VoltageReference = z.infer<typeof voltageReferenceSchema>;
export type Duration = z.infer<typeof durationSchema>;
export type TemperatureRange = z.infer<typeof temperatureRangeSchema>;
export type AbsoluteResistance = z.infer<typeof absoluteResistanceSchema>;
export type ResistanceReference = z.infer<typeof resistanceReferenceSchema>;
export type Frequency = z.infer<typeof frequencySchema>;

/** Any reference or value a procedure holds, for display. */
export type QuantityReference =
  | CurrentReference
  | VoltageReference
  | Duration
  | TemperatureRange
  | ResistanceReference
  | Frequency;
