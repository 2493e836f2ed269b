import "server-only";
import { sql } from "kysely";
import { CHUNK_SAMPLES } from "./run-logs";
import { parseStoredEvaluation, type StoredEvaluation } from "@/lib/conformance/stored-evaluation";
import type { Executor } from "./index";

export type LogChannel = "time_s" | "voltage_v" | "current_a" | "temperature_c";

/** Channels of a stretch of a stored log; a channel the log lacks is absent. */
export type ChannelArrays = Partial<Record<LogChannel, Float64Array>>;

function readDoubles(b: Buffer, from: number, count: number, into: Float64Array, at: number): void {
  for (let k = 0; k < count; k++) into[at + k] = b.readDoubleLE((from + k) * 8);
}

/**
 * Every sample of [from, to] (inclusive indexes) of the named channels, reading only the chunks that
 * hold the range and, in the first and last, only the bytes of the range (`substring` on the
 * uncompressed bytea, docs/decisions/004).
 */
export async function readChannelRange(
  db: Executor,
  q: { runLogId: string; channels: readonly LogChannel[]; from: number; to: number },
): Promise<ChannelArrays> {
  const count = q.to - q.from + 1;
  const firstChunk = Math.floor(q.from / CHUNK_SAMPLES);
  const lastChunk = Math.floor(q.to / CHUNK_SAMPLES);
  const slices = q.channels.map(
    (c) => sql<Buffer | null>`substring(${sql.ref(c)} from greatest(0, ${q.from} - chunk * ${CHUNK_SAMPLES}) * 8 + 1 for (least(${CHUNK_SAMPLES} - 1, ${q.to} - chunk * ${CHUNK_SAMPLES}) - greatest(0, ${q.from} - chunk * ${CHUNK_SAMPLES}) + 1) * 8)`.as(c),
  );
  const rows = await db
    .selectFrom("run_log_chunk")
    .select(["chunk", ...slices])
    .where("run_log_id", "=", q.runLogId)
    .where("chunk", ">=", firstChunk)
    .where("chunk", "<=", lastChunk)
    .orderBy("chunk")
    .execute();
  const out: ChannelArrays = {};
  for (const c of q.channels) {
    if (rows.some((r) => (r as Record<string, unknown>)[c] === null)) continue;
    const target = new Float64Array(count);
    let at = 0;
    for (const r of rows) {
      const b = (r as unknown as Record<string, Buffer>)[c] as Buffer;
      readDoubles(b, 0, b.byteLength / 8, target, at);
      at += b.byteLength / 8;
    }
    out[c] = target.subarray(0, at);
  }
  return out;
}

/**
 * The samples at the given indexes (increasing) of the named channels: one 8-byte `substring` per
 * sample and channel, so a 2 000-point look at a 2-million-sample log reads kilobytes, not the log.
 */
export async function readChannelSamples(
  db: Executor,
  q: { runLogId: string; channels: readonly LogChannel[]; indexes: readonly number[] },
): Promise<ChannelArrays> {
  const slices = q.channels.map((c) => sql<Buffer | null>`substring(c.${sql.ref(c)} from (g.k - c.chunk * ${CHUNK_SAMPLES}) * 8 + 1 for 8)`.as(c));
  const result = await sql<Record<string, Buffer | null>>`
    select ${sql.join(slices)}
    from unnest(${sql.val(q.indexes)}::int[]) with ordinality as g(k, n)
    join run_log_chunk c on c.run_log_id = ${q.runLogId} and c.chunk = g.k / ${CHUNK_SAMPLES}
    order by g.n`.execute(db);
  const out: ChannelArrays = {};
  for (const c of q.channels) {
    if (result.rows.some((r) => r[c] === null)) continue;
    const target = new Float64Array(result.rows.length);
    result.rows.forEach((r, i) => (target[i] = (r[c] as Buffer).readDoubleLE(0)));
    out[c] = target;
  }
  return out;
}

export interface StoredRunEvaluation {
  id: string;
  runLogId: string | null;
  evaluatedAt: Date;
  /** The evaluation in today's shape, whatever format the row was written in (lib/conformance/stored-evaluation.ts). */
  evaluation: StoredEvaluation;
}

/** The run's latest evaluation (the one the results page and the exports show). */
export async function getLatestRunEvaluation(db: Executor, runId: string): Promise<StoredRunEvaluation | null> {
  const r = await db
    .selectFrom("run_evaluation")
    .select(["id", "run_log_id", "evaluated_at", "evaluation"])
    .where("run_id", "=", runId)
    .orderBy("evaluated_at", "desc")
    .orderBy("id")
    .limit(1)
    .executeTakeFirst();
  return r ? { id: r.id, runLogId: r.run_log_id, evaluatedAt: r.evaluated_at, evaluation: parseStoredEvaluation(r.evaluation) } : null;
}

/** The run's latest evaluation without its JSON: which one it is, on which log, and when. */
export async function getLatestRunEvaluationHead(db: Executor, runId: string): Promise<Omit<StoredRunEvaluation, "evaluation"> | null> {
  const r = await db
    .selectFrom("run_evaluation")
    .select(["id", "run_log_id", "evaluated_at"])
    .where("run_id", "=", runId)
    .orderBy("evaluated_at", "desc")
    .orderBy("id")
    .limit(1)
    .executeTakeFirst();
  return r ? { id: r.id, runLogId: r.run_log_id, evaluatedAt: r.evaluated_at } : null;
}
