import { Kysely, PostgresDialect, type Transaction } from "kysely";
import type { Database } from "./schema";
import { getPool } from "./pool";

export type { Database } from "./schema";
/** Either the database or an open transaction: query functions take one so callers can compose. */
export type Executor = Kysely<Database> | Transaction<Database>;

const globalForDb = globalThis as unknown as { cellwrightDb?: Kysely<Database> };

export function getDb(): Kysely<Database> {
  globalForDb.cellwrightDb ??= new Kysely<Database>({
    dialect: new PostgresDialect({ pool: () => Promise.resolve(getPool()) }),
  });
  return globalForDb.cellwrightDb;
}
