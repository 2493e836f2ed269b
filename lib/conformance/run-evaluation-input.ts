import { z } from "zod";
import type { LogColumns } from "@/lib/analysis";
import { accuracySpecificationSchema } from "@/lib/instruments/accuracy";
import { INSTRUMENT_KINDS } from "@/lib/instruments/instrument-kind";
import { decisionRuleSchema, type CellSpecification, type FieldProblem, type ProcedureResolution } from "@/protocols";
import { recordedTimeSchema, stepRecordSchema, type StepRecord, type StepRecordInput } from "./step-record";

const positive = (what: string) =>
  z.number({ error: `${what} is a number` }).positive({ error: `${what} must be greater than 0` });
const notNegative = (what: string) =>
  z.number({ error: `${what} is a number` }).nonnegative({ error: `${what} must not be negative` });

/** The cell's rating as its datasheet states it: the limits the run must stay inside. */
export const cellRatingSchema = z.strictObject({
  maxContinuousDischargeCurrentA: positive("the maximum continuous discharge current"),
  maxChargeCurrentA: positive("the maximum charge current").optional(),
  /** The charge limit when no maximum is stated, as when the procedure was resolved. */
  standardChargeCurrentA: positive("the standard charge current").optional(),
  chargeVoltageV: positive("the charge voltage"),
});

export type CellRating = z.infer<typeof cellRatingSchema>;

/** The rating fields of a cell specification. */
export function readCellRating(cell: CellSpecification): CellRating {
  return {
    maxContinuousDischargeCurrentA: cell.maxContinuousDischargeCurrentA,
    ...(cell.maxChargeCurrentA !== undefined && { maxChargeCurrentA: cell.maxChargeCurrentA }),
    standardChargeCurrentA: cell.standardChargeCurrentA,
    chargeVoltageV: cell.chargeVoltageV,
  };
}

const segmentOptionsSchema = z.strictObject({
  restCurrentA: notNegative("the rest current").optional(),
  minPhaseSamples: z.number().int().min(1).optional(),
  minPhaseDurationS: notNegative("the shortest phase").optional(),
  cvVoltageToleranceV: positive("the CV voltage tolerance").optional(),
  cvMinCurrentDrop: z.number().gt(0).lt(1).optional(),
  pulse: z
    .strictObject({
      levelChangeRatio: positive("the level change ratio").optional(),
      minLevelStepA: notNegative("the smallest level step").optional(),
      minLevelSamples: z.number().int().min(1).optional(),
    })
    .optional(),
});

/**
 * Settings of an evaluation. The allowances are our own defaults, not taken from a standard; a lab
 * may set its own. The decision rule is not a setting: it is the procedure's (its resolution's), and
 * the expanded uncertainties come from the run's instruments (evaluate-uncertainty.ts).
 */
export const evaluationOptionsSchema = z.strictObject({
  /** A pause between two steps longer than this needs a recorded reason, s. */
  gapAllowanceS: notNegative("the pause allowance").default(600),
  /** Recorded step times and the log's phase times may differ by this much, s (hand-noted times). */
  timeAgreementS: notNegative("the time agreement").default(300),
  /**
   * Time, in total, that a constant-current part may spend outside the current tolerance (switching
   * transients last seconds: common practice), s. A duration, not a share of samples: 2 % of a 5 h
   * discharge would be 6 min off-current.
   */
  currentExcursionAllowanceS: notNegative("the off-current allowance").default(10),
  /**
   * How far a logged charge voltage may read above its limit before it counts as above it: the noise
   * of a logged constant-voltage hold, V (our own default, common practice). Not a percentage: the
   * ±1 % of IEC 61960-3 clause 4 is a measurement tolerance, not a charge limit.
   */
  chargeVoltageReadingAllowanceV: notNegative("the charge voltage reading allowance").default(0.005),
  /** No longer used (the allowance was a share of samples); kept so settings stored with it still read. */
  currentOutlierShare: z.number().min(0).max(1).optional(),
  /** How the log is cut into phases (lib/analysis segment options). */
  segment: segmentOptionsSchema.optional(),
});

export type EvaluationOptions = z.output<typeof evaluationOptionsSchema>;
export type EvaluationOptionsInput = z.input<typeof evaluationOptionsSchema>;

/** Which procedure version the run is judged against; passed through so a re-evaluation is marked. */
export const evaluatedAgainstSchema = z.strictObject({
  /** The version whose resolution is evaluated. */
  procedureVersionId: z.string().trim().min(1).max(100).optional(),
  /** The version the run was carried out under. */
  runProcedureVersionId: z.string().trim().min(1).max(100).optional(),
  note: z.string().max(2000).optional(),
});

export type EvaluatedAgainst = z.infer<typeof evaluatedAgainstSchema>;

/** The standard and clause the procedure implements, cited on its findings. */
export const procedureSourceSchema = z.strictObject({
  standard: z.string().trim().min(1).max(100),
  clause: z.string().trim().min(1).max(100),
});

export type ProcedureSource = z.infer<typeof procedureSourceSchema>;

/** The parts of an evaluation that are stored as JSON with the run. */
export const storedRunEvaluationSchema = z.strictObject({
  cellRating: cellRatingSchema,
  stepRecords: z.array(stepRecordSchema).max(10_000),
  /** The wall-clock time of the log's first sample (timeS = 0). */
  logStartedAt: recordedTimeSchema.optional(),
  /** Where logStartedAt comes from: the log's own timestamps, or (elapsed-time logs) the first recorded step start. */
  logStartedFrom: z.enum(["log timestamps", "first recorded step start"]).optional(),
  procedureSource: procedureSourceSchema.optional(),
  options: evaluationOptionsSchema.prefault({}),
  evaluatedAgainst: evaluatedAgainstSchema.default({}),
});

export type StoredRunEvaluation = z.output<typeof storedRunEvaluationSchema>;

/**
 * One instrument the run used, as the register states it. A cycler channel's current, voltage and
 * time accuracies enter the capacity, energy and DC-resistance budgets; other kinds do not measure the log.
 */
export const runInstrumentSchema = z.strictObject({
  identifier: z.string({ error: "the identifier is text" }).trim().min(1, { error: "the identifier is required" }).max(100),
  kind: z.enum(INSTRUMENT_KINDS, { error: `the kind is one of ${INSTRUMENT_KINDS.join(", ")}` }),
  accuracy: accuracySpecificationSchema,
});

export type RunInstrument = z.infer<typeof runInstrumentSchema>;

const runInstrumentsSchema = z.array(runInstrumentSchema).max(100, { error: "at most 100 instruments" });

export interface RunEvaluationInput {
  /** The procedure version resolved against the run's cell specification (protocols' resolveProcedure). */
  resolution: ProcedureResolution;
  cellRating: CellRating;
  stepRecords: readonly StepRecordInput[];
  log?: LogColumns;
  logStartedAt?: string;
  logStartedFrom?: "log timestamps" | "first recorded step start";
  procedureSource?: ProcedureSource;
  options?: EvaluationOptionsInput;
  evaluatedAgainst?: EvaluatedAgainst;
  /** The run's instruments from the register; none given means no uncertainty budget can be made. */
  instruments?: readonly RunInstrument[];
}

/** The input with its stored parts checked and defaults filled in. */
export interface CheckedRunEvaluationInput extends StoredRunEvaluation {
  resolution: ProcedureResolution;
  stepRecords: StepRecord[];
  log?: LogColumns;
  instruments: RunInstrument[];
}

export type RunEvaluationInputCheck = { ok: true; value: CheckedRunEvaluationInput } | { ok: false; problems: FieldProblem[] };

/** Checks the stored parts of an evaluation input; each problem names its field path. */
export function checkRunEvaluationInput(input: RunEvaluationInput): RunEvaluationInputCheck {
  if (typeof input !== "object" || input === null) {
    return { ok: false, problems: [{ path: "", message: "the evaluation input is an object" }] };
  }
  const problems: FieldProblem[] = [];
  const resolution = input.resolution as Partial<ProcedureResolution> | undefined;
  if (typeof resolution !== "object" || resolution === null || !Array.isArray(resolution.steps) || !Array.isArray(resolution.acceptance)) {
    problems.push({ path: "resolution", message: "the resolution is the result of resolving the procedure version on the cell specification" });
  } else if (resolution.decisionRule !== undefined && !decisionRuleSchema.safeParse(resolution.decisionRule).success) {
    problems.push({ path: "resolution.decisionRule", message: "the decision rule is simple acceptance, binary guard band or non-binary guard band" });
  }
  const parsed = storedRunEvaluationSchema.safeParse({
    cellRating: input.cellRating,
    stepRecords: input.stepRecords,
    logStartedAt: input.logStartedAt,
    logStartedFrom: input.logStartedFrom,
    procedureSource: input.procedureSource,
    options: input.options,
    evaluatedAgainst: input.evaluatedAgainst,
  });
  if (!parsed.success) {
    problems.push(...parsed.error.issues.map((issue) => ({ path: issue.path.map(String).join("."), message: issue.message })));
  }
  const instruments = runInstrumentsSchema.safeParse(input.instruments ?? []);
  if (!instruments.success) {
    problems.push(...instruments.error.issues.map((issue) => ({ path: ["instruments", ...issue.path.map(String)].join("."), message: issue.message })));
  }
  if (!parsed.success || !instruments.success || problems.length > 0) return { ok: false, problems };
  return {
    ok: true,
    value: { ...parsed.data, resolution: input.resolution, instruments: instruments.data, ...(input.log !== undefined && { log: input.log }) },
  };
}
