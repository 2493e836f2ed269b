import "server-only";
import type { Executor } from "./index";

export interface EvidenceLogFile {
  runLogId: string;
  storedFileId: string;
  storageKey: string;
  fileName: string;
  sha256: string;
  sizeBytes: number;
  current: boolean;
  uploadedAt: Date;
  uploadedBy: string;
}

/** Every log uploaded for a run, current or replaced: all of it is evidence. Oldest first. */
export async function listRunLogFiles(db: Executor, runId: string): Promise<EvidenceLogFile[]> {
  const rows = await db
    .selectFrom("run_log as l")
    .innerJoin("stored_file as f", "f.id", "l.stored_file_id")
    .innerJoin("app_user as u", "u.id", "l.uploaded_by")
    .select(["l.id", "f.id as stored_file_id", "f.storage_key", "f.original_name", "f.sha256", "f.size_bytes", "l.current", "l.uploaded_at", "u.display_name"])
    .where("l.run_id", "=", runId)
    .orderBy("l.uploaded_at")
    .orderBy("l.id")
    .execute();
  return rows.map((r) => ({
    runLogId: r.id,
    storedFileId: r.stored_file_id,
    storageKey: r.storage_key,
    fileName: r.original_name,
    sha256: r.sha256,
    sizeBytes: Number(r.size_bytes),
    current: r.current,
    uploadedAt: r.uploaded_at,
    uploadedBy: r.display_name,
  }));
}

/** The evaluation the accepting reviewer signed for (the one a run certificate rests on), else the latest. */
export async function getReviewedEvaluation(db: Executor, runId: string): Promise<{ id: string; evaluatedAt: Date; evaluation: unknown; reviewed: boolean } | null> {
  const reviewed = await db
    .selectFrom("run_review as r")
    .innerJoin("run_evaluation as e", "e.id", "r.run_evaluation_id")
    .select(["e.id", "e.evaluated_at", "e.evaluation"])
    .where("r.run_id", "=", runId)
    .where("r.decision", "=", "accepted")
    .orderBy("r.created_at", "desc")
    .executeTakeFirst();
  if (reviewed) return { id: reviewed.id, evaluatedAt: reviewed.evaluated_at, evaluation: reviewed.evaluation, reviewed: true };
  const latest = await db
    .selectFrom("run_evaluation")
    .select(["id", "evaluated_at", "evaluation"])
    .where("run_id", "=", runId)
    .orderBy("evaluated_at", "desc")
    .orderBy("id", "desc")
    .executeTakeFirst();
  return latest ? { id: latest.id, evaluatedAt: latest.evaluated_at, evaluation: latest.evaluation, reviewed: false } : null;
}

/** Ids of every certificate issued for a run (amendments included), for its audit trail. */
export async function listRunCertificateIds(db: Executor, runId: string): Promise<string[]> {
  const rows = await db.selectFrom("certificate").select("id").where("run_id", "=", runId).execute();
  return rows.map((r) => r.id);
}
