import "server-only";
import type { Selectable } from "kysely";
import type { Executor } from "./index";
import type { LabSigningKeyTable } from "./schema";

export type StoredLabSigningKey = Selectable<LabSigningKeyTable>;

/** The installation's signing key as stored (sealed), or undefined before the first one. */
export async function getStoredLabSigningKey(db: Executor): Promise<StoredLabSigningKey | undefined> {
  return db.selectFrom("lab_signing_key").selectAll().executeTakeFirst();
}

/**
 * Stores the first signing key. Returns false when one is already stored (another server got there
 * first): the caller reads that one instead. The database keeps at most one and never changes it.
 */
export async function insertLabSigningKey(db: Executor, row: Omit<StoredLabSigningKey, "created_at">): Promise<boolean> {
  const inserted = await db.insertInto("lab_signing_key").values(row).onConflict((c) => c.doNothing()).returning("id").executeTakeFirst();
  return inserted !== undefined;
}
