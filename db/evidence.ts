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
  /** The person, or the machine sender's label ("pushed by …"). */
  uploadedBy: string;
  /** For one part of a log sent in parts: its number and span in the run's time base (Unix or elapsed seconds). */
  part?: { number: number; firstTimeS: number; lastTimeS: number; timeForm: "elapsed" | "timestamp" };
}

/** Every log uploaded for a run, current or replaced, and every part of a log sent in parts: all of it is evidence. Oldest first. */
export async function listRunLogFiles(db: Executor, runId: string): Promise<EvidenceLogFile[]> {
  const wholes = await db
    .selectFrom("run_log as l")
    .innerJoin("stored_file as f", "f.id", "l.stored_file_id")
    .leftJoin("app_user as u", "u.id", "l.uploaded_by")
    .select(["l.id", "f.id as stored_file_id", "f.storage_key", "f.original_name", "f.sha256", "f.size_bytes", "l.current", "l.uploaded_at", "u.display_name"])
    .where("l.run_id", "=", runId)
    .where("l.in_parts", "=", false)
    .execute();
  const parts = await db
    .selectFrom("run_log_part as p")
    .innerJoin("run_log as l", "l.id", "p.run_log_id")
    .innerJoin("stored_file as f", "f.id", "p.stored_file_id")
    .leftJoin("app_user as u", "u.id", "p.uploaded_by")
    .select(["l.id", "f.id as stored_file_id", "f.storage_key", "f.original_name", "f.sha256", "f.size_bytes", "l.current", "l.mapping", "p.received_at", "p.part_number", "p.first_time_s", "p.last_time_s", "p.machine_label", "u.display_name"])
    .where("p.run_id", "=", runId)
    .execute();
  const files: EvidenceLogFile[] = [
    ...wholes.map((r) => ({
      runLogId: r.id,
      storedFileId: r.stored_file_id,
      storageKey: r.storage_key,
      fileName: r.original_name,
      sha256: r.sha256,
      sizeBytes: Number(r.size_bytes),
      current: r.current,
      uploadedAt: r.uploaded_at,
      uploadedBy: r.display_name ?? "an unnamed sender",
    })),
    ...parts.map((r) => ({
      runLogId: r.id,
      storedFileId: r.stored_file_id,
      storageKey: r.storage_key,
      fileName: r.original_name,
      sha256: r.sha256,
      sizeBytes: Number(r.size_bytes),
      current: r.current,
      uploadedAt: r.received_at,
      uploadedBy: r.machine_label ? `a push from ${r.machine_label}` : (r.display_name ?? "an unnamed sender"),
      part: {
        number: r.part_number,
        firstTimeS: r.first_time_s,
        lastTimeS: r.last_time_s,
        timeForm: (r.mapping as { time?: { form?: string } }).time?.form === "timestamp" ? ("timestamp" as const) : ("elapsed" as const),
      },
    })),
  ];
  return files.sort((a, b) => a.uploadedAt.getTime() - b.uploadedAt.getTime() || (a.part?.number ?? 0) - (b.part?.number ?? 0) || a.storedFileId.localeCompare(b.storedFileId));
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
