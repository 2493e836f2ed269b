import "server-only";
import { sql } from "kysely";
import type { Executor } from "./index";

/** What the administrator's list shows of a token: never its hash. */
export interface MachineTokenView {
  id: string;
  label: string;
  hint: string;
  instrument: { id: string; identifier: string };
  issuedBy: string;
  issuedAt: Date;
  expiresAt: Date;
  revokedAt: Date | null;
  revokedBy: string | null;
  revokeReason: string | null;
  lastUsedAt: Date | null;
}

/** What a request's token is checked against. */
export interface MachineTokenRecord {
  id: string;
  label: string;
  instrumentId: string;
  instrumentIdentifier: string;
  expiresAt: Date;
  revokedAt: Date | null;
  revokeReason: string | null;
}

export async function insertMachineToken(
  db: Executor,
  t: { instrumentId: string; label: string; sha256: string; hint: string; issuedBy: string; issuedAt: Date; expiresAt: Date },
): Promise<string> {
  const row = await db
    .insertInto("machine_token")
    .values({ instrument_id: t.instrumentId, label: t.label, secret_sha256: t.sha256, hint: t.hint, issued_by: t.issuedBy, issued_at: t.issuedAt, expires_at: t.expiresAt })
    .returning("id")
    .executeTakeFirstOrThrow();
  return row.id;
}

export async function listMachineTokens(db: Executor): Promise<MachineTokenView[]> {
  const rows = await db
    .selectFrom("machine_token as t")
    .innerJoin("instrument as i", "i.id", "t.instrument_id")
    .innerJoin("app_user as ib", "ib.id", "t.issued_by")
    .leftJoin("app_user as rb", "rb.id", "t.revoked_by")
    .select([
      "t.id",
      "t.label",
      "t.hint",
      "i.id as instrument_id",
      "i.identifier",
      "ib.display_name as issued_by",
      "t.issued_at",
      "t.expires_at",
      "t.revoked_at",
      "rb.display_name as revoked_by",
      "t.revoke_reason",
      "t.last_used_at",
    ])
    .orderBy("t.issued_at", "desc")
    .orderBy("t.id")
    .execute();
  return rows.map((r) => ({
    id: r.id,
    label: r.label,
    hint: r.hint,
    instrument: { id: r.instrument_id, identifier: r.identifier },
    issuedBy: r.issued_by,
    issuedAt: r.issued_at,
    expiresAt: r.expires_at,
    revokedAt: r.revoked_at,
    revokedBy: r.revoked_by,
    revokeReason: r.revoke_reason,
    lastUsedAt: r.last_used_at,
  }));
}

function recordQuery(db: Executor) {
  return db
    .selectFrom("machine_token as t")
    .innerJoin("instrument as i", "i.id", "t.instrument_id")
    .select(["t.id", "t.label", "t.instrument_id", "i.identifier", "t.expires_at", "t.revoked_at", "t.revoke_reason"]);
}

type RecordRow = Awaited<ReturnType<ReturnType<typeof recordQuery>["executeTakeFirstOrThrow"]>>;
const toRecord = (r: RecordRow): MachineTokenRecord => ({
  id: r.id,
  label: r.label,
  instrumentId: r.instrument_id,
  instrumentIdentifier: r.identifier,
  expiresAt: r.expires_at,
  revokedAt: r.revoked_at,
  revokeReason: r.revoke_reason,
});

export async function findMachineTokenBySha256(db: Executor, sha256: string): Promise<MachineTokenRecord | null> {
  const r = await recordQuery(db).where("t.secret_sha256", "=", sha256).executeTakeFirst();
  return r ? toRecord(r) : null;
}

export async function getMachineToken(db: Executor, id: string, opts: { forUpdate?: boolean } = {}): Promise<MachineTokenRecord | null> {
  let q = recordQuery(db).where("t.id", "=", id);
  if (opts.forUpdate) q = q.forUpdate("t");
  const r = await q.executeTakeFirst();
  return r ? toRecord(r) : null;
}

export async function markMachineTokenRevoked(db: Executor, id: string, by: string, reason: string, at: Date): Promise<void> {
  await db.updateTable("machine_token").set({ revoked_at: at, revoked_by: by, revoke_reason: reason }).where("id", "=", id).execute();
}

/**
 * Counts one request in the token's current one-minute window (a new window starts at 1) and notes the
 * use; answers the count so far. One statement, so concurrent requests on any server count exactly.
 */
export async function countMachineTokenRequest(db: Executor, id: string, windowStart: Date, now: Date): Promise<number> {
  const row = await db
    .updateTable("machine_token")
    .set({
      window_count: sql<number>`case when window_start = ${windowStart} then window_count + 1 else 1 end`,
      window_start: windowStart,
      last_used_at: now,
    })
    .where("id", "=", id)
    .returning("window_count")
    .executeTakeFirstOrThrow();
  return row.window_count;
}
