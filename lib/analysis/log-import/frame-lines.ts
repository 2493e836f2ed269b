import { detectWrongFileType, fileTypeProbeBytes } from "./detect-file-type";
import type { LogImportError } from "./log-import-error";

/** Bytes held back before decoding a ZIP, enough to recognise an Office file by its first entries. */
const headProbeBytes = 4096;

export interface LineFramer {
  /** Total bytes pushed so far (also those of a chunk that broke the size limit). */
  readonly bytes: number;
  /** Takes the next bytes; whole lines go to `onBlock`. */
  push(chunk: Uint8Array): void;
  /**
   * The end of the file: flushes the decoder and returns the last line when the file does not end with
   * a line break, "" when it does, or null when no byte arrived at all.
   */
  end(): string | null;
}

/**
 * Turns bytes into blocks of whole lines (each block ends with "\n"), as they arrive. Before any text
 * is decoded the first bytes are checked for a file that is not text (a workbook, an archive, a PDF);
 * a line longer than `maxLineChars` and a file larger than `maxBytes` are refused through `refuse`.
 * `nextLine` gives the number of the line being read, for the messages; `isRefused` stops the work.
 */
export function createLineFramer({
  maxBytes,
  maxLineChars,
  nextLine,
  isRefused,
  refuse,
  onBlock,
}: {
  maxBytes: number;
  maxLineChars: number;
  nextLine: () => number;
  isRefused: () => boolean;
  refuse: (error: LogImportError) => void;
  onBlock: (block: string) => void;
}): LineFramer {
  const decoder = new TextDecoder("utf-8", { fatal: false });
  let bytes = 0;
  let headParts: Uint8Array[] | null = [];
  let headLength = 0;
  let nulProbeLeft = fileTypeProbeBytes;
  let tail: string[] = [];
  let tailChars = 0;

  function push(chunk: Uint8Array): void {
    if (bytes + chunk.length > maxBytes) {
      bytes += chunk.length;
      refuse({ code: "too-large", message: `The file is larger than the limit of ${formatBytes(maxBytes)}; reading stopped at line ${nextLine()}.`, line: nextLine() });
      return;
    }
    bytes += chunk.length;
    if (headParts) {
      // Copied: the caller may reuse its buffer for the next chunk.
      headParts.push(chunk.slice());
      headLength += chunk.length;
      // Eight bytes show any file type; a ZIP's first entries tell an Excel workbook from other archives.
      if (headLength >= 8 && (headLength >= headProbeBytes || !isZipStart(headParts))) readHead();
      return;
    }
    if (nulProbeLeft > 0) {
      if (chunk.subarray(0, nulProbeLeft).includes(0)) {
        refuseWrongType(Uint8Array.of(0));
        return;
      }
      nulProbeLeft -= chunk.length;
    }
    takeText(decoder.decode(chunk, { stream: true }));
  }

  function refuseWrongType(head: Uint8Array): void {
    refuse({ code: "wrong-file-type", message: detectWrongFileType(head) ?? "This is not a CSV text log." });
  }

  function readHead(): void {
    const parts = headParts ?? [];
    headParts = null;
    const head = new Uint8Array(headLength);
    let at = 0;
    for (const part of parts) {
      head.set(part, at);
      at += part.length;
    }
    if (detectWrongFileType(head) !== null) {
      refuseWrongType(head);
      return;
    }
    nulProbeLeft -= head.length;
    takeText(decoder.decode(head, { stream: true }));
  }

  /** Frames decoded text into whole lines; an unfinished line waits in the tail. */
  function takeText(text: string): void {
    if (isRefused() || text === "") return;
    const lastBreak = text.lastIndexOf("\n");
    if (lastBreak === -1) {
      tail.push(text);
      tailChars += text.length;
      if (tailChars > maxLineChars) {
        const line = nextLine();
        refuse({ code: "line-too-long", message: `Line ${line}: the line is longer than ${maxLineChars} characters; this does not look like a CSV log.`, line });
      }
      return;
    }
    const block = tail.length === 0 ? text.slice(0, lastBreak + 1) : tail.join("") + text.slice(0, lastBreak + 1);
    const rest = text.slice(lastBreak + 1);
    tail = rest === "" ? [] : [rest];
    tailChars = rest.length;
    onBlock(block);
  }

  function end(): string | null {
    if (!isRefused() && headParts) {
      if (headLength === 0) return null;
      readHead();
    }
    if (!isRefused()) takeText(decoder.decode());
    const last = tail.join("");
    tail = [];
    return last;
  }

  return {
    get bytes() {
      return bytes;
    },
    push,
    end,
  };
}

export function formatBytes(count: number): string {
  if (count >= 1 << 20) return `${(count / (1 << 20)).toFixed(count % (1 << 20) === 0 ? 0 : 1)} MiB`;
  if (count >= 1 << 10) return `${(count / (1 << 10)).toFixed(count % (1 << 10) === 0 ? 0 : 1)} KiB`;
  return `${count} bytes`;
}

function isZipStart(parts: readonly Uint8Array[]): boolean {
  const first: number[] = [];
  for (const part of parts) {
    for (const byte of part.subarray(0, 2 - first.length)) first.push(byte);
    if (first.length === 2) break;
  }
  return first[0] === 0x50 && first[1] === 0x4b;
}
