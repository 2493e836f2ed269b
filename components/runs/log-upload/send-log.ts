import type { ColumnMapping } from "@/lib/analysis/log-import";
import { readUploadMessages, type UploadMessage } from "@/lib/runs/upload-progress";

export interface SendProgress {
  sentBytes: number;
  totalBytes: number;
  parsedRows: number;
  parsedBytes: number;
}

/**
 * Sends the file as the raw request body. Upload progress comes from the browser (bytes sent);
 * parse progress from the NDJSON the server streams back while it reads (rows).
 */
export function sendLog(q: { runId: string; file: File; mapping: ColumnMapping; remember: boolean; onProgress: (p: SendProgress) => void }): Promise<UploadMessage> {
  return new Promise((resolve) => {
    const xhr = new XMLHttpRequest();
    const params = new URLSearchParams({ name: q.file.name, mapping: JSON.stringify(q.mapping), remember: q.remember ? "1" : "0" });
    xhr.open("POST", `/api/runs/${q.runId}/logs?${params.toString()}`);
    xhr.setRequestHeader("content-type", "text/csv");
    const progress: SendProgress = { sentBytes: 0, totalBytes: q.file.size, parsedRows: 0, parsedBytes: 0 };
    let seen = 0;
    let rest = "";
    let last: UploadMessage | null = null;
    const readNew = () => {
      const text = xhr.responseText;
      const read = readUploadMessages(rest + text.slice(seen));
      seen = text.length;
      rest = read.rest;
      for (const m of read.messages) {
        if (m.type === "progress") {
          progress.parsedRows = m.rows;
          progress.parsedBytes = m.bytes;
          q.onProgress({ ...progress });
        } else {
          last = m;
        }
      }
    };
    xhr.upload.onprogress = (e) => {
      progress.sentBytes = e.loaded;
      q.onProgress({ ...progress });
    };
    xhr.onprogress = () => {
      if (xhr.status === 200) readNew();
    };
    xhr.onload = () => {
      if (xhr.status !== 200) {
        let message = `The server answered ${xhr.status}.`;
        try {
          message = (JSON.parse(xhr.responseText) as { error?: { message?: string } }).error?.message ?? message;
        } catch {
          // keep the status line
        }
        resolve({ type: "failed", message });
        return;
      }
      readNew();
      if (rest.trim() !== "") {
        rest += "\n";
        readNew();
      }
      resolve(last ?? { type: "failed", message: "The server's answer ended before the upload finished." });
    };
    xhr.onerror = () => resolve({ type: "failed", message: "The connection broke off during the upload; nothing was stored." });
    xhr.send(q.file);
  });
}
