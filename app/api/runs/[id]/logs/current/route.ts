import { z } from "zod";
import { getDb } from "@/db";
import { getCurrentRunLog } from "@/db/run-logs";
import { apiRoute } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";
import { readVerifiedFile } from "@/lib/integrity/read-verified-file";
import { withFileRefusalPage } from "@/lib/integrity/file-refusal-page";

/** The current log's file exactly as uploaded (checked against its recorded SHA-256 first), with that hash. */
export const GET = apiRoute("/api/runs/[id]/logs/current", "GET", withFileRefusalPage(async (_req, { user, params }) => {
  const id = z.uuid("Not a run id.").parse(params.id);
  const log = await getCurrentRunLog(getDb(), id);
  if (!log) throw new DomainError("not-found", "This run has no data log yet.");
  const { file, bytes } = await readVerifiedFile(log.fileId, user, "data log download");
  return new Response(Buffer.from(bytes), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="${file.fileName.replace(/[^\w.\- ]/g, "_")}"`,
      "x-content-sha256": file.sha256,
    },
  });
}));
