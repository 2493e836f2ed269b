import { z } from "zod";
import { getDb } from "@/db";
import { getCurrentRunLog } from "@/db/run-logs";
import { getStoredFile } from "@/db/stored-files";
import { apiRoute } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";
import { getObjectBytes } from "@/lib/storage";

/** The current log's file exactly as uploaded, with its SHA-256. */
export const GET = apiRoute<{ id: string }>("run.read", async (_req, { params }) => {
  const id = z.uuid("Not a run id.").parse(params.id);
  const log = await getCurrentRunLog(getDb(), id);
  if (!log) throw new DomainError("not-found", "This run has no data log yet.");
  const file = await getStoredFile(getDb(), log.fileId);
  if (!file) throw new DomainError("not-found", "The log's file record is missing.");
  const bytes = await getObjectBytes(file.storageKey);
  return new Response(Buffer.from(bytes), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${file.originalName.replace(/[^\w.\- ]/g, "_")}"`,
      "x-content-sha256": file.sha256,
    },
  });
});
