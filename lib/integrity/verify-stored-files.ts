import "server-only";
import type { Executor } from "@/db";
import { listRecordedFiles, type RecordedFile } from "@/db/stored-file-records";
import { checkRecordedFile, describeFault } from "./read-verified-file";

export interface FileFault {
  file: RecordedFile;
  problem: "missing" | "changed" | "records disagree";
  message: string;
}

export interface FilesReport {
  checked: number;
  bytes: number;
  faults: FileFault[];
}

/** Reads every stored file back from the object store and compares it with the SHA-256 recorded at upload. */
export async function verifyStoredFiles(db: Executor, onProgress?: (done: number, total: number) => void): Promise<FilesReport> {
  const files = await listRecordedFiles(db);
  const faults: FileFault[] = [];
  let bytes = 0;
  for (const [i, file] of files.entries()) {
    const check = await checkRecordedFile(file);
    if (check.ok) bytes += check.bytes.byteLength;
    else faults.push({ file, problem: check.problem, message: describeFault(file, check.problem) });
    onProgress?.(i + 1, files.length);
  }
  // A certificate states its PDF's hash itself (frozen at issue): the file record must say the same.
  const disagreeing = await db
    .selectFrom("certificate as c")
    .innerJoin("stored_file as f", "f.id", "c.pdf_file_id")
    .select(["c.number", "f.id"])
    .whereRef("c.pdf_sha256", "<>", "f.sha256")
    .execute();
  for (const c of disagreeing) {
    const file = files.find((f) => f.id === c.id)!;
    faults.push({ file, problem: "records disagree", message: `The file record of certificate ${c.number} states another SHA-256 than the certificate itself: one of the two records was changed.` });
  }
  return { checked: files.length, bytes, faults };
}
