import { z } from 'zod';
import { chargeTerminationSchema } from './charge-termination';
import { compareCurrentsWithoutSpecification, compareNumbers, compareVoltagesWithoutSpecification } from './compare-references';
import { explainTypeError } from './explain-type-error';
import { formatNumber } from './format-number';
import { currentReferenceSchema, durationSchema, voltageReferenceSchema, type Duration } from './quantity';
import type { ProcedureResolution, ResolvedSetPoint } from './resolved-procedure';
import type { ResolvedValue } from './resolve-quantity';
import { convertToSeconds } from './units';

/**
 * Endurance in cycles: a block of charge, rest, discharge, rest repeated up to a number of cycles,
 * with a capacity check every K cycles at its own discharge current, a stop criterion (capacity below a
 * share of the rated capacity) and an acceptance criterion (capacity after the last cycle at least a
 * share of rated). The operator records the block once (start, end, ambient); the data log carries the
 * cycles. The values are the procedure's parameters; the template's come from IEC 61960-3 (endurance in
 * cycles) and are recalled (docs/references.md §18).
 */

/** The most cycles one block may ask for; several years of a 6 h cycle. */
export const MAX_CYCLES_IN_BLOCK = 10_000;

const rest = (what: string) =>
  z.strictObject(
    {
      minDuration: durationSchema,
      maxDuration: durationSchema.optional(),
    },
    { error: explainTypeError(`the ${what} has a shortest time ({ minDuration }) and may have a longest ({ maxDuration })`) },
  );

const share = (what: string) =>
  z
    .number({ error: explainTypeError(`${what} is a number of %`) })
    .positive({ error: `${what} must be above 0 %` })
    .max(100, { error: `${what} cannot be above 100 %` });

const wholeCycles = (what: string) =>
  z
    .number({ error: explainTypeError(`${what} is a number`) })
    .int({ error: `${what} is a whole number of cycles` })
    .min(1, { error: `${what} is at least 1 cycle` })
    .max(MAX_CYCLES_IN_BLOCK, { error: `${what} is at most ${formatNumber(MAX_CYCLES_IN_BLOCK)} cycles` });

/** The fields of a cycle-block step besides the ones every step has (id, label, ambient, …). */
export const cycleBlockFields = {
  /** CC-CV charge of each cycle. */
  charge: z.strictObject(
    { current: currentReferenceSchema, voltage: voltageReferenceSchema, termination: chargeTerminationSchema },
    { error: explainTypeError('the charge of a cycle has a current, a voltage and a termination') },
  ),
  restAfterCharge: rest('rest after charge'),
  /** CC discharge of each cycle to the end voltage. */
  discharge: z.strictObject(
    { current: currentReferenceSchema, endVoltage: voltageReferenceSchema },
    { error: explainTypeError('the discharge of a cycle has a current and an end voltage') },
  ),
  restAfterDischarge: rest('rest after discharge'),
  maxCycles: wholeCycles('the number of cycles'),
  /**
   * Every `everyCycles`-th cycle discharges at `current` instead, and its capacity is the one the stop
   * and acceptance criteria read. Without it every cycle's capacity counts.
   */
  capacityCheck: z
    .strictObject(
      { everyCycles: wholeCycles('the capacity-check interval'), current: currentReferenceSchema },
      { error: explainTypeError('a capacity check has an interval in cycles ({ everyCycles }) and a discharge current ({ current })') },
    )
    .optional(),
  /** The test ends at the first counted capacity below this share of the rated capacity. */
  stopBelowPercentOfRated: share('the stop share of the rated capacity'),
  /** The capacity after the last cycle must be at least this share of the rated capacity. */
  acceptAtLeastPercentOfRated: share('the acceptance share of the rated capacity'),
};

export type CycleBlockFields = z.infer<z.ZodObject<typeof cycleBlockFields>>;

type IssueSink = { addIssue: (issue: { code: 'custom'; path: (string | number)[]; message: string }) => void };

function words(duration: Duration): string {
  return `${formatNumber(duration.value, { maxDecimals: 3 })} ${duration.unit}`;
}

function checkRest(ctx: IssueSink, key: string, what: string, span: { minDuration: Duration; maxDuration?: Duration | undefined }): void {
  if (span.maxDuration === undefined) return;
  const longest = convertToSeconds(span.maxDuration);
  const shortest = convertToSeconds(span.minDuration);
  if (longest > 0 && shortest > 0 && compareNumbers(longest, shortest) === 'lower') {
    ctx.addIssue({
      code: 'custom',
      path: [key, 'maxDuration'],
      message: `the longest ${what} (${words(span.maxDuration)}) is shorter than the shortest (${words(span.minDuration)})`,
    });
  }
}

/** The rules a cycle block must meet before any cell is known, each in plain words. */
export function checkCycleBlock(block: CycleBlockFields, ctx: IssueSink): void {
  if (block.charge.termination.kind === 'current') {
    const order = compareCurrentsWithoutSpecification(block.charge.termination.current, block.charge.current);
    if (order === 'equal' || order === 'higher') {
      ctx.addIssue({ code: 'custom', path: ['charge', 'termination', 'current'], message: 'the termination current must be below the charge current' });
    }
  }
  const voltageOrder = compareVoltagesWithoutSpecification(block.discharge.endVoltage, block.charge.voltage);
  if (voltageOrder === 'equal' || voltageOrder === 'higher') {
    ctx.addIssue({ code: 'custom', path: ['discharge', 'endVoltage'], message: 'the end voltage must be below the charge voltage of the cycle' });
  }
  checkRest(ctx, 'restAfterCharge', 'rest after charge', block.restAfterCharge);
  checkRest(ctx, 'restAfterDischarge', 'rest after discharge', block.restAfterDischarge);
  const check = block.capacityCheck;
  if (check !== undefined) {
    if (check.everyCycles > block.maxCycles) {
      ctx.addIssue({
        code: 'custom',
        path: ['capacityCheck', 'everyCycles'],
        message: `a capacity check every ${check.everyCycles} cycles never comes within ${block.maxCycles} cycles`,
      });
    } else if (block.maxCycles % check.everyCycles !== 0) {
      ctx.addIssue({
        code: 'custom',
        path: ['maxCycles'],
        message: `the number of cycles (${block.maxCycles}) must be a multiple of the capacity-check interval (${check.everyCycles}), so that the last cycle is a capacity check`,
      });
    }
  }
  // Shares already refused as not above 0 % are not compared, so one mistake gives one message.
  const sharesUsable = block.stopBelowPercentOfRated > 0 && block.acceptAtLeastPercentOfRated > 0;
  if (sharesUsable && compareNumbers(block.stopBelowPercentOfRated, block.acceptAtLeastPercentOfRated) === 'higher') {
    ctx.addIssue({
      code: 'custom',
      path: ['stopBelowPercentOfRated'],
      message: `the stop share (${formatNumber(block.stopBelowPercentOfRated, { maxDecimals: 2 })} %) is above the acceptance share (${formatNumber(block.acceptAtLeastPercentOfRated, { maxDecimals: 2 })} %): the test would stop a cell that still meets the acceptance criterion`,
    });
  }
}

/** A cycle block resolved on one cell: set-points in A, V and s; the rated capacity carried along. */
export interface ResolvedCycleBlockParts {
  charge: {
    current: ResolvedSetPoint;
    voltage: ResolvedSetPoint;
    termination: { kind: 'current'; current: ResolvedSetPoint } | { kind: 'time'; duration: ResolvedValue };
  };
  restAfterCharge: { minDuration: ResolvedValue; maxDuration?: ResolvedValue };
  discharge: { current: ResolvedSetPoint; endVoltage: ResolvedSetPoint };
  restAfterDischarge: { minDuration: ResolvedValue; maxDuration?: ResolvedValue };
  maxCycles: number;
  capacityCheck?: { everyCycles: number; current: ResolvedSetPoint };
  stopBelowPercentOfRated: number;
  acceptAtLeastPercentOfRated: number;
  /** Rated capacity of the cell the procedure was resolved on, so a frozen resolution needs no specification. */
  ratedCapacityMah: number;
}

/** What the stop and acceptance criteria of an endurance run read; the streaming evaluation codes against it. */
export interface EnduranceLimits {
  stepId: string;
  maxCycles: number;
  /** Cycles between capacity checks; 1 when every cycle's discharge is a capacity figure (no separate check). */
  checkEveryCycles: number;
  stopBelowPercentOfRated: number;
  acceptAtLeastPercentOfRated: number;
  ratedCapacityMAh: number;
}

/** The limits of the procedure's (first) cycle block, or null when it has none. */
export function readEnduranceLimits(resolution: ProcedureResolution): EnduranceLimits | null {
  for (const step of resolution.steps) {
    if (step.kind !== 'cycle-block') continue;
    return {
      stepId: step.id,
      maxCycles: step.maxCycles,
      checkEveryCycles: step.capacityCheck?.everyCycles ?? 1,
      stopBelowPercentOfRated: step.stopBelowPercentOfRated,
      acceptAtLeastPercentOfRated: step.acceptAtLeastPercentOfRated,
      ratedCapacityMAh: step.ratedCapacityMah,
    };
  }
  return null;
}

/** Whether cycle `cycle` (1-based) of a block with these limits is a capacity check. */
export function isCapacityCheckCycle(limits: Pick<EnduranceLimits, 'checkEveryCycles'>, cycle: number): boolean {
  return cycle % limits.checkEveryCycles === 0;
}
