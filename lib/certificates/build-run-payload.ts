import { describeObservedValues, summariseEnduranceCycles, type EnduranceResult, formatRetentionBasis, listCountedReadings, listRetentionRows, type ChargeRetentionResult, type Finding, type ObservationsResult, type StepRecord, type StoredEvaluation } from "@/lib/conformance";
import type { CellSpecification, ProcedureResolution, StoredDecisionRule } from "@/protocols";
import { hashCanonicalJson } from "./canonical-json";
import { formatMomentsInText } from "./certificate-format";
import {
  CERTIFICATE_PAYLOAD_FORMAT,
  type CertificateAmbient,
  type CertificateCriterion,
  type CertificateEndurance,
  type CertificateFinding,
  type CertificateInstrument,
  type CertificateObservations,
  type CertificateRetention,
  type CertificateSetPointCurrent,
  type CertificateStepResult,
  type CertificateUncertainty,
  type RunCertificatePayload,
  type SignatureStatement,
} from "./certificate-payload";
import { listEvaluationFindings, type AcknowledgedDeviation } from "./review-coverage";

/** An evaluation as stored, read in today's shape (lib/conformance/stored-evaluation.ts). */
export type { StoredEvaluation };

/** The decision rule an evaluation applied, as its record names it (older records may use an earlier name). */
export function readDecisionRule(evaluation: StoredEvaluation): StoredDecisionRule {
  return evaluation.statedDecisionRule;
}

/** Observations as the records show them; each criterion names its rule, the recorded numbers and its source. */
function describeObservations(observations: ObservationsResult): CertificateObservations {
  return {
    records: observations.records.map((record) => ({ stepLabel: record.label, rows: describeObservedValues(record.observed) })),
    criteria: observations.criteria.map((criterion) => ({
      name: `${criterion.kind[0]?.toUpperCase() ?? ""}${criterion.kind.slice(1)} on "${criterion.label}"`,
      rule: criterion.rule,
      observed: criterion.observed,
      outcome: criterion.outcome,
      source: criterion.source,
    })),
    decisionRule: observations.decisionRule,
  };
}

const ENDURANCE_STATUS: Record<EnduranceResult["status"], string> = {
  stopped: "stopped by the stop criterion",
  completed: "all cycles completed",
  "in progress": "in progress when evaluated",
};

/** The endurance block as the log shows it: its criteria in words and a summary of its cycles. */
function describeEndurance(endurance: EnduranceResult): CertificateEndurance {
  return {
    blockLabel: endurance.label,
    maxCycles: endurance.maxCycles,
    cyclesLogged: endurance.cyclesLogged,
    checks: endurance.checkEveryCycles === null ? "every cycle's capacity counts" : `a capacity check every ${endurance.checkEveryCycles} cycles`,
    status: ENDURANCE_STATUS[endurance.status],
    stop: `Stop criterion: capacity below ${endurance.stopBelowPercentOfRated} % of the rated capacity. ${endurance.stop.statement}`,
    acceptance: { outcome: endurance.acceptance.outcome, statement: endurance.acceptance.statement, clause: endurance.acceptance.clause },
    cycles: summariseEnduranceCycles(endurance).map((cycle) => ({
      cycle: cycle.cycle,
      capacityCheck: endurance.checkEveryCycles !== null && cycle.capacityCheck,
      dischargeMAh: cycle.dischargeCapacityAh === null ? null : cycle.dischargeCapacityAh * 1000,
      percentOfRated: cycle.percentOfRated,
    })),
    cyclesInAll: endurance.cycles.length,
  };
}

/** Retention and recovery as the certificate states them: the basis once, each percentage with its statement. */
function describeRetention(retention: ChargeRetentionResult): CertificateRetention {
  return {
    basis: formatRetentionBasis(retention),
    rows: listRetentionRows(retention).map(({ name, share }) => ({
      name,
      stepLabel: share.label,
      capacityMAh: share.capacityAh === null ? null : share.capacityAh * 1000,
      percent: share.percent,
      statement: share.statement,
    })),
  };
}

export interface RecordedInstrument {
  identifier: string;
  kind: string;
  serial: string;
  calibrationCertificate: string;
  calibratedOn: string;
  dueOn: string;
  usedFor: "run" | "ambient readings";
}

/** Everything a run certificate states, gathered from the records (lib/certificates/gather-run-records.ts). */
export interface RunCertificateRecords {
  number: string;
  issuedAt: Date;
  lab: { name: string; address: string; accreditation: string | null };
  customer: string | null;
  replaces: { number: string; reason: string } | null;
  run: { number: string; procedureSource: { standard: string; clause: string }; resolution: ProcedureResolution };
  procedure: { code: string; title: string; version: number };
  specimen: { identifier: string; receivedOn: string; conditionOnReceipt: string };
  lot: { identifier: string; supplier: string; receivedOn: string } | null;
  cell: { maker: string; model: string; designation: string; data: CellSpecification };
  instruments: RecordedInstrument[];
  stepRecords: StepRecord[];
  evaluation: { evaluatedAt: Date; value: StoredEvaluation; stored: unknown };
  logs: { fileName: string; sha256: string; sizeBytes: number; samples: number; uploadedAt: Date; part?: number; span?: string }[];
  review: { printedName: string; signedAt: Date; comments: string; acknowledged: AcknowledgedDeviation[] };
  approval: { printedName: string; signedAt: Date };
  meaningWords: { reviewed: string; approved: string };
}

export const RESULTS_RELATE_TO_ITEM = "The results relate only to the item tested, as received.";
export const NO_EXTERNAL_PROVIDERS = "No result on this certificate comes from an external provider.";
export const REPRODUCTION = "This certificate may be copied in full only; an extract needs the laboratory's written consent.";

/** First and last moment any step record names. */
export function findTestingSpan(records: readonly Pick<StepRecord, "startedAt" | "endedAt" | "ambientReadings">[]): { from: string | null; to: string | null } {
  const times = records.flatMap((r) => [r.startedAt, r.endedAt, ...r.ambientReadings.filter((a) => !a.struck).map((a) => a.at)]).filter((t): t is string => Boolean(t));
  const ms = times.map((t) => Date.parse(t)).filter(Number.isFinite);
  if (ms.length === 0) return { from: null, to: null };
  return { from: new Date(Math.min(...ms)).toISOString(), to: new Date(Math.max(...ms)).toISOString() };
}

/** A calibration covers the testing when every day of it falls within [calibrated on, due on]. */
function coversTesting(instrument: RecordedInstrument, testing: { from: string | null; to: string | null }): boolean {
  if (testing.from === null || testing.to === null) return false;
  return instrument.calibratedOn <= testing.from.slice(0, 10) && testing.to.slice(0, 10) <= instrument.dueOn;
}

type Span = { from: string | null; to: string | null };

/**
 * The dates of testing (ISO/IEC 17025:2017 7.8.2.1 i) from what happened: the data log's first and
 * last sample on the wall clock when the evaluation knows the log's start, with the step sheet's
 * recorded span beside it; without such a log, the step sheet's span, saying so.
 */
export function findDatesOfTesting(evaluation: StoredEvaluation, stepRecords: RunCertificateRecords["stepRecords"]): RunCertificatePayload["testing"] {
  const stepSheet = findTestingSpan(stepRecords);
  const log = evaluation.logSpan;
  if (log === undefined) return { ...stepSheet, source: "from the step sheet's recorded times: no data log with a known start time was evaluated", stepSheet: null };
  const source =
    log.startedFrom === "log timestamps"
      ? "from the data log's first and last sample (the log's own timestamps)"
      : "from the data log's first and last sample (its elapsed time, laid from the first step start recorded on the step sheet)";
  return { from: log.from, to: log.to, source, stepSheet };
}

/** Both spans, so an instrument's calibration is checked over every moment either names. */
function widestSpan(testing: RunCertificatePayload["testing"]): Span {
  const moments = [testing.from, testing.to, testing.stepSheet?.from ?? null, testing.stepSheet?.to ?? null].filter((t): t is string => t !== null).sort();
  return moments.length === 0 ? { from: null, to: null } : { from: moments[0] as string, to: moments[moments.length - 1] as string };
}

function labelOf(evaluation: StoredEvaluation, stepId: string | null, cycle: number | null): string {
  if (stepId === null) return "the run as a whole";
  const label = evaluation.steps.find((s) => s.stepId === stepId)?.label ?? stepId;
  const cycles = new Set(evaluation.steps.filter((s) => s.stepId === stepId).map((s) => s.cycle));
  return cycles.size > 1 && cycle !== null ? `${label}, cycle ${cycle}` : label;
}

function describeFinding(evaluation: StoredEvaluation, finding: Finding, note: string | null): CertificateFinding {
  return {
    findingId: finding.id,
    where: labelOf(evaluation, finding.stepId, finding.cycle),
    title: finding.title,
    // One timestamp form throughout the certificate (ISO 8601 with zone, to the minute): findings write raw ISO moments.
    expected: formatMomentsInText(finding.expected.text),
    observed: formatMomentsInText(finding.observed.text),
    clause: finding.clause,
    reviewerNote: note,
  };
}

function summariseAmbient(evaluation: StoredEvaluation, records: readonly StepRecord[], resolution: ProcedureResolution): CertificateAmbient[] {
  return evaluation.steps.flatMap((step): CertificateAmbient[] => {
    const resolved = resolution.steps.find((s) => s.id === step.stepId);
    if (!resolved) return [];
    // Struck readings and values no ambient can take never enter the mean (issue 12, 7d).
    const recorded = records.find((r) => r.stepId === step.stepId && r.cycle === step.cycle)?.ambientReadings ?? [];
    const readings = listCountedReadings(recorded).map((a) => a.celsius);
    const ambientFindings = step.findings.filter((f) => f.rule === "ambient-in-range");
    const outcome = ambientFindings.some((f) => f.outcome === "deviates")
      ? "deviates"
      : ambientFindings.some((f) => f.outcome === "not assessable")
        ? "not assessable"
        : ambientFindings.length > 0
          ? "meets"
          : null;
    return [
      {
        stepId: step.stepId,
        cycle: step.cycle,
        label: labelOf(evaluation, step.stepId, step.cycle),
        requiredMinC: resolved.ambient.minC,
        requiredMaxC: resolved.ambient.maxC,
        readings: readings.length,
        minC: readings.length ? Math.min(...readings) : null,
        maxC: readings.length ? Math.max(...readings) : null,
        meanC: readings.length ? readings.reduce((s, x) => s + x, 0) / readings.length : null,
        outcome,
      },
    ];
  });
}

/**
 * The set-point current(s) of a measured step, in A and as a multiple of It = Cn / 1 h (IEC 61434,
 * docs/references.md §1): the programmed value the operator recorded, else the procedure's resolved one.
 */
export function describeSetPointCurrents(
  step: { stepId: string; cycle: number },
  resolution: ProcedureResolution,
  records: readonly StepRecord[],
  ratedCapacityMAh: number,
): CertificateSetPointCurrent[] {
  const resolved = resolution.steps.find((s) => s.id === step.stepId);
  const programmed = records.find((r) => r.stepId === step.stepId && r.cycle === step.cycle)?.programmed ?? {};
  const it = ratedCapacityMAh / 1000;
  if (!resolved || !(it > 0)) return [];
  const fields =
    resolved.kind === "charge" || resolved.kind === "discharge"
      ? ([["current", "current", resolved.current]] as const)
      : resolved.kind === "pulse"
        ? ([
            ["baseCurrent", "base current", resolved.baseCurrent],
            ["pulseCurrent", "pulse current", resolved.pulseCurrent],
          ] as const)
        : [];
  return fields.flatMap(([field, name, target]): CertificateSetPointCurrent[] => {
    const entered = programmed[field];
    const currentA = entered ?? target?.value;
    if (currentA === undefined) return [];
    return [{ name, currentA, itMultiple: currentA / it, from: entered !== undefined ? "as programmed" : "from the procedure" }];
  });
}

function listResults(evaluation: StoredEvaluation, resolution: ProcedureResolution, records: readonly StepRecord[], ratedCapacityMAh: number): CertificateStepResult[] {
  return evaluation.steps.flatMap((step): CertificateStepResult[] => {
    const r = step.results;
    if (!r || step.kind === "rest" || step.kind === "soak" || step.kind === "measure") return [];
    return [
      {
        stepId: step.stepId,
        cycle: step.cycle,
        label: labelOf(evaluation, step.stepId, step.cycle),
        kind: step.kind,
        durationS: r.durationS,
        capacityMAh: r.capacityMAh,
        energyWh: r.energyWh,
        meanVoltageV: r.meanVoltageV,
        endVoltageV: r.endVoltageV,
        maxTemperatureC: r.maxTemperatureC,
        dcResistanceOhm: step.dcResistance?.resistanceOhm ?? null,
        beyondRating: step.findings.some((f) => f.beyondRating === true),
        setPoints: describeSetPointCurrents(step, resolution, records, ratedCapacityMAh),
      },
    ];
  });
}

function listCriteria(evaluation: StoredEvaluation): CertificateCriterion[] {
  return evaluation.conformity.map((entry) => {
    const result = evaluation.acceptance.find((a) => a.criterionId === entry.criterionId && a.cycle === entry.cycle);
    const stepId = result?.stepId ?? null;
    return {
      criterionId: entry.criterionId,
      stepLabel: stepId === null ? entry.criterionId : labelOf(evaluation, stepId, entry.cycle),
      cycle: entry.cycle,
      requirement: result?.limit?.text ?? "limit not resolved",
      measured: result?.measured?.text ?? null,
      outcome: entry.outcome,
      statement: entry.statement,
    };
  });
}

function listUncertainty(evaluation: StoredEvaluation): CertificateUncertainty[] {
  return (evaluation.uncertainty ?? []).map((entry) => ({
    stepId: entry.stepId,
    cycle: entry.cycle,
    stepLabel: labelOf(evaluation, entry.stepId, entry.cycle),
    quantity: entry.quantity,
    budget: entry.budget,
  }));
}

function listInstruments(records: RunCertificateRecords, testing: { from: string | null; to: string | null }): CertificateInstrument[] {
  return records.instruments.map((i) => ({
    identifier: i.identifier,
    kind: i.kind,
    serial: i.serial,
    calibrationCertificate: i.calibrationCertificate,
    calibratedOn: i.calibratedOn,
    dueOn: i.dueOn,
    calibratedForTesting: coversTesting(i, testing),
    usedFor: i.usedFor,
  }));
}

export function sign(printedName: string, meaning: "reviewed" | "approved", meaningWords: string, signedAt: Date): SignatureStatement {
  return { printedName, meaning, meaningWords, signedAt: signedAt.toISOString() };
}

/** The cell as a certificate states it: identity and the datasheet values the results are read against. */
export function describeCertifiedCell(source: { maker: string; model: string; designation: string; data: CellSpecification }) {
  const cell = source.data;
  return {
    maker: source.maker,
    model: source.model,
    designation: source.designation,
    chemistry: cell.chemistry.label,
    ratedCapacityMah: cell.ratedCapacityMah,
    minimumCapacityMah: cell.minimumCapacityMah ?? null,
    nominalVoltageV: cell.nominalVoltageV,
    chargeVoltageV: cell.chargeVoltageV,
    endOfDischargeVoltageV: cell.endOfDischargeVoltageV,
  };
}

/**
 * The payload of a run certificate from the gathered records. Pure: the same records give the same
 * payload (and hash). It does not decide whether a certificate may be issued; issue-certificate.ts does.
 */
export function buildRunCertificatePayload(records: RunCertificateRecords): RunCertificatePayload {
  const evaluation = records.evaluation.value;
  const findings = listEvaluationFindings(evaluation);
  const notes = new Map(records.review.acknowledged.map((a) => [a.findingId, a.note.trim()]));
  const testing = findDatesOfTesting(evaluation, records.stepRecords);
  const count = (outcome: Finding["outcome"]) => findings.filter((f) => f.outcome === outcome).length;
  return {
    format: CERTIFICATE_PAYLOAD_FORMAT,
    subject: "run",
    title: "Test certificate",
    number: records.number,
    issuedAt: records.issuedAt.toISOString(),
    lab: records.lab,
    placeOfWork: `At the laboratory's premises: ${records.lab.address}`,
    customer: records.customer,
    replaces: records.replaces,
    statements: { resultsRelateToItem: RESULTS_RELATE_TO_ITEM, externalProviders: NO_EXTERNAL_PROVIDERS, reproduction: REPRODUCTION },
    approval: sign(records.approval.printedName, "approved", records.meaningWords.approved, records.approval.signedAt),
    run: { number: records.run.number },
    item: {
      specimen: records.specimen,
      lot: records.lot,
      cell: describeCertifiedCell(records.cell),
    },
    sampling: records.lot
      ? `Not applicable: the specimen was tested as submitted from lot ${records.lot.identifier}; this certificate makes no statement about the lot.`
      : "Not applicable: the specimen was tested as submitted.",
    method: {
      code: records.procedure.code,
      title: records.procedure.title,
      version: records.procedure.version,
      standard: records.run.procedureSource.standard,
      clause: records.run.procedureSource.clause,
      note: evaluation.evaluatedAgainst.otherThanRunVersion ? (evaluation.verdict.reasons[0] ?? "judged against another procedure version") : null,
    },
    testing,
    conditions: summariseAmbient(evaluation, records.stepRecords, records.run.resolution),
    instruments: listInstruments(records, widestSpan(testing)),
    results: listResults(evaluation, records.run.resolution, records.stepRecords, records.cell.data.ratedCapacityMah),
    ...(evaluation.retention && { retention: describeRetention(evaluation.retention) }),
    ...(evaluation.observations && { observations: describeObservations(evaluation.observations) }),
    ...(evaluation.endurance && { endurance: describeEndurance(evaluation.endurance) }),
    conformity: {
      decisionRule: readDecisionRule(evaluation),
      specimenConforms: evaluation.verdict.specimenConforms,
      procedureFollowed: evaluation.verdict.procedureFollowed,
      beyondRating: evaluation.verdict.beyondRating,
      criteria: listCriteria(evaluation),
    },
    uncertainty: listUncertainty(evaluation),
    uncertaintyNotEvaluated: (evaluation.uncertaintyNotEvaluated ?? []).map((entry) => ({
      stepLabel: labelOf(evaluation, entry.stepId, entry.cycle),
      quantity: entry.quantity,
      reason: entry.reason,
    })),
    deviations: findings.filter((f) => f.outcome === "deviates").map((f) => describeFinding(evaluation, f, notes.get(f.id) ?? null)),
    notAssessable: findings.filter((f) => f.outcome === "not assessable").map((f) => describeFinding(evaluation, f, null)),
    checks: { total: findings.length, meets: count("meets"), deviates: count("deviates"), notAssessable: count("not assessable") },
    evidence: {
      evaluatedAt: records.evaluation.evaluatedAt.toISOString(),
      evaluationSha256: hashCanonicalJson(records.evaluation.stored),
      logs: records.logs.map((l) => ({
        fileName: l.fileName,
        sha256: l.sha256,
        sizeBytes: l.sizeBytes,
        samples: l.samples,
        uploadedAt: l.uploadedAt.toISOString(),
        ...(l.part === undefined ? {} : { part: l.part, span: l.span }),
      })),
    },
    review: { ...sign(records.review.printedName, "reviewed", records.meaningWords.reviewed, records.review.signedAt), comments: records.review.comments },
  };
}
