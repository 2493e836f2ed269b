"use client";

import { useRouter } from "next/navigation";
import { useEffect, useState } from "react";
import { describeVerdictInline } from "@/components/runs/results/verdict-words";
import { Notice } from "@/components/ui/notice";
import type { LogJobStatus } from "@/lib/runs/log-ingest/log-job-status";

const pollMs = 1000;

function formatMiB(bytes: number): string {
  return `${(bytes / 1048576).toFixed(1)} MiB`;
}

function isOpen(state: LogJobStatus["state"]): boolean {
  return state === "waiting" || state === "reading";
}

/**
 * How far the latest upload has been read. The state lives in the database, so it is the same after
 * a closed tab, on another computer or after a server restart; while the log is being read the page
 * asks again every second, and shows the stored log once it is done.
 */
export function LogReading({ runId, initial }: { runId: string; initial: LogJobStatus }) {
  const router = useRouter();
  const [job, setJob] = useState(initial);
  const [lost, setLost] = useState(false);

  useEffect(() => {
    if (!isOpen(job.state)) return;
    let stopped = false;
    const timer = setTimeout(async () => {
      try {
        const res = await fetch(`/api/runs/${runId}/logs`, { cache: "no-store" });
        if (!res.ok) throw new Error(String(res.status));
        const { uploads } = (await res.json()) as { uploads: LogJobStatus[] };
        const latest = uploads.find((u) => u.id === job.id);
        if (stopped || !latest) return;
        setLost(false);
        setJob(latest);
        if (!isOpen(latest.state)) router.refresh();
      } catch {
        if (!stopped) {
          setLost(true);
          setJob((j) => ({ ...j }));
        }
      }
    }, pollMs);
    return () => {
      stopped = true;
      clearTimeout(timer);
    };
  }, [job, runId, router]);

  const file = `${job.fileName} (${formatMiB(job.sizeBytes)})`;
  const retried = job.attempts > 1 ? " It is being read again after an interruption; nothing is stored twice." : "";
  switch (job.state) {
    case "waiting":
      return (
        <Notice role="status" title={`${file} is stored and waits to be read`}>
          Reading starts in a moment. You may close this page: the reading goes on, and this page shows it when you come back.
          {lost && <span className="block">The server did not answer just now; asking again.</span>}
        </Notice>
      );
    case "reading":
      return (
        <Notice role="status" title={`Reading ${file}`}>
          <span data-testid="rows-read">{job.rowsRead.toLocaleString("en-GB")} rows read so far.</span>
          {retried} You may close this page: the reading goes on.
          {lost && <span className="block">The server did not answer just now; asking again.</span>}
        </Notice>
      );
    case "evaluated":
    case "stored":
      return (
        <Notice tone="done" role="status" title={job.outcome?.partNumber ? `Part ${job.outcome.partNumber} stored` : "Log stored"}>
          {file}: {(job.outcome?.rows ?? job.rowsRead).toLocaleString("en-GB")} rows read and stored
          {job.outcome?.partNumber ? " after the earlier parts (listed under “Log parts” above)." : " (shown under “Current data log” above)."}{" "}
          {job.outcome?.notice && <span className="block font-semibold">{job.outcome.notice}</span>}
          {job.outcome?.verdict ? `Evaluated: ${describeVerdictInline(job.outcome.verdict)}` : (job.outcome?.evaluationProblem ?? "")}
          {(job.outcome?.warnings ?? []).map((w) => (
            <span key={w} className="block">
              {w}
            </span>
          ))}
        </Notice>
      );
    case "refused":
      return (
        <Notice tone="problem" role="alert" title={`${job.fileName} was refused; nothing of it was stored`}>
          {job.outcome?.problem} The run and its earlier records are as they were. Correct the file, or the column mapping, and upload it again.
        </Notice>
      );
    case "failed":
      return (
        <Notice tone="problem" role="alert" title={`${job.fileName} could not be read; nothing of it was stored`}>
          {job.outcome?.problem}
        </Notice>
      );
    default: {
      const never: never = job.state;
      return never;
    }
  }
}
