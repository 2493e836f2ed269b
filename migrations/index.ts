import type { Migration } from "kysely";
import * as m0001 from "./0001_foundation";
import * as m0002 from "./0002_procedures";

/**
 * Every migration, in order. Listed statically (not read from the folder at run time) so the same
 * list works under tsx, Vitest and bundlers; tests/unit/migrations.test.ts checks none is missing.
 */
export const MIGRATIONS: Record<string, Migration> = {
  "0001_foundation": m0001,
  "0002_procedures": m0002,
};
