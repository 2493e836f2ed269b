import { z } from 'zod';
import { explainTypeError } from './explain-type-error';
import { formatNumber } from './format-number';
import { identifierSchema } from './identifier';

/**
 * Observation steps: values read off a balance, a voltmeter and a caliper, and the cell's visual
 * state, before and after a test. The criteria are the procedure's parameters (a template sets them,
 * citing its source), never constants of the code: the values we use come from UN Manual of Tests
 * and Criteria 38.3.4 and are recalled (docs/references.md §14, §17).
 */

/** What an observation step asks the operator to record. */
export const observedQuantities = ['mass', 'openCircuitVoltage', 'dimensions', 'visual'] as const;
export type ObservedQuantity = (typeof observedQuantities)[number];

/** The closed list of visual outcomes; each is recorded as "none seen" or not. */
export const visualOutcomes = ['leakage', 'venting', 'disassembly', 'rupture', 'fire'] as const;
export type VisualOutcome = (typeof visualOutcomes)[number];

/** "No leakage", … as the lab writes them. */
export const VISUAL_OUTCOME_WORDS: Record<VisualOutcome, string> = {
  leakage: 'No leakage',
  venting: 'No venting',
  disassembly: 'No disassembly',
  rupture: 'No rupture',
  fire: 'No fire',
};

export const OBSERVED_QUANTITY_WORDS: Record<ObservedQuantity, string> = {
  mass: 'mass (g)',
  openCircuitVoltage: 'open-circuit voltage (V)',
  dimensions: 'dimensions (mm)',
  visual: 'visual state',
};

const percent = (what: string) =>
  z
    .number({ error: explainTypeError(`${what} is a number of %`) })
    .min(0, { error: `${what} cannot be below 0 %` })
    .max(100, { error: `${what} cannot be above 100 %` });

/**
 * One band of the mass-loss limit: cells up to `upToG` (included or not) may lose at most
 * `maxLossPercent` of their mass. The last band has no upper edge. A band starts where the one before
 * it ends (the other side of that edge).
 */
export const massLossBandSchema = z.strictObject({
  upToG: z.number({ error: explainTypeError('the upper edge of a band is a mass in g') }).positive({ error: 'the upper edge of a band must be above 0 g' }).optional(),
  /** Whether a cell of exactly `upToG` belongs to this band (else to the next). */
  upToIncluded: z.boolean({ error: explainTypeError('say whether the edge belongs to the band') }).optional(),
  maxLossPercent: percent('the largest mass loss'),
});
export type MassLossBand = z.infer<typeof massLossBandSchema>;

export const observationCriteriaSchema = z.strictObject({
  /** Mass loss (M1 − M2) / M1 × 100 at most the band's limit, the band chosen by the mass before (M1). */
  massLoss: z
    .strictObject({ bands: z.array(massLossBandSchema).min(1, { error: 'the mass-loss limit needs at least one band' }).max(10) })
    .superRefine((limit, ctx) => {
      limit.bands.forEach((band, index) => {
        const last = index === limit.bands.length - 1;
        if (!last && band.upToG === undefined) {
          ctx.addIssue({ code: 'custom', path: ['bands', index, 'upToG'], message: 'every band but the last needs an upper edge in g' });
        }
        if (last && band.upToG !== undefined) {
          ctx.addIssue({ code: 'custom', path: ['bands', index, 'upToG'], message: 'the last band has no upper edge: it takes every heavier cell' });
        }
        const before = limit.bands[index - 1]?.upToG;
        if (band.upToG !== undefined && before !== undefined && band.upToG <= before) {
          ctx.addIssue({ code: 'custom', path: ['bands', index, 'upToG'], message: 'the bands must go from light to heavy cells' });
        }
      });
    })
    .optional(),
  /** Open-circuit voltage after at least this share of the voltage before. */
  openCircuitVoltage: z.strictObject({ atLeastPercentOfBefore: percent('the share of the voltage before') }).optional(),
  /** The visual outcomes that must be confirmed as none seen. */
  visual: z
    .array(z.enum(visualOutcomes, { error: explainTypeError(`a visual outcome is one of ${visualOutcomes.join(', ')}`) }))
    .min(1, { error: 'name at least one visual outcome, or leave the visual criterion out' })
    .optional(),
});
export type ObservationCriteria = z.infer<typeof observationCriteriaSchema>;

/** Where the band of a cell of `massG` lies: its index and its limit, or null when no band takes it. */
export function findMassLossBand(bands: readonly MassLossBand[], massG: number): { index: number; band: MassLossBand } | null {
  for (let index = 0; index < bands.length; index += 1) {
    const band = bands[index] as MassLossBand;
    if (band.upToG === undefined) return { index, band };
    if (massG < band.upToG || (band.upToIncluded === true && massG === band.upToG)) return { index, band };
  }
  return null;
}

const g = (value: number) => `${formatNumber(value, { maxDecimals: 3 })} g`;
const pct = (value: number) => `${formatNumber(value, { maxDecimals: 3 })} %`;

/** The range of masses a band covers, in words: "below 1 g", "1 g to 75 g", "above 75 g". */
export function describeMassLossBand(bands: readonly MassLossBand[], index: number): string {
  const band = bands[index];
  const before = bands[index - 1];
  if (band === undefined) return '';
  const lower = before?.upToG === undefined ? null : { g: before.upToG, included: before.upToIncluded !== true };
  const upper = band.upToG === undefined ? null : { g: band.upToG, included: band.upToIncluded === true };
  if (lower === null && upper === null) return 'any mass';
  if (lower === null && upper !== null) return upper.included ? `${g(upper.g)} or less` : `below ${g(upper.g)}`;
  if (lower !== null && upper === null) return lower.included ? `${g(lower.g)} or more` : `above ${g(lower.g)}`;
  if (lower === null || upper === null) return '';
  const from = lower.included ? `from ${g(lower.g)}` : `above ${g(lower.g)}`;
  const to = upper.included ? `up to ${g(upper.g)}` : `below ${g(upper.g)}`;
  return `${from} ${to}`;
}

/** Every band in words: "below 1 g: at most 0.5 %; …". */
export function describeMassLossBands(bands: readonly MassLossBand[]): string {
  return bands.map((band, index) => `${describeMassLossBand(bands, index)}: at most ${pct(band.maxLossPercent)}`).join('; ');
}

/** An observation step's criteria in one line, for the procedure's views. */
export function describeObservationCriteria(criteria: ObservationCriteria | undefined): string[] {
  if (criteria === undefined) return [];
  return [
    ...(criteria.massLoss ? [`mass loss at most (by the mass before) ${describeMassLossBands(criteria.massLoss.bands)}`] : []),
    ...(criteria.openCircuitVoltage ? [`open-circuit voltage at least ${pct(criteria.openCircuitVoltage.atLeastPercentOfBefore)} of the voltage before`] : []),
    ...(criteria.visual ? [criteria.visual.map((outcome) => VISUAL_OUTCOME_WORDS[outcome].toLowerCase()).join(', ')] : []),
  ];
}

export const observationFieldsSchema = {
  records: z
    .array(z.enum(observedQuantities, { error: explainTypeError(`an observation is one of ${observedQuantities.join(', ')}`) }))
    .min(1, { error: 'an observation step records at least one thing' })
    .refine((list) => new Set(list).size === list.length, { error: 'each thing is recorded once' }),
  /** The earlier observation step the criteria compare with (the values before the test). */
  compareWith: identifierSchema.optional(),
  criteria: observationCriteriaSchema.optional(),
};

type IssueSink = { addIssue: (issue: { code: 'custom'; path: (string | number)[]; message: string }) => void };

interface ObservationLike {
  kind: 'observe';
  id: string;
  records: readonly ObservedQuantity[];
  compareWith?: string | undefined;
  criteria?: ObservationCriteria | undefined;
}

/**
 * An observation's criteria need what they judge: mass loss and the voltage share need an earlier
 * observation step (`compareWith`) that records the same quantity, and both steps must record it.
 */
export function checkObservationSteps(steps: readonly { kind: string; id: string }[], ctx: IssueSink): void {
  steps.forEach((candidate, index) => {
    if (candidate.kind !== 'observe') return;
    const step = candidate as ObservationLike;
    const path = (...rest: (string | number)[]) => ['steps', index, ...rest];
    const earlier = step.compareWith === undefined ? undefined : steps.slice(0, index).find((s) => s.id === step.compareWith);
    if (step.compareWith !== undefined) {
      if (earlier === undefined) {
        ctx.addIssue({ code: 'custom', path: path('compareWith'), message: `"${step.compareWith}" is not an observation step before this one` });
      } else if (earlier.kind !== 'observe') {
        ctx.addIssue({ code: 'custom', path: path('compareWith'), message: `"${step.compareWith}" is not an observation step` });
      }
    }
    const before = earlier?.kind === 'observe' ? (earlier as ObservationLike) : undefined;
    const needs = (quantity: ObservedQuantity, key: 'massLoss' | 'openCircuitVoltage', words: string) => {
      if (step.criteria?.[key] === undefined) return;
      if (!step.records.includes(quantity)) {
        ctx.addIssue({ code: 'custom', path: path('criteria', key), message: `the ${words} criterion needs this step to record the ${words === 'mass-loss' ? 'mass' : 'open-circuit voltage'}` });
      }
      if (step.compareWith === undefined) {
        ctx.addIssue({ code: 'custom', path: path('compareWith'), message: `the ${words} criterion compares with an earlier observation step: choose it` });
      } else if (before !== undefined && !before.records.includes(quantity)) {
        ctx.addIssue({ code: 'custom', path: path('compareWith'), message: `"${before.id}" does not record the ${words === 'mass-loss' ? 'mass' : 'open-circuit voltage'}` });
      }
    };
    needs('mass', 'massLoss', 'mass-loss');
    needs('openCircuitVoltage', 'openCircuitVoltage', 'open-circuit voltage');
    if (step.criteria?.visual !== undefined && !step.records.includes('visual')) {
      ctx.addIssue({ code: 'custom', path: path('criteria', 'visual'), message: 'the visual criterion needs this step to record the visual state' });
    }
  });
}

/** Steps whose current the cycler logs; a procedure of observations (with measurements or soaks) alone needs no data log. */
const LOGGED_STEP_KINDS: ReadonlySet<string> = new Set(['charge', 'discharge', 'rest', 'pulse']);
export function needsDataLog(procedure: { steps: readonly { kind: string }[] }): boolean {
  return procedure.steps.some((step) => LOGGED_STEP_KINDS.has(step.kind));
}
