import "server-only";
import { sql } from "kysely";
import type { Executor } from "@/db";

export const GENESIS_HASH = "0".repeat(64);
const BATCH = 5000;

export interface ChainBreak {
  /** Audit row id and place in the chain of the row where the chain stops holding. */
  id: string;
  position: string;
  at: Date;
  action: string;
  actorLabel: string;
  /** In plain words: what is wrong with this row or the link to it. */
  problem: string;
}

export interface ChainReport {
  rows: number;
  /** The newest row's hash: write it down elsewhere (a lab notebook, an e-mail) to detect later rewrites of the whole tail. */
  head: { position: string; hash: string } | null;
  breaks: ChainBreak[];
}

interface ChainRow {
  id: string;
  chain_position: string;
  at: Date;
  action: string;
  actor_label: string;
  prev_hash: string;
  row_hash: string;
  recomputed: string;
}

/**
 * Walks the audit trail in chain order and recomputes each row's hash from its content and the
 * previous row's hash (the database's own audit_event_chain_hash, the function its insert trigger uses).
 * Reports every row whose content no longer matches its hash, every link that does not point to the
 * row before it, and gaps in the chain (removed rows); the first of them is the first broken link.
 */
export async function verifyAuditChain(db: Executor, limit = 50): Promise<ChainReport> {
  const breaks: ChainBreak[] = [];
  let rows = 0;
  let prevHash = GENESIS_HASH;
  let prevPosition = 0n;
  let after = "0";
  for (;;) {
    const batch = await sql<ChainRow>`
      select e.id::text, e.chain_position::text, e.at, e.action, e.actor_label, e.prev_hash, e.row_hash,
             audit_event_chain_hash(e.prev_hash, e) as recomputed
      from audit_event e where e.chain_position > ${after}::bigint order by e.chain_position limit ${BATCH}`.execute(db);
    for (const r of batch.rows) {
      rows++;
      const at = { id: r.id, position: r.chain_position, at: r.at, action: r.action, actorLabel: r.actor_label };
      const position = BigInt(r.chain_position);
      if (position !== prevPosition + 1n) {
        breaks.push({ ...at, problem: `Rows are missing from the chain before this one (expected place ${prevPosition + 1n}, found ${position}): audit rows were removed.` });
      } else if (r.prev_hash !== prevHash) {
        breaks.push({ ...at, problem: "Its link to the row before does not match that row's hash: the row before was rewritten, or a row was removed or inserted here." });
      }
      if (r.recomputed !== r.row_hash) {
        breaks.push({ ...at, problem: "Its content no longer matches the hash it was written with: this row was changed after it was written." });
      }
      prevHash = r.row_hash;
      prevPosition = position;
      after = r.chain_position;
      if (breaks.length >= limit) break;
    }
    if (batch.rows.length < BATCH || breaks.length >= limit) break;
  }
  return { rows, head: rows > 0 ? { position: after, hash: prevHash } : null, breaks };
}

export function describeChainBreak(b: ChainBreak): string {
  return `Audit row ${b.id} (place ${b.position} in the chain; “${b.action}” by ${b.actorLabel} at ${b.at.toISOString()}): ${b.problem}`;
}
