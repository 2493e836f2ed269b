import "server-only";
import type { Executor } from "./index";

/** A stored file with the hash recorded at upload and, in plain words, the record it belongs to. */
export interface RecordedFile {
  id: string;
  storageKey: string;
  sha256: string;
  sizeBytes: number;
  purpose: string;
  fileName: string;
  /** e.g. "the data log “cycler.csv” of run R-2026-0004": what a message about this file names. */
  record: string;
}

/** Every stored file (or one, by id) with what it belongs to: a run's log, a specification's datasheet, a certificate's PDF. */
export async function listRecordedFiles(db: Executor, filter: { id?: string } = {}): Promise<RecordedFile[]> {
  let q = db
    .selectFrom("stored_file as f")
    .leftJoin("run_log as l", "l.stored_file_id", "f.id")
    .leftJoin("run as r", "r.id", "l.run_id")
    .leftJoin("cell_specification as s", "s.datasheet_file_id", "f.id")
    .leftJoin("certificate as c", "c.pdf_file_id", "f.id")
    .select(["f.id", "f.storage_key", "f.sha256", "f.size_bytes", "f.purpose", "f.original_name", "r.number as run_number", "s.maker", "s.model", "c.number as certificate_number"])
    .orderBy("f.uploaded_at")
    .orderBy("f.id");
  if (filter.id) q = q.where("f.id", "=", filter.id);
  const rows = await q.execute();
  return rows.map((r) => ({
    id: r.id,
    storageKey: r.storage_key,
    sha256: r.sha256,
    sizeBytes: Number(r.size_bytes),
    purpose: r.purpose,
    fileName: r.original_name,
    record: r.certificate_number
      ? `the PDF of certificate ${r.certificate_number}`
      : r.run_number
        ? `the data log “${r.original_name}” of run ${r.run_number}`
        : r.maker
          ? `the datasheet “${r.original_name}” of ${r.maker} ${r.model}`
          : `the ${r.purpose.replace(/-/g, " ")} file “${r.original_name}” (no longer attached to a record)`,
  }));
}

export async function getRecordedFile(db: Executor, id: string): Promise<RecordedFile | null> {
  const [file] = await listRecordedFiles(db, { id });
  return file ?? null;
}
