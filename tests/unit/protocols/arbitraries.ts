import fc from 'fast-check';
import { decisionRules } from '@/protocols';
import type {
  AcceptanceCriterion,
  CellSpecification,
  CurrentReference,
  Duration,
  Measurement,
  Procedure,
  RepeatRule,
  Step,
  TemperatureRange,
  VoltageReference,
} from '@/protocols';

/** Valid cell specifications over a wide range of sizes (generated, not real cells). */
export const cellSpecificationArbitrary: fc.Arbitrary<CellSpecification> = fc
  .record({
    ratedCapacityMah: fc.integer({ min: 100, max: 100_000 }),
    minimumShare: fc.integer({ min: 80, max: 100 }),
    voltages: fc.constantFrom(
      { endOfDischargeVoltageV: 2.0, nominalVoltageV: 3.2, chargeVoltageV: 3.65 },
      { endOfDischargeVoltageV: 2.5, nominalVoltageV: 3.6, chargeVoltageV: 4.2 },
      { endOfDischargeVoltageV: 2.75, nominalVoltageV: 3.7, chargeVoltageV: 4.2 },
      { endOfDischargeVoltageV: 3.0, nominalVoltageV: 3.7, chargeVoltageV: 4.35 },
    ),
    standardChargeRate: fc.constantFrom(0.2, 0.5, 1),
    maxDischargeRate: fc.constantFrom(1, 2, 5, 10),
    positiveElectrode: fc.constantFrom('C', 'N', 'M', 'V', 'T' as const),
    diameterTenths: fc.integer({ min: 50, max: 600 }),
    heightTenths: fc.integer({ min: 100, max: 2000 }),
  })
  .map((r): CellSpecification => {
    const itA = r.ratedCapacityMah / 1000;
    return {
      chemistry: { positiveElectrode: r.positiveElectrode, label: 'generated' },
      shape: 'cylindrical',
      ratedCapacityMah: r.ratedCapacityMah,
      minimumCapacityMah: (r.ratedCapacityMah * r.minimumShare) / 100,
      ...r.voltages,
      standardChargeCurrentA: r.standardChargeRate * itA,
      maxChargeCurrentA: 2 * r.standardChargeRate * itA,
      chargeTerminationCurrentA: itA / 50,
      maxContinuousDischargeCurrentA: r.maxDischargeRate * itA,
      maxDiameterMm: r.diameterTenths / 10,
      maxHeightMm: r.heightTenths / 10,
    };
  });

export const durationArbitrary: fc.Arbitrary<Duration> = fc.record({
  value: fc.integer({ min: 1, max: 500 }),
  unit: fc.constantFrom('s', 'min', 'h' as const),
});

export const currentReferenceArbitrary: fc.Arbitrary<CurrentReference> = fc.oneof(
  fc.integer({ min: 1, max: 50 }).map((tenths) => ({ multipleOfIt: tenths / 10 })),
  fc.constantFrom<CurrentReference>(
    { spec: 'standardChargeCurrent' },
    { spec: 'maxChargeCurrent' },
    { spec: 'maxContinuousDischargeCurrent' },
  ),
  fc.integer({ min: 1, max: 20_000 }).map((mA) => ({ value: mA, unit: 'mA' as const })),
  fc.integer({ min: 1, max: 200 }).map((tenths) => ({ value: tenths / 10, unit: 'A' as const })),
);

const chargeVoltageArbitrary: fc.Arbitrary<VoltageReference> = fc.oneof(
  fc.constant<VoltageReference>({ spec: 'chargeVoltage' }),
  fc.integer({ min: 360, max: 440 }).map((centi) => ({ value: centi / 100, unit: 'V' as const })),
);

/** End voltages at most 3.0 V, so always below any generated charge voltage (≥ 3.6 V). */
const endVoltageArbitrary: fc.Arbitrary<VoltageReference> = fc.oneof(
  fc.constant<VoltageReference>({ spec: 'endOfDischargeVoltage' }),
  fc.integer({ min: 2000, max: 3000 }).map((mV) => ({ value: mV, unit: 'mV' as const })),
);

const temperatureArbitrary: fc.Arbitrary<TemperatureRange> = fc.oneof(
  fc.record({ nominalC: fc.integer({ min: -40, max: 60 }), toleranceC: fc.integer({ min: 1, max: 5 }) }),
  fc.record({ minC: fc.integer({ min: -40, max: 20 }), span: fc.integer({ min: 1, max: 30 }) }).map((r) => ({
    minC: r.minC,
    maxC: r.minC + r.span,
  })),
);

function addDurations(base: Duration, extra: Duration): Duration {
  const seconds = { s: 1, min: 60, h: 3600 }[base.unit];
  const extraSeconds = extra.value * { s: 1, min: 60, h: 3600 }[extra.unit];
  return { value: base.value + Math.ceil(extraSeconds / seconds), unit: base.unit };
}

type StepBody = Step extends infer S ? (S extends Step ? Omit<S, 'id' | 'label'> : never) : never;

const stepBodyArbitrary: fc.Arbitrary<StepBody> = fc.oneof(
  fc
    .record({
      current: currentReferenceArbitrary,
      voltage: chargeVoltageArbitrary,
      byTime: fc.boolean(),
      duration: durationArbitrary,
      ambient: fc.option(temperatureArbitrary, { nil: undefined }),
    })
    .map(
      (r): StepBody => ({
        kind: 'charge',
        current: r.current,
        voltage: r.voltage,
        termination: r.byTime
          ? { kind: 'time', duration: r.duration }
          : { kind: 'current', current: { spec: 'chargeTerminationCurrent' } },
        ...(r.ambient && { ambient: r.ambient }),
      }),
    ),
  fc
    .record({
      current: currentReferenceArbitrary,
      endVoltage: endVoltageArbitrary,
      purpose: fc.constantFrom('precondition', 'measure' as const),
      maxDuration: fc.option(durationArbitrary, { nil: undefined }),
    })
    .map((r): StepBody => ({ kind: 'discharge', ...r })),
  fc
    .record({ minDuration: durationArbitrary, extra: fc.option(durationArbitrary, { nil: undefined }) })
    .map(
      (r): StepBody => ({
        kind: 'rest',
        minDuration: r.minDuration,
        ...(r.extra && { maxDuration: addDurations(r.minDuration, r.extra) }),
      }),
    ),
  fc
    .record({ temperature: temperatureArbitrary, minDuration: durationArbitrary, extra: durationArbitrary })
    .map(
      (r): StepBody => ({
        kind: 'soak',
        temperature: r.temperature,
        minDuration: r.minDuration,
        maxDuration: addDurations(r.minDuration, r.extra),
      }),
    ),
  fc
    .record({ base: fc.integer({ min: 1, max: 10 }), step: fc.integer({ min: 1, max: 20 }) })
    .map(
      (r): StepBody => ({
        kind: 'pulse',
        baseCurrent: { multipleOfIt: r.base / 10 },
        baseDuration: { value: 10, unit: 's' },
        pulseCurrent: { multipleOfIt: (r.base + r.step) / 10 },
        pulseDuration: { value: 1, unit: 's' },
      }),
    ),
  fc
    .constantFrom<Measurement>(
      { quantity: 'mass' },
      { quantity: 'openCircuitVoltage' },
      { quantity: 'acResistance', frequency: { value: 1, unit: 'kHz' } },
      { quantity: 'dimensions' },
    )
    .map((measurement): StepBody => ({ kind: 'measure', measurement })),
);

function dropUndefined<T extends object>(value: T): T {
  return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as T;
}

/** Criteria on the generated steps that each criterion kind can judge. */
function buildCriteria(steps: Step[]): AcceptanceCriterion[] {
  return steps.flatMap((step, index): AcceptanceCriterion[] => {
    if (step.kind === 'discharge' && step.purpose === 'measure') {
      return [{ kind: 'capacity', id: `criterion-${index}`, stepId: step.id, atLeastPercent: 100, of: 'rated' }];
    }
    if (step.kind === 'pulse') {
      return [{ kind: 'resistance', id: `criterion-${index}`, stepId: step.id, atMost: { value: 50, unit: 'mOhm' } }];
    }
    return [];
  });
}

function buildRepeat(steps: Step[], criteria: AcceptanceCriterion[]): RepeatRule | undefined {
  const criterion = criteria[0];
  if (criterion === undefined) return undefined;
  const end = steps.findIndex((step) => step.id === criterion.stepId);
  const start = Math.max(0, end - 2);
  return {
    label: 'Repeated block',
    stepIds: steps.slice(start, end + 1).map((step) => step.id),
    maxCycles: 3,
    stopWhenMet: criterion.id,
  };
}

/** Procedures that satisfy the schema and every cross-step rule by construction. */
export const procedureArbitrary: fc.Arbitrary<Procedure> = fc
  .record({
    bodies: fc.array(stepBodyArbitrary, { minLength: 1, maxLength: 12 }),
    withRepeat: fc.boolean(),
    ambient: temperatureArbitrary,
    // Absent as in definitions stored before procedures named a rule.
    decisionRule: fc.option(fc.constantFrom(...decisionRules), { nil: undefined }),
  })
  .map(({ bodies, withRepeat, ambient, decisionRule }): Procedure => {
    const steps = bodies.map((body, index) => dropUndefined({ ...body, id: `step-${index}`, label: `Step ${index + 1}` }) as Step);
    const acceptance = buildCriteria(steps);
    const repeat = withRepeat ? buildRepeat(steps, acceptance) : undefined;
    return {
      header: {
        title: 'Generated procedure',
        code: 'GEN-1',
        scope: 'Generated for property tests.',
        standard: 'IEC 61960-3:2017',
        clause: '7.3.1',
        ambient,
      },
      steps,
      acceptance,
      ...(decisionRule && { decisionRule }),
      ...(repeat && { repeat }),
    };
  });
