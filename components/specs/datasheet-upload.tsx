"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { DATASHEET_MAX_BYTES, datasheetTooLargeMessage } from "@/lib/specs/datasheet-limits";

/** Sends a datasheet PDF to the server, which checks it by content, stores it and records its SHA-256. */
export function DatasheetUpload({ specId }: { specId: string }) {
  const router = useRouter();
  const id = useId();
  const [state, setState] = useState<{ kind: "idle" | "sending" | "done" | "failed"; message?: string }>({ kind: "idle" });
  async function upload(form: HTMLFormElement) {
    const data = new FormData(form);
    const file = data.get("datasheet");
    if (!(file instanceof File) || file.size === 0) {
      setState({ kind: "failed", message: "Choose a PDF file first." });
      return;
    }
    if (file.size > DATASHEET_MAX_BYTES) {
      setState({ kind: "failed", message: datasheetTooLargeMessage(file.size) });
      return;
    }
    setState({ kind: "sending" });
    const res = await fetch(`/api/specs/${specId}/datasheet`, { method: "POST", body: data });
    const body = (await res.json().catch(() => null)) as { error?: { message: string }; sha256?: string } | null;
    if (!res.ok) {
      setState({ kind: "failed", message: body?.error?.message ?? `The upload failed (${res.status}).` });
      return;
    }
    form.reset();
    setState({ kind: "done", message: `Stored. SHA-256 ${body?.sha256 ?? ""}` });
    router.refresh();
  }
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        void upload(e.currentTarget);
      }}
    >
      <label htmlFor={`${id}-file`} className="flex flex-col text-sm">
        Datasheet (PDF, at most 10 MB)
        <input id={`${id}-file`} name="datasheet" type="file" accept="application/pdf,.pdf" aria-describedby={`${id}-answer`} className="text-sm" />
      </label>
      <Button type="submit" variant="secondary" disabled={state.kind === "sending"}>
        {state.kind === "sending" ? "Uploading…" : "Upload datasheet"}
      </Button>
      <p id={`${id}-answer`} aria-live="polite" role={state.kind === "failed" ? "alert" : "status"} className={state.kind === "failed" ? "w-full text-sm text-deviates" : "w-full text-sm text-meets [overflow-wrap:anywhere]"}>
        {state.message}
      </p>
    </form>
  );
}
