import type { ColumnType, Generated } from "kysely";

/** Kept exactly in step with migrations/: one interface per table. */
export type Role = "admin" | "engineer" | "operator" | "auditor";

type Timestamp = ColumnType<Date, Date | string, Date | string>;
/** A timestamp column with a database default: optional on insert. */
type DefaultedTimestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type Json = ColumnType<unknown, string | undefined | null, string | null>;
/**
 * A `date` column. pg reads it as a Date at local midnight, so query modules select it as text
 * (`::text`, YYYY-MM-DD) and writes pass the same text: no time zone ever enters a calendar date.
 */
type CalendarDate = ColumnType<Date, string, string>;

export interface LabTable {
  id: Generated<number>;
  name: string;
  address: string;
  accreditation: string | null;
  updated_at: DefaultedTimestamp;
}

export interface AppUserTable {
  id: string;
  email: string;
  display_name: string;
  role: Role;
  password_hash: string;
  active: Generated<boolean>;
  created_at: DefaultedTimestamp;
  updated_at: DefaultedTimestamp;
}

export interface UserSessionTable {
  id: string;
  user_id: string;
  expires_at: Timestamp;
  created_at: DefaultedTimestamp;
  address: ColumnType<string | null, string | null | undefined, string | null>;
  client: ColumnType<string | null, string | null | undefined, string | null>;
}

export interface SignInAttemptTable {
  id: Generated<string>;
  at: DefaultedTimestamp;
  email: string;
  address: string;
  succeeded: boolean;
}

export interface AuditEventTable {
  id: Generated<string>;
  at: DefaultedTimestamp;
  actor_id: string | null;
  actor_label: string;
  action: string;
  entity_type: string | null;
  entity_id: string | null;
  before: Json;
  after: Json;
  detail: Json;
  address: string | null;
  /** Set by the database's chain trigger (migration 0010); whatever is sent is overwritten. */
  chain_position: Generated<string>;
  prev_hash: Generated<string>;
  row_hash: Generated<string>;
}

export type ProcedureStatus = "draft" | "in_review" | "released" | "withdrawn";

export interface StoredFileTable {
  id: Generated<string>;
  storage_key: string;
  original_name: string;
  content_type: string;
  size_bytes: ColumnType<string, number | string, number | string>;
  sha256: string;
  purpose: string;
  /** Null for a log part pushed by a machine (0023). */
  uploaded_by: string | null;
  uploaded_at: DefaultedTimestamp;
}

export interface CellSpecificationTable {
  id: Generated<string>;
  maker: string;
  model: string;
  designation: string;
  data: ColumnType<unknown, string, string>;
  datasheet_file_id: string | null;
  created_by: string;
  created_at: DefaultedTimestamp;
  updated_at: DefaultedTimestamp;
}

export interface ProcedureTable {
  id: Generated<string>;
  code: string;
  created_by: string;
  created_at: DefaultedTimestamp;
}

export interface ProcedureVersionTable {
  id: Generated<string>;
  procedure_id: string;
  number: number;
  status: ColumnType<ProcedureStatus, ProcedureStatus | undefined, ProcedureStatus>;
  title: string;
  definition: ColumnType<unknown, string, string>;
  instructions_doc: ColumnType<unknown, string | null | undefined, string | null>;
  cautions_doc: ColumnType<unknown, string | null | undefined, string | null>;
  acknowledged_cautions: ColumnType<string[], string | undefined, string>;
  author_id: string;
  submitted_by: string | null;
  submitted_at: Date | null;
  released_by: string | null;
  released_at: Date | null;
  withdrawn_by: string | null;
  withdrawn_at: Date | null;
  withdrawal_reason: string | null;
  created_at: DefaultedTimestamp;
  updated_at: DefaultedTimestamp;
}

export type InstrumentKind = "cycler-channel" | "thermometer" | "climate-chamber" | "balance" | "resistance-meter";

export interface InstrumentTable {
  id: Generated<string>;
  kind: InstrumentKind;
  identifier: string;
  serial: string;
  firmware: string | null;
  accuracy: ColumnType<unknown, string, string>;
  calibration_certificate: string;
  calibrated_on: CalendarDate;
  due_on: CalendarDate;
  active: Generated<boolean>;
  log_mapping: Json;
  created_by: string;
  created_at: DefaultedTimestamp;
  updated_at: DefaultedTimestamp;
}

export type InspectionLevel = "S-1" | "S-2" | "S-3" | "S-4" | "I" | "II" | "III";

export interface LotTable {
  id: Generated<string>;
  identifier: string;
  cell_specification_id: string;
  supplier: string;
  quantity_received: number;
  received_on: CalendarDate;
  notes: string | null;
  created_by: string;
  created_at: DefaultedTimestamp;
  updated_at: DefaultedTimestamp;
  customer: ColumnType<string | null, string | null | undefined, string | null>;
  inspection_level: ColumnType<InspectionLevel | null, InspectionLevel | null | undefined, InspectionLevel | null>;
  aql: ColumnType<string | null, string | null | undefined, string | null>;
  severity: ColumnType<"normal" | null, "normal" | null | undefined, "normal" | null>;
  sampling_plan: ColumnType<unknown, string | null | undefined, string | null>;
  acceptance_procedure_id: ColumnType<string | null, string | null | undefined, string | null>;
  plan_set_by: ColumnType<string | null, string | null | undefined, string | null>;
  plan_set_at: ColumnType<Date | null, Date | string | null | undefined, Date | string | null>;
}

export interface SpecimenTable {
  id: Generated<string>;
  identifier: string;
  cell_specification_id: string;
  lot_id: string | null;
  received_on: CalendarDate;
  condition_on_receipt: string;
  notes: string | null;
  created_by: string;
  created_at: DefaultedTimestamp;
  updated_at: DefaultedTimestamp;
  lot_position: ColumnType<number | null, number | null | undefined, number | null>;
}

export type RunStatus = "planned" | "in_progress" | "submitted" | "returned" | "accepted" | "certified" | "abandoned";
type JsonColumn = ColumnType<unknown, string, string>;

export interface RunTable {
  id: Generated<string>;
  number: Generated<string>;
  procedure_version_id: string;
  specimen_id: string;
  operator_id: string;
  status: ColumnType<RunStatus, RunStatus | undefined, RunStatus>;
  resolution: JsonColumn;
  cell_rating: JsonColumn;
  procedure_source: JsonColumn;
  created_at: DefaultedTimestamp;
  started_at: Date | null;
  submitted_at: Date | null;
  updated_at: DefaultedTimestamp;
  abandoned_at: ColumnType<Date | null, Date | null | undefined, Date | null>;
  abandoned_by: ColumnType<string | null, string | null | undefined, string | null>;
  abandon_reason: ColumnType<string | null, string | null | undefined, string | null>;
}

export interface RunInstrumentTable {
  run_id: string;
  instrument_id: string;
}

export interface StepRecordTable {
  id: Generated<string>;
  run_id: string;
  step_id: string;
  cycle: ColumnType<number, number | undefined, number>;
  record: JsonColumn;
  completed: ColumnType<boolean, boolean | undefined, boolean>;
  recorded_by: string;
  updated_at: DefaultedTimestamp;
}

export interface RunLogTable {
  id: Generated<string>;
  run_id: string;
  stored_file_id: string;
  mapping: JsonColumn;
  sample_count: number;
  logged_from: Date | null;
  current: ColumnType<boolean, boolean | undefined, boolean>;
  /** Null when the log's first part was pushed by a machine (0023). */
  uploaded_by: string | null;
  uploaded_at: DefaultedTimestamp;
  /** A log built from parts appended over time (run_log_part), not one whole upload (0023). */
  in_parts: Generated<boolean>;
}

/** One accepted part of a run's log (migration 0023): never changed or removed once written. */
export interface RunLogPartTable {
  id: string;
  run_id: string;
  run_log_id: string;
  part_number: number;
  stored_file_id: string;
  sha256: string;
  header: JsonColumn;
  first_chunk: number;
  chunk_count: number;
  sample_count: number;
  /** Seconds in the run's time base: Unix time for timestamped logs, the cycler's elapsed time otherwise. */
  first_time_s: number;
  last_time_s: number;
  starts_at: Date | null;
  ends_at: Date | null;
  gap_before_s: number | null;
  uploaded_by: string | null;
  machine_token_id: string | null;
  machine_label: string | null;
  received_at: DefaultedTimestamp;
}

export interface RunLogChunkTable {
  run_log_id: string;
  chunk: number;
  sample_count: number;
  time_s: Buffer;
  voltage_v: Buffer;
  current_a: Buffer;
  temperature_c: Buffer | null;
}

/** A data log waiting to be read, being read, or read (migration 0022); what became of it is `outcome`. */
export interface LogIngestJobTable {
  id: Generated<string>;
  run_id: string;
  /** Null for a log part until it is accepted: only its staged object exists before (0023). */
  stored_file_id: string | null;
  mapping: JsonColumn;
  remember_mapping: Generated<boolean>;
  requested_by: string | null;
  state: Generated<"waiting" | "reading" | "stored" | "evaluated" | "refused" | "failed">;
  rows_read: Generated<number>;
  attempts: Generated<number>;
  lease_until: Date | null;
  run_log_id: string | null;
  outcome: Json;
  created_at: Generated<Date>;
  updated_at: Generated<Date>;
  finished_at: Date | null;
  part_id: string | null;
  file_name: string | null;
  staged_key: string | null;
  staged_sha256: string | null;
  staged_size: ColumnType<string | null, number | string | null | undefined, number | string | null>;
  mapping_given: Generated<boolean>;
  machine_token_id: string | null;
  machine_label: string | null;
}

/** One cycle's results, computed while the log was read (migration 0025). */
export interface RunCycleResultTable {
  run_id: string;
  cycle: number;
  run_log_id: string;
  charge_ah: number;
  discharge_ah: number;
  charge_wh: number;
  discharge_wh: number;
  coulombic_efficiency: number | null;
  energy_efficiency: number | null;
  end_of_charge_v: number | null;
  end_of_discharge_v: number | null;
  dc_resistance_ohm: number | null;
  first_time_s: number;
  last_time_s: number;
  closed: boolean;
  updated_at: DefaultedTimestamp;
}

/** Where the per-cycle accumulator stopped, per run (migration 0025); the next log part continues from it. */
export interface RunCycleStateTable {
  run_id: string;
  run_log_id: string;
  state: JsonColumn;
  sample_count: ColumnType<string, number, number>;
  last_sample_time_s: number | null;
  samples_arrived_at: DefaultedTimestamp;
  stop_reached_cycle: number | null;
  updated_at: DefaultedTimestamp;
}

export interface RunEvaluationTable {
  id: Generated<string>;
  run_id: string;
  run_log_id: string | null;
  procedure_version_id: string;
  evaluation: JsonColumn;
  procedure_followed: string;
  specimen_conforms: string;
  evaluated_at: DefaultedTimestamp;
}

export type SignatureMeaning = "reviewed" | "approved" | "released";

export interface ElectronicSignatureTable {
  id: Generated<string>;
  signer_id: string;
  printed_name: string;
  meaning: SignatureMeaning;
  signed_at: DefaultedTimestamp;
  entity_type: "run" | "certificate" | "procedure-version";
  entity_id: string;
  record_sha256: string;
}

export type ReviewDecision = "returned" | "accepted";

export interface RunReviewTable {
  id: Generated<string>;
  run_id: string;
  reviewer_id: string;
  decision: ReviewDecision;
  comments: ColumnType<string, string | undefined, never>;
  run_evaluation_id: string | null;
  /** [{ findingId, note }]: the reviewer's note on each deviating finding. */
  acknowledged_deviations: ColumnType<unknown, string | undefined, never>;
  signature_id: string | null;
  created_at: DefaultedTimestamp;
}

export interface CertificateTable {
  id: Generated<string>;
  number: Generated<string>;
  run_id: string | null;
  lot_id: string | null;
  replaces_id: string | null;
  amendment_reason: string | null;
  payload: JsonColumn;
  payload_sha256: string;
  pdf_file_id: string;
  pdf_sha256: string;
  issued_by: string;
  issued_at: DefaultedTimestamp;
  signature_id: string;
  revoked_at: Date | null;
  revoked_by: string | null;
  revocation_reason: string | null;
}

export type MailKind = "run-submitted" | "run-returned" | "certificate-issued" | "calibration-due" | "procedure-awaiting-release" | "endurance-stop-reached" | "run-stalled";

export interface MailMessageTable {
  id: Generated<string>;
  kind: MailKind;
  recipients: string[];
  subject: string;
  body: string;
  entity_type: string | null;
  entity_id: string | null;
  once_key: string | null;
  created_at: DefaultedTimestamp;
  attempts: ColumnType<number, number | undefined, number>;
  next_attempt_at: DefaultedTimestamp;
  sent_at: Date | null;
  last_error: string | null;
  smtp_message_id: string | null;
}

export interface LotSampleDrawTable {
  id: Generated<string>;
  lot_id: string;
  method: "random" | "chosen";
  seed: string | null;
  positions: number[];
  drawn_by: string;
  drawn_at: DefaultedTimestamp;
}

export interface Database {
  lab: LabTable;
  app_user: AppUserTable;
  user_session: UserSessionTable;
  sign_in_attempt: SignInAttemptTable;
  audit_event: AuditEventTable;
  stored_file: StoredFileTable;
  cell_specification: CellSpecificationTable;
  procedure: ProcedureTable;
  procedure_version: ProcedureVersionTable;
  instrument: InstrumentTable;
  lot: LotTable;
  specimen: SpecimenTable;
  run: RunTable;
  run_instrument: RunInstrumentTable;
  step_record: StepRecordTable;
  run_log: RunLogTable;
  run_log_chunk: RunLogChunkTable;
  run_log_part: RunLogPartTable;
  log_ingest_job: LogIngestJobTable;
  run_cycle_result: RunCycleResultTable;
  run_cycle_state: RunCycleStateTable;
  run_evaluation: RunEvaluationTable;
  electronic_signature: ElectronicSignatureTable;
  run_review: RunReviewTable;
  certificate: CertificateTable;
  mail_message: MailMessageTable;
  lot_sample_draw: LotSampleDrawTable;
  run_participant: RunParticipantTable;
  refused_request_tally: RefusedRequestTallyTable;
  lab_signing_key: LabSigningKeyTable;
  machine_token: MachineTokenTable;
}

/** Who took part in a run; written by triggers (migration 0012) and by submitRun. */
export interface RunParticipantTable {
  run_id: string;
  user_id: string;
  activity: "started" | "recorded" | "uploaded" | "submitted";
  first_at: DefaultedTimestamp;
}

/** Refused cross-site requests counted per 10-minute window and origin (migration 0013). */
export interface RefusedRequestTallyTable {
  window_start: Date;
  kind: "foreign-origin" | "unknown-token";
  origin: string;
  last_path: string;
  count: Generated<number>;
  last_at: DefaultedTimestamp;
}

/** A token a cycler PC pushes log parts with, for one cycler channel (migration 0024): only its SHA-256 is kept. */
export interface MachineTokenTable {
  id: Generated<string>;
  instrument_id: string;
  label: string;
  secret_sha256: string;
  hint: string;
  issued_by: string;
  issued_at: DefaultedTimestamp;
  expires_at: Date;
  revoked_at: Date | null;
  revoked_by: string | null;
  revoke_reason: string | null;
  last_used_at: Date | null;
  window_start: Date | null;
  window_count: Generated<number>;
}

/** The lab's signing key, sealed (migration 0021): at most one row, never changed or removed. */
export interface LabSigningKeyTable {
  id: string;
  origin: "generated" | "imported";
  sealed_p12: Buffer;
  sealed_passphrase: Buffer;
  sealing_key_name: string;
  p12_sha256: string;
  certificate_sha256: string;
  subject: string;
  valid_from: Date;
  valid_to: Date;
  created_at: DefaultedTimestamp;
}
