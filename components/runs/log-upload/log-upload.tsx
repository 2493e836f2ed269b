"use client";

import { useRouter } from "next/navigation";
import { useId, useMemo, useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { sniffBytes, sniffLog, type ColumnMapping, type LogSniff, type MappingDraft } from "@/lib/analysis/log-import";
import { MappingFields } from "./mapping-fields";
import { MappingPreviewView } from "./mapping-preview-view";
import { readMappingPreview } from "./read-mapping-preview";
import { sendLog, type SendOutcome, type SendProgress } from "./send-log";

type Chosen = { file: File; head: Uint8Array; sniff: LogSniff };

function fitsColumns(mapping: ColumnMapping, columns: readonly string[]): boolean {
  return [mapping.time, mapping.voltage, mapping.current, mapping.temperature, mapping.step, mapping.capacity].every((c) => !c || columns.includes(c.column));
}

function formatMiB(bytes: number): string {
  return `${(bytes / 1048576).toFixed(1)} MiB`;
}

/**
 * Choose a cycler log, confirm how its columns map, check the first rows and their plot, then send
 * it. The browser sniffs the first 64 KiB itself (sniffLog is pure); the worker reads the whole file
 * after the upload (LogReading follows it). Once a log is stored the form closes: replacing it is a
 * deliberate second choice; while a log is being read there is no second upload.
 */
export function LogUpload({
  runId,
  remembered,
  storedLog,
  inParts,
  reading,
}: {
  runId: string;
  remembered: { instrument: string; mapping: ColumnMapping } | null;
  /** The log stored now, if any: its file name. */
  storedLog: string | null;
  /** The stored log is made of parts: the next file is offered as its next part. */
  inParts: boolean;
  /** A log of this run is waiting or being read. */
  reading: boolean;
}) {
  const router = useRouter();
  const fileId = useId();
  const [chosen, setChosen] = useState<Chosen | null>(null);
  const [draft, setDraft] = useState<MappingDraft | null>(null);
  const [notes, setNotes] = useState<string[]>([]);
  const [sniffProblem, setSniffProblem] = useState<string | null>(null);
  const [remember, setRemember] = useState(true);
  const [progress, setProgress] = useState<SendProgress | null>(null);
  const [outcome, setOutcome] = useState<Exclude<SendOutcome, { type: "queued" }> | null>(null);
  const [open, setOpen] = useState(false);
  const [mode, setMode] = useState<"whole" | "part">(inParts ? "part" : "whole");
  const formOpen = !reading && (storedLog === null || open);
  const openAs = (m: "whole" | "part") => {
    setMode(m);
    setOpen(true);
  };

  const choose = async (file: File | undefined) => {
    setChosen(null);
    setOutcome(null);
    setSniffProblem(null);
    if (!file) return;
    const head = new Uint8Array(await file.slice(0, sniffBytes).arrayBuffer());
    const sniffed = sniffLog(head, { isWholeFile: file.size <= sniffBytes });
    if (!sniffed.ok) {
      setSniffProblem(sniffed.error.message);
      return;
    }
    const s = sniffed.value;
    setChosen({ file, head, sniff: s });
    if (remembered && fitsColumns(remembered.mapping, s.columns)) {
      setDraft(remembered.mapping);
      setNotes([`The mapping last confirmed for ${remembered.instrument} fits this file's columns; check it.`]);
    } else {
      setDraft(s.proposal.draft);
      setNotes(s.proposal.notes);
    }
  };

  const preview = useMemo(() => (chosen && draft ? readMappingPreview(chosen.head, draft, chosen.file.size <= sniffBytes) : null), [chosen, draft]);

  const send = async () => {
    if (!chosen || !preview?.ok) return;
    setOutcome(null);
    setProgress({ sentBytes: 0, totalBytes: chosen.file.size });
    const result = await sendLog({ runId, file: chosen.file, mapping: draft as ColumnMapping, remember, part: mode === "part", onProgress: setProgress });
    setOutcome(result.type === "queued" ? null : result);
    setProgress(null);
    if (result.type !== "failed") {
      setChosen(null);
      setDraft(null);
      setOpen(false);
      router.refresh();
    }
  };

  return (
    <section aria-labelledby="upload-heading" className="flex flex-col gap-4" data-testid="log-upload">
      <h2 id="upload-heading" className="text-lg font-semibold">
        {storedLog === null ? "Upload the cycler's log" : inParts ? "Add a part, or replace the log" : "Replace the stored log, or add a part"}
      </h2>
      {outcome?.type === "already-stored" && (
        <Notice role="status" title="Already have it">
          {outcome.message}
        </Notice>
      )}
      {outcome?.type === "failed" && (
        <Notice tone="problem" role="alert" title="The upload did not complete; nothing was stored">
          {outcome.message}
        </Notice>
      )}
      {reading && <p className="text-sm">A log of this run is being read (see “Latest upload” above). Another can be sent once it is done.</p>}
      {!reading && !formOpen && (
        <div className="flex flex-col items-start gap-2 text-sm">
          <p>
            {storedLog} is stored and evaluated. Add the cycler&apos;s next file as a part: it is appended after the stored samples and the run is
            evaluated again from all of them. Replace the log only if it is the wrong file: the stored one stays on file, marked as replaced.
          </p>
          <div className="flex flex-wrap gap-2">
            <Button onClick={() => openAs("part")} className="min-h-11 px-4">
              Add the next part…
            </Button>
            <Button onClick={() => openAs("whole")} className="min-h-11 px-4">
              Replace the stored log…
            </Button>
          </div>
        </div>
      )}
      {formOpen && (
        <fieldset className="flex flex-col gap-1 text-sm">
          <legend className="font-semibold">Send the file as</legend>
          <label className="flex items-center gap-2">
            <input type="radio" name="log-mode" checked={mode === "part"} onChange={() => setMode("part")} />
            {storedLog === null ? "the first part of a log the cycler writes in parts" : "the next part, appended after the stored samples"}
          </label>
          <label className="flex items-center gap-2">
            <input type="radio" name="log-mode" checked={mode === "whole"} onChange={() => setMode("whole")} />
            {storedLog === null ? "the whole log" : `the whole log, replacing ${storedLog} (it stays on file, marked as replaced)`}
          </label>
          {storedLog !== null && (
            <button type="button" onClick={() => setOpen(false)} className="self-start text-copper-deep underline">
              Keep the stored log as it is
            </button>
          )}
        </fieldset>
      )}
      {formOpen && (
      <div>
        <label htmlFor={fileId} className="block text-sm font-semibold">
          CSV file from the cycler (up to 200 MiB)
        </label>
        <input id={fileId} type="file" accept=".csv,.txt,.tsv,text/csv,text/plain" onChange={(e) => void choose(e.target.files?.[0])} className="mt-1 text-sm" />
      </div>
      )}
      {sniffProblem && (
        <Notice tone="problem" role="alert" title="This file cannot be read as a log">
          {sniffProblem}
        </Notice>
      )}
      {formOpen && chosen && draft && (
        <>
          {notes.length > 0 && (
            <Notice title="How the columns were guessed">
              <ul className="list-disc pl-5">
                {notes.map((n) => (
                  <li key={n}>{n}</li>
                ))}
              </ul>
            </Notice>
          )}
          <MappingFields columns={chosen.sniff.columns} draft={draft} onChange={setDraft} />
          {preview && <MappingPreviewView preview={preview} />}
          {mode === "whole" && <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={remember} onChange={(e) => setRemember(e.target.checked)} />
            Keep this mapping for the run&apos;s cycler channel, to offer next time
          </label>}
          <div>
            <Button onClick={() => void send()} disabled={!preview?.ok || progress !== null}>
              {mode === "part" ? "Add" : "Upload"} {chosen.file.name} ({formatMiB(chosen.file.size)}){mode === "part" ? " as a part" : ""}
            </Button>
          </div>
        </>
      )}
      {progress && (
        <div role="status" aria-live="polite" className="flex flex-col gap-1 text-sm" data-testid="upload-progress">
          <label>
            Sent {formatMiB(progress.sentBytes)} of {formatMiB(progress.totalBytes)}
            <progress className="ml-2 align-middle" max={progress.totalBytes} value={progress.sentBytes} />
          </label>
          <span>The log is read once the whole file has arrived; this page then shows how far the reading has come.</span>
        </div>
      )}
    </section>
  );
}
