import type { LogImportError } from "@/lib/analysis/log-import";
import type { RunVerdict } from "@/lib/conformance";

/**
 * What the upload route streams back while it reads a log, one JSON object per line (NDJSON):
 * progress as the rows are parsed, then exactly one closing message.
 */
export type UploadMessage =
  | { type: "progress"; bytes: number; rows: number }
  | { type: "stored"; runLogId: string; rows: number; bytes: number; sha256: string; warnings: string[]; verdict: RunVerdict | null; evaluationProblem: string | null }
  | { type: "refused"; error: LogImportError }
  | { type: "failed"; message: string };

export function encodeUploadMessage(message: UploadMessage): string {
  return `${JSON.stringify(message)}\n`;
}

/**
 * Splits streamed text into whole messages; the part after the last line break waits for more.
 * A line that is not a message is reported as a failure rather than thrown.
 */
export function readUploadMessages(buffered: string): { messages: UploadMessage[]; rest: string } {
  const lines = buffered.split("\n");
  const rest = lines.pop() ?? "";
  const messages: UploadMessage[] = [];
  for (const line of lines) {
    if (line.trim() === "") continue;
    try {
      const parsed = JSON.parse(line) as { type?: unknown };
      if (parsed && typeof parsed === "object" && ["progress", "stored", "refused", "failed"].includes(String(parsed.type))) {
        messages.push(parsed as UploadMessage);
        continue;
      }
    } catch {
      // fall through: reported below
    }
    messages.push({ type: "failed", message: `The server sent an unreadable answer: ${line.slice(0, 120)}` });
  }
  return { messages, rest };
}

/** Calls `send` at most once per `intervalMs` (and always for the first call): progress, not a flood. */
export function throttleProgress<T>(send: (value: T) => void, intervalMs: number, now: () => number): (value: T) => void {
  let last = Number.NEGATIVE_INFINITY;
  return (value) => {
    const t = now();
    if (t - last < intervalMs) return;
    last = t;
    send(value);
  };
}
