import "server-only";
import { sql } from "kysely";
import type { SignatureManifestation } from "@/lib/signatures/sign-record";
import type { Executor } from "./index";
import { readPage, type Page } from "./paginate";
import type { ReviewDecision, RunStatus } from "./schema";

/** A reviewer's note on one deviating finding, as stored. */
export interface DeviationNote {
  findingId: string;
  note: string;
}

/** One review as stored; lib/reviews/run-reviews.ts titles its notes from the evaluation reviewed. */
export interface RunReviewRecord {
  id: string;
  decision: ReviewDecision;
  comments: string;
  reviewer: { id: string; name: string };
  createdAt: Date;
  runEvaluationId: string | null;
  deviationNotes: DeviationNote[];
  /** The stored evaluation reviewed (unparsed), only when there are notes to title; else null. */
  evaluationForNotes: unknown;
  /** The reviewer's signature (accepted reviews only). */
  signature: SignatureManifestation | null;
}

/** Every review of a run, oldest first: returns with their comments, the acceptance with its signature. */
export async function listRunReviewRecords(db: Executor, runId: string): Promise<RunReviewRecord[]> {
  const rows = await db
    .selectFrom("run_review as rr")
    .innerJoin("app_user as u", "u.id", "rr.reviewer_id")
    .leftJoin("electronic_signature as s", "s.id", "rr.signature_id")
    .leftJoin("run_evaluation as e", "e.id", "rr.run_evaluation_id")
    .select([
      "rr.id",
      "rr.decision",
      "rr.comments",
      "rr.created_at",
      "rr.run_evaluation_id",
      "rr.acknowledged_deviations",
      "u.id as reviewer_id",
      "u.display_name as reviewer_name",
      "s.id as signature_id",
      "s.printed_name",
      "s.meaning",
      "s.signed_at",
      // Titles only when there are notes to label: an evaluation can be large.
      sql<unknown>`case when jsonb_array_length(rr.acknowledged_deviations) > 0 then e.evaluation end`.as("evaluation"),
    ])
    .where("rr.run_id", "=", runId)
    .orderBy("rr.created_at")
    .orderBy("rr.id")
    .execute();
  return rows.map((r) => {
    // Written only by lib/reviews/accept-run.ts from checked input.
    const notes = (r.acknowledged_deviations as DeviationNote[]) ?? [];
    return {
      id: r.id,
      decision: r.decision,
      comments: r.comments,
      reviewer: { id: r.reviewer_id, name: r.reviewer_name },
      createdAt: r.created_at,
      runEvaluationId: r.run_evaluation_id,
      deviationNotes: notes,
      evaluationForNotes: r.evaluation ?? null,
      signature:
        r.signature_id && r.printed_name && r.meaning && r.signed_at
          ? { id: r.signature_id, printedName: r.printed_name, meaning: r.meaning, signedAt: r.signed_at }
          : null,
    };
  });
}

/**
 * Every signature that belongs to a run, oldest first: the reviewer's on the run itself and the
 * approvals on certificates issued for it. Shown wherever the run is shown (21 CFR 11.50).
 */
export async function listRunSignatures(db: Executor, runId: string): Promise<(SignatureManifestation & { certificateNumber: string | null })[]> {
  const rows = await db
    .selectFrom("electronic_signature as s")
    .leftJoin("certificate as c", (j) => j.onRef("c.id", "=", "s.entity_id").on("s.entity_type", "=", "certificate"))
    .select(["s.id", "s.printed_name", "s.meaning", "s.signed_at", "c.number as certificate_number"])
    .where((w) =>
      w.or([
        w.and([w("s.entity_type", "=", "run"), w("s.entity_id", "=", runId)]),
        w.and([w("s.entity_type", "=", "certificate"), w("c.run_id", "=", runId)]),
      ]),
    )
    .orderBy("s.signed_at")
    .orderBy("s.id")
    .execute();
  return rows.map((r) => ({ id: r.id, printedName: r.printed_name, meaning: r.meaning, signedAt: r.signed_at, certificateNumber: r.certificate_number }));
}

/** Certificates issued for a run, newest first (numbers only, for links). */
export async function listRunCertificateNumbers(db: Executor, runId: string): Promise<{ number: string; issuedAt: Date; revoked: boolean }[]> {
  const rows = await db
    .selectFrom("certificate")
    .select(["number", "issued_at", "revoked_at"])
    .where("run_id", "=", runId)
    .orderBy("issued_at", "desc")
    .execute();
  return rows.map((r) => ({ number: r.number, issuedAt: r.issued_at, revoked: r.revoked_at !== null }));
}

export interface ReviewQueueEntry {
  runId: string;
  runNumber: string;
  status: RunStatus;
  specimen: string;
  procedure: string;
  operatorName: string;
  submittedAt: Date | null;
  /** The person asking operated this run, so another engineer must review it. */
  operatedByYou: boolean;
}

/** Runs waiting for review, the longest-waiting first, marked where the asking user operated them. */
export async function listReviewQueue(db: Executor, userId: string, request: { page: number; pageSize: number }): Promise<Page<ReviewQueueEntry>> {
  const query = db
    .selectFrom("run as r")
    .innerJoin("specimen as s", "s.id", "r.specimen_id")
    .innerJoin("procedure_version as v", "v.id", "r.procedure_version_id")
    .innerJoin("procedure as p", "p.id", "v.procedure_id")
    .innerJoin("app_user as o", "o.id", "r.operator_id")
    .select(["r.id", "r.number", "r.status", "r.submitted_at", "r.operator_id", "s.identifier", "p.code", "v.number as version_number", "v.title", "o.display_name"])
    .where("r.status", "=", "submitted")
    .orderBy("r.submitted_at")
    .orderBy("r.number");
  return readPage(db, query, request, (r) => ({
    runId: r.id,
    runNumber: r.number,
    status: r.status,
    specimen: r.identifier,
    procedure: `${r.code} version ${r.version_number} (${r.title})`,
    operatorName: r.display_name,
    submittedAt: r.submitted_at,
    operatedByYou: r.operator_id === userId,
  }));
}
