import type { UncertaintyBudget } from "@/lib/analysis/uncertainty";
import type { ConformityOutcome, FindingOutcome, RunVerdict } from "@/lib/conformance";
import type { StoredDecisionRule } from "@/protocols";

/**
 * What a certificate states, as plain JSON. Its canonical form (canonical-json.ts) is hashed and the
 * hash stored with the certificate; the PDF is drawn from it. The items of ISO/IEC 17025:2017
 * 7.8.2.1 a–p and 7.8.3.1 each have a field (docs/references.md §8). Times are ISO 8601 in UTC; calendar
 * dates YYYY-MM-DD; values in SI units as the field names say. Never rename a field: stored payloads
 * keep their shape, and their hashes must recompute.
 */
export const CERTIFICATE_PAYLOAD_FORMAT = "cellwright-certificate-1";

/** A signature as it is shown on the record (21 CFR 11.50): printed name, date and time, meaning. */
export interface SignatureStatement {
  printedName: string;
  meaning: "reviewed" | "approved";
  /** The meaning in words, as printed. */
  meaningWords: string;
  signedAt: string;
}

/** Parts every certificate has, whatever it is about. */
export interface CertificateCommon {
  format: typeof CERTIFICATE_PAYLOAD_FORMAT;
  /** 7.8.2.1 a, c: the title and the unique identification printed on every page. */
  title: string;
  number: string;
  issuedAt: string;
  /** 7.8.2.1 b: the laboratory. */
  lab: { name: string; address: string; accreditation: string | null };
  /** 7.8.2.1 b: where the work was done. */
  placeOfWork: string;
  /** 7.8.2.1 d: null for in-house work. */
  customer: string | null;
  /** 7.8.8: the certificate this one replaces, and why. */
  replaces: { number: string; reason: string } | null;
  /** 7.8.2.1 h, o, p and the wording that must stand on the certificate. */
  statements: { resultsRelateToItem: string; externalProviders: string; reproduction: string };
  /** 7.8.2.1 o: who authorised the certificate. */
  approval: SignatureStatement;
}

export interface CertificateCell {
  maker: string;
  model: string;
  designation: string;
  chemistry: string;
  ratedCapacityMah: number;
  minimumCapacityMah: number | null;
  nominalVoltageV: number;
  chargeVoltageV: number;
  endOfDischargeVoltageV: number;
}

export interface CertificateInstrument {
  identifier: string;
  kind: string;
  serial: string;
  calibrationCertificate: string;
  calibratedOn: string;
  dueOn: string;
  /** The calibration period covers every day of testing. */
  calibratedForTesting: boolean;
  /** Why it is listed: "run" (chosen for the run) or "ambient readings" (named by a reading). */
  usedFor: string;
}

export interface CertificateAmbient {
  stepId: string;
  cycle: number;
  label: string;
  requiredMinC: number;
  requiredMaxC: number;
  readings: number;
  minC: number | null;
  maxC: number | null;
  meanC: number | null;
  outcome: FindingOutcome | null;
}

export interface CertificateStepResult {
  stepId: string;
  cycle: number;
  label: string;
  kind: string;
  durationS: number;
  capacityMAh: number;
  energyWh: number;
  meanVoltageV: number | null;
  endVoltageV: number;
  maxTemperatureC: number | null;
  dcResistanceOhm: number | null;
  /** The step ran outside the cell's rating. */
  beyondRating: boolean;
  /**
   * The set-point current(s) of the step in A and as a multiple of It (It = rated capacity / 1 h,
   * IEC 61434): as the operator programmed them, else as the procedure resolved them. Absent in
   * certificates issued before it was stated.
   */
  setPoints?: CertificateSetPointCurrent[];
}

export interface CertificateSetPointCurrent {
  /** "current", "base current", "pulse current". */
  name: string;
  currentA: number;
  itMultiple: number;
  from: "as programmed" | "from the procedure";
}

export interface CertificateCriterion {
  criterionId: string;
  stepLabel: string;
  cycle: number | null;
  requirement: string;
  measured: string | null;
  outcome: ConformityOutcome;
  statement: string;
}

export interface CertificateUncertainty {
  stepId: string;
  cycle: number;
  stepLabel: string;
  quantity: "capacity" | "energy" | "dc-resistance";
  budget: UncertaintyBudget;
}

export interface CertificateFinding {
  findingId: string;
  where: string;
  title: string;
  expected: string;
  observed: string;
  clause: string;
  /** The reviewer's note on a deviating finding. */
  reviewerNote: string | null;
}

export interface CertificateLog {
  fileName: string;
  sha256: string;
  sizeBytes: number;
  samples: number;
  uploadedAt: string;
  /** For a log sent in parts: the part's place in the log and the time it spans, in words. */
  part?: number;
  span?: string;
}

export interface CertificateRetention {
  /** "Both percentages are of the rated capacity, 3 000 mAh, as the procedure sets (…)." */
  basis: string;
  rows: { name: string; stepLabel: string; capacityMAh: number | null; percent: number | null; statement: string }[];
}

/** Observation steps as the records show them, and each observation criterion with its rule and source. */
export interface CertificateObservations {
  records: { stepLabel: string; rows: { name: string; value: string }[] }[];
  criteria: { name: string; rule: string; observed: string; outcome: ConformityOutcome; source: string | null }[];
  decisionRule: string;
}

/** The endurance block: where the test stood, its stop criterion, its acceptance statement and a summary of the cycles. */
export interface CertificateEndurance {
  blockLabel: string;
  maxCycles: number;
  cyclesLogged: number;
  /** "a capacity check every 50 cycles" or "every cycle's capacity counts". */
  checks: string;
  status: string;
  stop: string;
  acceptance: { outcome: ConformityOutcome; statement: string; clause: string };
  /** The first cycle, every capacity check (every 10th without checks), the stop cycle and the last; capacities in mAh. */
  cycles: { cycle: number; capacityCheck: boolean; dischargeMAh: number | null; percentOfRated: number | null }[];
  /** How many cycles the log holds in all (the table shows a summary). */
  cyclesInAll: number;
}

/** A certificate of one run on one specimen. */
export interface RunCertificatePayload extends CertificateCommon {
  subject: "run";
  run: { number: string };
  item: {
    specimen: { identifier: string; receivedOn: string; conditionOnReceipt: string };
    lot: { identifier: string; supplier: string; receivedOn: string } | null;
    cell: CertificateCell;
  };
  /** 7.8.2.1 k. */
  sampling: string;
  /** 7.8.2.1 e. */
  method: { code: string; title: string; version: number; standard: string; clause: string; note: string | null };
  /**
   * 7.8.2.1 i, dates of testing, ISO 8601 in UTC: the data log's first and last sample when the log's
   * start is known, else the first and last moment the step sheet records; null when nothing was timed.
   * `source` says which (absent in certificates issued before it was stated); `stepSheet` gives the
   * step sheet's own span beside the log's, so a reader sees both where they differ.
   */
  testing: { from: string | null; to: string | null; source?: string; stepSheet?: { from: string | null; to: string | null } | null };
  /** 7.8.3.1 a: the ambient of each step as recorded. */
  conditions: CertificateAmbient[];
  instruments: CertificateInstrument[];
  /** 7.8.2.1 m: results with units. */
  results: CertificateStepResult[];
  /**
   * Charge retention and recovery (IEC 61960-3, clause recalled): each percentage with the basis it is a
   * share of. Absent when the procedure asks for none, and in certificates issued before it was stated.
   */
  retention?: CertificateRetention;
  /** Observation steps and their criteria. Absent when the procedure has none, and in certificates issued before they existed. */
  observations?: CertificateObservations;
  /** The endurance block's cycles and criteria. Absent when the procedure has none, and in certificates issued before blocks existed. */
  endurance?: CertificateEndurance;
  /** 7.8.3.1 b, 7.8.6: the statement of conformity and the decision rule. */
  conformity: {
    /** As the evaluation applied it; certificates of evaluations stored before ILAC-G8's three rules may say "guarded acceptance". */
    decisionRule: StoredDecisionRule;
    specimenConforms: ConformityOutcome;
    procedureFollowed: RunVerdict["procedureFollowed"];
    beyondRating: boolean;
    criteria: CertificateCriterion[];
  };
  /** 7.8.3.1 c: empty when the evaluation carried no uncertainty budget. */
  uncertainty: CertificateUncertainty[];
  /** Results without a budget, and why. */
  uncertaintyNotEvaluated: { stepLabel: string; quantity: string; reason: string }[];
  /** 7.8.2.1 n: deviations from the method, each with the reviewer's note. */
  deviations: CertificateFinding[];
  notAssessable: CertificateFinding[];
  checks: { total: number; meets: number; deviates: number; notAssessable: number };
  /** The raw evidence the results rest on. */
  evidence: { evaluatedAt: string; evaluationSha256: string; logs: CertificateLog[] };
  /** 7.8.1: the review before release. */
  review: SignatureStatement & { comments: string };
}

/** One drawn cell of a lot certificate, in draw order. */
export interface LotCertificateCell {
  /** Tray position 1…lot size. */
  position: number;
  /** Null when no specimen was registered at the position. */
  specimen: string | null;
  /** The reviewed run whose statement of conformity counts; null when the cell was not tested. */
  run: string | null;
  /** The valid certificate of that run, if one was issued. */
  runCertificate: string | null;
  result: "conforms" | "does not conform" | "not decided" | "not tested";
  /** The run's capacity discharge at 0.2 It (its last cycle), null when the run has none. */
  capacityMAh: number | null;
  energyWh: number | null;
  currentA: number | null;
}

/** Capacity statistics of the sample at 0.2 It (lib/lots/results summariseStatistics). */
export interface LotCertificateStatistics {
  currentA: number;
  count: number;
  meanMAh: number;
  standardDeviationMAh: number;
  minMAh: number;
  maxMAh: number;
  ratedCapacityMAh: number;
  countAtOrAboveRated: number;
  shareAtOrAboveRated: number;
  /** The lower limit of Cpl: the datasheet's minimum capacity; null when it gives none. */
  minimumCapacityMAh: number | null;
  cpl: number | null;
  cplFormula: string;
  cplSource: string;
  /** Why Cpl is missing or rough. */
  note: string | null;
}

/**
 * A certificate of a lot (ISO 2859-1 single sampling): the plan, the draw, each drawn cell's result,
 * and the lot decision with its rule. The lot decision rests on the sample (7.8.2.1 k, sampling plan).
 */
export interface LotCertificatePayload extends CertificateCommon {
  subject: "lot";
  lot: { identifier: string; supplier: string; quantityReceived: number; receivedOn: string };
  cell: CertificateCell;
  /** 7.8.2.1 e: the procedures whose statements of conformity judged the cells. */
  method: { acceptanceProcedure: string | null; procedures: { code: string; title: string; version: number; standard: string; clause: string }[] };
  /** 7.8.2.1 k: the sampling plan. */
  samplingPlan: {
    source: string;
    inspectionLevel: string;
    aql: string;
    severity: "normal";
    initialCodeLetter: string;
    codeLetter: string;
    sampleSize: number;
    tableSampleSize: number;
    acceptanceNumber: number;
    rejectionNumber: number;
    hundredPercent: boolean;
    /** Set when n reaches the lot size. */
    hundredPercentNote: string | null;
    explanation: string[];
  };
  draw: { method: "random" | "chosen"; seed: string | null; positions: number[]; drawnAt: string; drawnBy: string; description: string };
  sample: LotCertificateCell[];
  counts: { drawn: number; registered: number; tested: number; nonconforming: number; notDecided: number };
  /** The lot decision of the plan: accept or reject (a pending lot gets no certificate). */
  lotDecision: { verdict: "accept" | "reject"; words: "lot accepted" | "lot rejected"; statement: string; rule: string };
  /** The decision rule(s) each cell's statement of conformity was made under (ILAC-G8). */
  cellDecisionRules: StoredDecisionRule[];
  statistics: LotCertificateStatistics | null;
  /** Why there are no statistics, when there are none. */
  statisticsNote: string | null;
  /** 7.8.2.1 h: first to last recorded moment over the sampled runs. */
  testing: { from: string | null; to: string | null };
  /** The lot decision rests on the sample; results relate only to the cells tested. */
  sampleStatement: string;
  /**
   * How the ISO 2859-1 plan was used: switching rules not applied, a continuing series of lots
   * assumed, and ISO 2859-2 named for an isolated lot. Absent in lot certificates issued before it was stated.
   */
  samplingContext?: string;
}

export type CertificatePayload = RunCertificatePayload | LotCertificatePayload;
