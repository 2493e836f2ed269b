import "server-only";
import type { Executor } from "./index";

export interface StoredFileView {
  id: string;
  storageKey: string;
  originalName: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  purpose: string;
  uploadedAt: Date;
}

export async function insertStoredFile(
  db: Executor,
  f: { storageKey: string; originalName: string; contentType: string; sizeBytes: number; sha256: string; purpose: string; uploadedBy: string | null },
): Promise<StoredFileView> {
  const row = await db
    .insertInto("stored_file")
    .values({
      storage_key: f.storageKey,
      original_name: f.originalName,
      content_type: f.contentType,
      size_bytes: f.sizeBytes,
      sha256: f.sha256,
      purpose: f.purpose,
      uploaded_by: f.uploadedBy,
    })
    .returning(["id", "uploaded_at"])
    .executeTakeFirstOrThrow();
  return { id: row.id, storageKey: f.storageKey, originalName: f.originalName, contentType: f.contentType, sizeBytes: f.sizeBytes, sha256: f.sha256, purpose: f.purpose, uploadedAt: row.uploaded_at };
}

export async function getStoredFile(db: Executor, id: string): Promise<StoredFileView | null> {
  const r = await db
    .selectFrom("stored_file")
    .select(["id", "storage_key", "original_name", "content_type", "size_bytes", "sha256", "purpose", "uploaded_at"])
    .where("id", "=", id)
    .executeTakeFirst();
  if (!r) return null;
  return {
    id: r.id,
    storageKey: r.storage_key,
    originalName: r.original_name,
    contentType: r.content_type,
    sizeBytes: Number(r.size_bytes),
    sha256: r.sha256,
    purpose: r.purpose,
    uploadedAt: r.uploaded_at,
  };
}
