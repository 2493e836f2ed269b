import type { ColumnType, Generated } from "kysely";

/** Kept exactly in step with migrations/: one interface per table. */
export type Role = "admin" | "engineer" | "operator" | "auditor";

type Timestamp = ColumnType<Date, Date | string, Date | string>;
/** A timestamp column with a database default: optional on insert. */
type DefaultedTimestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type Json = ColumnType<unknown, string | undefined | null, string | null>;

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
  uploaded_by: string;
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
}
