import type { Migration } from "kysely";
import * as m0001 from "./0001_foundation";
import * as m0002 from "./0002_procedures";
import * as m0003 from "./0003_specimens_instruments";
import * as m0004 from "./0004_runs";
import * as m0005 from "./0005_review_certificates_mail";
import * as m0006 from "./0006_lot_sampling";
import * as m0019 from "./0019_release_signature";

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
  "0019_release_signature": m0019,
};
