import type { Migration } from "kysely";
import * as m0001 from "./0001_foundation";
import * as m0002 from "./0002_procedures";
import * as m0003 from "./0003_specimens_instruments";
import * as m0004 from "./0004_runs";
import * as m0005 from "./0005_review_certificates_mail";
import * as m0006 from "./0006_lot_sampling";
import * as m0007 from "./0007_app_role_grants";
import * as m0008 from "./0008_certified_chain_frozen";
import * as m0009 from "./0009_guards_resolve_public_tables";
import * as m0010 from "./0010_audit_chain";
import * as m0012 from "./0012_run_participants";
import * as m0013 from "./0013_refused_request_tally";
import * as m0014 from "./0014_session_details";
import * as m0017 from "./0017_run_abandon";
import * as m0019 from "./0019_release_signature";
import * as m0020 from "./0020_evaluation_waits_for_acceptance";
import * as m0021 from "./0021_lab_signing_key";
import * as m0022 from "./0022_log_ingest_job";
import * as m0023 from "./0023_run_log_parts";
import * as m0024 from "./0024_machine_tokens";
import * as m0025 from "./0025_run_cycle_results";

/**
 * Every migration, in order. Listed statically (not read from the folder at run time) so the same
 * list works under tsx, Vitest and bundlers; tests/unit/migrations.test.ts checks none is missing.
 */
export const MIGRATIONS: Record<string, Migration> = {
  "0001_foundation": m0001,
  "0002_procedures": m0002,
  "0003_specimens_instruments": m0003,
  "0004_runs": m0004,
  "0005_review_certificates_mail": m0005,
  "0006_lot_sampling": m0006,
  "0007_app_role_grants": m0007,
  "0008_certified_chain_frozen": m0008,
  "0009_guards_resolve_public_tables": m0009,
  "0010_audit_chain": m0010,
  "0012_run_participants": m0012,
  "0013_refused_request_tally": m0013,
  "0014_session_details": m0014,
  "0017_run_abandon": m0017,
  "0019_release_signature": m0019,
  "0020_evaluation_waits_for_acceptance": m0020,
  "0021_lab_signing_key": m0021,
  "0022_log_ingest_job": m0022,
  "0023_run_log_parts": m0023,
  "0024_machine_tokens": m0024,
  "0025_run_cycle_results": m0025,
};
