import "server-only";
import { sql, type SelectQueryBuilder } from "kysely";
import type { Executor } from ".";

/** One page of a list and where it stands among the rest. */
export interface Page<T> {
  rows: T[];
  /** 1-based; clamped to the last page when the address asked for one past the end. */
  page: number;
  pageCount: number;
  pageSize: number;
  total: number;
}

/**
 * Counts what `query` matches, then reads the asked page of it with limit/offset. The query carries its
 * own filters and order (end the order on a unique column so rows never swap between pages).
 */
export async function readPage<DB, TB extends keyof DB, O, T>(
  db: Executor,
  query: SelectQueryBuilder<DB, TB, O>,
  request: { page: number; pageSize: number },
  toView: (row: O) => T,
): Promise<Page<T>> {
  const counted = await sql<{ n: string }>`select count(*) as n from (${query.clearOrderBy()}) as matched`.execute(db);
  const total = Number(counted.rows[0]?.n ?? 0);
  const pageCount = Math.max(1, Math.ceil(total / request.pageSize));
  const page = Math.min(Math.max(1, request.page), pageCount);
  const rows = total === 0 ? [] : await query.limit(request.pageSize).offset((page - 1) * request.pageSize).execute();
  return { rows: rows.map(toView), page, pageCount, pageSize: request.pageSize, total };
}
