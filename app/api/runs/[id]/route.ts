import { z } from "zod";
import { getDb } from "@/db";
import { getCurrentRunLog } from "@/db/run-logs";
import { getLatestRunEvaluation } from "@/db/run-series";
import { getRun } from "@/db/runs";
import { apiRoute } from "@/lib/auth/guards";
import { DomainError } from "@/lib/errors";

/** The run, its current log and its latest evaluation (findings, results, verdict). */
export const GET = apiRoute("/api/runs/[id]", "GET", async (_req, { params }) => {
  const id = z.uuid("Not a run id.").parse(params.id);
  const [run, log, evaluation] = await Promise.all([getRun(getDb(), id), getCurrentRunLog(getDb(), id), getLatestRunEvaluation(getDb(), id)]);
  if (!run) throw new DomainError("not-found", "No such run.");
  return Response.json({
    run: {
      id: run.id,
      number: run.number,
      status: run.status,
      procedure: run.procedure,
      specimen: run.specimen,
      operator: run.operator,
      procedureSource: run.procedureSource,
      createdAt: run.createdAt,
      startedAt: run.startedAt,
      submittedAt: run.submittedAt,
    },
    log: log && { id: log.id, fileName: log.fileName, sha256: log.sha256, sizeBytes: log.sizeBytes, sampleCount: log.sampleCount, mapping: log.mapping, uploadedAt: log.uploadedAt },
    evaluation: evaluation && { id: evaluation.id, runLogId: evaluation.runLogId, evaluatedAt: evaluation.evaluatedAt, ...evaluation.evaluation },
  });
});
