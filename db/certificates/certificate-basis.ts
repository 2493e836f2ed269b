// The records a certificate is built from: the accepted review, the evaluation it signed, the log, the customer, the instruments.
import "server-only";
import { sql } from "kysely";
import type { SignatureManifestation } from "@/lib/signatures/sign-record";
import { parseStoredEvaluation, type StoredEvaluation } from "@/lib/conformance/stored-evaluation";
import type { Executor } from "../index";

/** A run's latest review, with the signature of an acceptance. */
export interface RunReviewRecord {
  id: string;
  decision: "returned" | "accepted";
  runEvaluationId: string | null;
  acknowledgedDeviations: unknown;
  comments: string;
  signature: SignatureManifestation | null;
  createdAt: Date;
}

export async function getLatestRunReview(db: Executor, runId: string): Promise<RunReviewRecord | null> {
  const r = await db
    .selectFrom("run_review as rv")
    .leftJoin("electronic_signature as sig", "sig.id", "rv.signature_id")
    .select(["rv.id", "rv.decision", "rv.run_evaluation_id", "rv.acknowledged_deviations", "rv.comments", "rv.created_at", "sig.id as sig_id", "sig.printed_name", "sig.meaning", "sig.signed_at"])
    .where("rv.run_id", "=", runId)
    .orderBy("rv.created_at", "desc")
    .orderBy("rv.id", "desc")
    .executeTakeFirst();
  if (!r) return null;
  return {
    id: r.id,
    decision: r.decision,
    runEvaluationId: r.run_evaluation_id,
    acknowledgedDeviations: r.acknowledged_deviations,
    comments: r.comments,
    signature: r.sig_id && r.printed_name && r.meaning && r.signed_at ? { id: r.sig_id, printedName: r.printed_name, meaning: r.meaning, signedAt: r.signed_at } : null,
    createdAt: r.created_at,
  };
}

/**
 * One stored evaluation with the log it was made from: read in today's shape (`evaluation`) and as the
 * database holds it (`stored`, what a certificate's hash of the evaluation is taken over).
 */
export async function getRunEvaluationRecord(
  db: Executor,
  id: string,
): Promise<{ id: string; runId: string; runLogId: string | null; evaluatedAt: Date; evaluation: StoredEvaluation; stored: unknown } | null> {
  const r = await db.selectFrom("run_evaluation").select(["id", "run_id", "run_log_id", "evaluated_at", "evaluation"]).where("id", "=", id).executeTakeFirst();
  return r ? { id: r.id, runId: r.run_id, runLogId: r.run_log_id, evaluatedAt: r.evaluated_at, evaluation: parseStoredEvaluation(r.evaluation), stored: r.evaluation } : null;
}

/** Ids of the run's evaluations made after the given one (a newer evaluation than the one reviewed). */
export async function countEvaluationsAfter(db: Executor, runId: string, evaluation: { id: string; evaluatedAt: Date }): Promise<number> {
  const r = await db
    .selectFrom("run_evaluation")
    .select((eb) => eb.fn.countAll<string>().as("n"))
    .where("run_id", "=", runId)
    .where("id", "<>", evaluation.id)
    .where("evaluated_at", ">=", evaluation.evaluatedAt)
    .executeTakeFirstOrThrow();
  return Number(r.n);
}

/** The data log an evaluation was made from, with its stored file's hash. */
export async function getEvaluatedLog(
  db: Executor,
  runLogId: string,
): Promise<{ fileName: string; sha256: string; sizeBytes: number; samples: number; uploadedAt: Date; current: boolean; inParts: boolean; timeForm: "elapsed" | "timestamp" } | null> {
  const r = await db
    .selectFrom("run_log as l")
    .innerJoin("stored_file as f", "f.id", "l.stored_file_id")
    .select(["f.original_name", "f.sha256", "f.size_bytes", "l.sample_count", "l.uploaded_at", "l.current", "l.in_parts", "l.mapping"])
    .where("l.id", "=", runLogId)
    .executeTakeFirst();
  if (!r) return null;
  const timeForm = (r.mapping as { time?: { form?: string } }).time?.form === "timestamp" ? "timestamp" : "elapsed";
  return { fileName: r.original_name, sha256: r.sha256, sizeBytes: Number(r.size_bytes), samples: r.sample_count, uploadedAt: r.uploaded_at, current: r.current, inParts: r.in_parts, timeForm };
}

/** The customer of a lot (7.8.2.1 d); null for in-house work. */
export async function getLotCustomer(db: Executor, lotId: string): Promise<string | null> {
  const r = await db.selectFrom("lot").select("customer").where("id", "=", lotId).executeTakeFirst();
  return r?.customer ?? null;
}

/** Instruments by id (chosen for the run) or by identifier (named by an ambient reading). */
export async function listCertificateInstruments(
  db: Executor,
  q: { ids: readonly string[]; identifiers: readonly string[] },
): Promise<{ id: string; identifier: string; kind: string; serial: string; calibrationCertificate: string; calibratedOn: string; dueOn: string }[]> {
  if (q.ids.length === 0 && q.identifiers.length === 0) return [];
  const rows = await db
    .selectFrom("instrument")
    .select(["id", "identifier", "kind", "serial", "calibration_certificate", sql<string>`calibrated_on::text`.as("calibrated_on"), sql<string>`due_on::text`.as("due_on")])
    .where((eb) =>
      eb.or([
        ...(q.ids.length > 0 ? [eb("id", "in", [...q.ids])] : []),
        ...(q.identifiers.length > 0 ? [eb("identifier", "in", [...q.identifiers])] : []),
      ]),
    )
    .orderBy("identifier")
    .execute();
  return rows.map((r) => ({
    id: r.id,
    identifier: r.identifier,
    kind: r.kind,
    serial: r.serial,
    calibrationCertificate: r.calibration_certificate,
    calibratedOn: r.calibrated_on,
    dueOn: r.due_on,
  }));
}
