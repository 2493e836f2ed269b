import type { ColumnMapping } from "@/lib/analysis/log-import";

export interface SendProgress {
  sentBytes: number;
  totalBytes: number;
}

/** How a send ended: the file is stored and waits to be read (the page follows it), or why not. */
export type SendOutcome = { type: "queued" } | { type: "already-stored"; message: string } | { type: "failed"; message: string };

/**
 * Sends the file as the raw request body; progress is the browser's own count of bytes sent. The
 * server answers 202 once the file is stored and queued; reading it is followed on the page (LogReading).
 */
export function sendLog(q: { runId: string; file: File; mapping: ColumnMapping; remember: boolean; part: boolean; onProgress: (p: SendProgress) => void }): Promise<SendOutcome> {
  return new Promise((resolve) => {
    const xhr = new XMLHttpRequest();
    const params = new URLSearchParams({ name: q.file.name, mapping: JSON.stringify(q.mapping), ...(q.part ? {} : { remember: q.remember ? "1" : "0" }) });
    // A part is appended after the run's earlier parts; a whole log replaces the stored one.
    xhr.open("POST", `/api/runs/${q.runId}/${q.part ? "log-parts" : "logs"}?${params.toString()}`);
    xhr.setRequestHeader("content-type", "text/csv");
    xhr.upload.onprogress = (e) => q.onProgress({ sentBytes: e.loaded, totalBytes: q.file.size });
    xhr.onload = () => {
      if (xhr.status === 202) {
        resolve({ type: "queued" });
        return;
      }
      if (xhr.status === 200 && q.part) {
        resolve({ type: "already-stored", message: `${q.file.name} is already stored as a part of this run's log (the same bytes, by SHA-256); nothing was stored again.` });
        return;
      }
      let message = `The server answered ${xhr.status}; nothing was stored.`;
      try {
        message = (JSON.parse(xhr.responseText) as { error?: { message?: string } }).error?.message ?? message;
      } catch {
        // keep the status line
      }
      resolve({ type: "failed", message });
    };
    xhr.onerror = () => resolve({ type: "failed", message: "The connection broke off during the upload; nothing was stored." });
    xhr.send(q.file);
  });
}
