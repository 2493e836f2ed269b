import { z } from "zod";
import { LogReading } from "@/components/runs/log-upload/log-reading";
import { LogPartsList } from "@/components/runs/log-parts-list";
import { LogUpload } from "@/components/runs/log-upload/log-upload";
import { Notice } from "@/components/ui/notice";
import { PlainLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { listLogIngestJobs } from "@/db/log-ingest-jobs";
import { listPartsOfLog } from "@/db/run-log-parts";
import { getCurrentRunLog } from "@/db/run-logs";
import { getRun } from "@/db/runs";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { getRememberedLogMapping } from "@/lib/runs/remember-log-mapping";
import { isLogJobOpen, toLogJobStatus } from "@/lib/runs/log-ingest/log-job-status";
import { isRunOpen } from "@/lib/runs/run-status";

export default async function RunLogPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageAccess("/runs/[id]/log");
  const runId = z.uuid().parse((await params).id);
  const [run, log, [latestUpload]] = await Promise.all([getRun(getDb(), runId), getCurrentRunLog(getDb(), runId), listLogIngestJobs(getDb(), runId, 1)]);
  const parts = log?.inParts ? await listPartsOfLog(getDb(), log.id) : [];
  const reading = latestUpload !== undefined && isLogJobOpen(latestUpload.state);
  const mayUpload = run !== null && isRunOpen(run.status) && can(user.role, "run.operate");
  // The next part is read as the earlier parts were; otherwise the mapping last kept for the cycler channel is offered.
  const remembered = !mayUpload ? null : log?.inParts ? { instrument: "the earlier parts", mapping: log.mapping } : await getRememberedLogMapping(runId);
  return (
    <div className="flex flex-col gap-8">
      <section aria-labelledby="current-log-heading">
        <h2 id="current-log-heading" className="mb-2 text-lg font-semibold">
          Current data log
        </h2>
        {log?.inParts ? (
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm" data-testid="current-log">
            <dt className="font-semibold">Made of</dt>
            <dd>
              {parts.length} {parts.length === 1 ? "part" : "parts"}, listed below
            </dd>
            <dt className="font-semibold">Rows</dt>
            <dd>{log.sampleCount.toLocaleString("en-GB")}</dd>
            <dt className="font-semibold">Last part received</dt>
            <dd>{(parts.at(-1)?.receivedAt ?? log.uploadedAt).toISOString().replace("T", " ").slice(0, 16)} UTC</dd>
          </dl>
        ) : log ? (
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm" data-testid="current-log">
            <dt className="font-semibold">File</dt>
            <dd>
              {log.fileName} ({(log.sizeBytes / 1048576).toFixed(1)} MiB) ·{" "}
              <PlainLink href={`/api/runs/${runId}/logs/current`}>
                download
              </PlainLink>
            </dd>
            <dt className="font-semibold">SHA-256</dt>
            <dd>
              <code className="break-all">{log.sha256}</code>
            </dd>
            <dt className="font-semibold">Rows</dt>
            <dd>{log.sampleCount.toLocaleString("en-GB")}</dd>
            <dt className="font-semibold">Uploaded</dt>
            <dd>{log.uploadedAt.toISOString().replace("T", " ").slice(0, 16)} UTC</dd>
          </dl>
        ) : (
          <Notice>No data log has been uploaded for this run yet.</Notice>
        )}
      </section>
      {parts.length > 0 && log && <LogPartsList parts={parts} timeForm={log.mapping.time.form} />}
      {latestUpload && (
        <section aria-labelledby="latest-upload-heading" className="flex flex-col gap-2" data-testid="log-reading">
          <h2 id="latest-upload-heading" className="text-lg font-semibold">
            Latest upload
          </h2>
          <LogReading key={latestUpload.id} runId={runId} initial={toLogJobStatus(latestUpload)} />
        </section>
      )}
      {mayUpload && <LogUpload runId={runId} remembered={remembered} storedLog={log ? (log.inParts ? `The log of ${parts.length} ${parts.length === 1 ? "part" : "parts"}` : log.fileName) : null} inParts={log?.inParts ?? false} reading={reading} />}
    </div>
  );
}
