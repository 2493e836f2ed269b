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

export interface Database {
  lab: LabTable;
  app_user: AppUserTable;
  user_session: UserSessionTable;
  sign_in_attempt: SignInAttemptTable;
  audit_event: AuditEventTable;
}
