import type { CapacityBasis } from './acceptance-criterion';
import type { ResolvedChargeRetention } from './charge-retention';
import type { StoredDecisionRule } from './decision-rule';
import type { SetPointToleranceName } from './measurement-tolerances';
import type { RepeatRule } from './repeat-rule';
import type { ResolvedTemperatureRange, ResolvedValue } from './resolve-quantity';
import type { ResolvedCycleBlockParts } from './endurance';
import type { ObservationCriteria, ObservedQuantity } from './observation';
import type { DischargePurpose, Measurement } from './step';

/** A tolerance in force for a step and where it was set. */
export interface ResolvedTolerance {
  value: number;
  from: 'step' | 'procedure' | 'IEC 61960-3 clause 4';
}

export type ResolvedTolerances = Record<SetPointToleranceName, ResolvedTolerance>;

/** A set-point the cell specification could not supply is null; an error issue says why. */
export type ResolvedSetPoint = ResolvedValue | null;

interface ResolvedStepBase {
  id: string;
  label: string;
  /** Position in the procedure, 0-based. */
  index: number;
  ambient: ResolvedTemperatureRange;
  tolerances: ResolvedTolerances;
  instructions?: string;
}

export interface ResolvedChargeStep extends ResolvedStepBase {
  kind: 'charge';
  current: ResolvedSetPoint;
  voltage: ResolvedSetPoint;
  termination: { kind: 'current'; current: ResolvedSetPoint } | { kind: 'time'; duration: ResolvedValue };
  maxDuration?: ResolvedValue;
}

export interface ResolvedDischargeStep extends ResolvedStepBase {
  kind: 'discharge';
  purpose: DischargePurpose;
  current: ResolvedSetPoint;
  endVoltage: ResolvedSetPoint;
  maxDuration?: ResolvedValue;
}

export interface ResolvedRestStep extends ResolvedStepBase {
  kind: 'rest';
  minDuration: ResolvedValue;
  maxDuration?: ResolvedValue;
}

/** For a soak the ambient is the soak temperature itself. */
export interface ResolvedSoakStep extends ResolvedStepBase {
  kind: 'soak';
  temperature: ResolvedTemperatureRange;
  minDuration: ResolvedValue;
  maxDuration?: ResolvedValue;
}

export interface ResolvedPulseStep extends ResolvedStepBase {
  kind: 'pulse';
  baseCurrent: ResolvedSetPoint;
  baseDuration: ResolvedValue;
  pulseCurrent: ResolvedSetPoint;
  pulseDuration: ResolvedValue;
}

export interface ResolvedMeasureStep extends ResolvedStepBase {
  kind: 'measure';
  measurement: Measurement;
  frequency?: ResolvedValue;
}

/** Observation criteria hold absolute values (g, %), so they resolve to themselves. */
export interface ResolvedObserveStep extends ResolvedStepBase {
  kind: 'observe';
  records: ObservedQuantity[];
  compareWith?: string;
  criteria?: ObservationCriteria;
}

/** A cycle block: the cycle's set-points, the number of cycles and the stop and acceptance shares. */
export interface ResolvedCycleBlockStep extends ResolvedStepBase, ResolvedCycleBlockParts {
  kind: 'cycle-block';
}

export type ResolvedStep =
  | ResolvedChargeStep
  | ResolvedDischargeStep
  | ResolvedRestStep
  | ResolvedSoakStep
  | ResolvedPulseStep
  | ResolvedMeasureStep
  | ResolvedObserveStep
  | ResolvedCycleBlockStep;

/** Limits in Ah (capacity), s (duration) and Ω (resistance). */
export type ResolvedCriterion =
  | {
      kind: 'capacity';
      id: string;
      stepId: string;
      atLeastPercent: number;
      of: CapacityBasis;
      minimum: ResolvedValue | null;
    }
  | { kind: 'discharge-duration'; id: string; stepId: string; minimum: ResolvedValue }
  | { kind: 'resistance'; id: string; stepId: string; maximum: ResolvedValue | null };

export type ResolutionErrorKind =
  | 'specification-value-missing'
  | 'charge-voltage-above-specification'
  | 'end-voltage-below-specification'
  | 'end-voltage-not-below-charge-voltage'
  | 'termination-current-not-below-charge-current'
  | 'pulse-current-not-above-base-current';

export type CautionKind =
  | 'charge-current-above-rating'
  | 'discharge-current-above-rating'
  | 'charge-below-zero-celsius'
  | 'soak-below-zero-celsius';

/**
 * A problem that stops the procedure from running on this cell. `code` is
 * "<kind>/<step or criterion id>/<field>", stable while ids stay the same.
 */
export interface ResolutionError {
  severity: 'error';
  kind: ResolutionErrorKind;
  code: string;
  /** Dot path into the procedure, e.g. "steps.2.voltage". */
  path: string;
  stepId?: string;
  criterionId?: string;
  message: string;
}

/** A safety caution: the procedure may run only once someone has acknowledged its code. */
export interface ResolutionCaution {
  severity: 'caution';
  kind: CautionKind;
  code: string;
  path: string;
  stepId: string;
  message: string;
  acknowledged: boolean;
}

export interface ProcedureResolution {
  steps: ResolvedStep[];
  acceptance: ResolvedCriterion[];
  /**
   * The procedure's decision rule for its acceptance criteria. Resolutions frozen on runs planned
   * before procedures stated a rule have none, and older ones may name "guarded acceptance": read
   * them with readDecisionRule.
   */
  decisionRule: StoredDecisionRule;
  repeat?: RepeatRule;
  /** Absent when the procedure reports no retention, and in resolutions frozen before it could. */
  retention?: ResolvedChargeRetention;
  errors: ResolutionError[];
  cautions: ResolutionCaution[];
  /** Codes of cautions not yet acknowledged, in step order. */
  cautionsNeedingAcknowledgement: string[];
  /** Acknowledged codes that match no caution of this resolution (e.g. after an edit). */
  unmatchedAcknowledgements: string[];
  /** No errors and every caution acknowledged. */
  ready: boolean;
}
