"use client";

import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";

interface CheckAnswer {
  known: boolean;
  byteIdentical: boolean;
  signature: { present: boolean; valid: boolean; signedByLab: boolean; reason: string; signer?: string; signedAt?: string };
}

type State = { kind: "idle" } | { kind: "checking" } | { kind: "error"; message: string } | { kind: "done"; fileName: string; check: CheckAnswer };

/** Sends a PDF to the public check and says in words what the server found. */
export function CheckPdfUpload({ number }: { number: string }) {
  const [state, setState] = useState<State>({ kind: "idle" });
  const onSubmit = async (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const input = event.currentTarget.elements.namedItem("pdf") as HTMLInputElement;
    const file = input.files?.[0];
    if (!file) {
      setState({ kind: "error", message: "Choose a PDF file to check." });
      return;
    }
    setState({ kind: "checking" });
    try {
      const body = new FormData();
      body.set("pdf", file);
      const res = await fetch(`/api/check/${encodeURIComponent(number)}`, { method: "POST", body });
      const json = await res.json();
      if (!res.ok) setState({ kind: "error", message: json?.error?.message ?? `The check failed (${res.status}).` });
      else setState({ kind: "done", fileName: file.name, check: json.check as CheckAnswer });
    } catch {
      setState({ kind: "error", message: "The check could not reach the server. Try again." });
    }
  };
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-3" aria-label="Check a PDF">
      <label className="flex flex-col gap-1 text-sm">
        <span className="font-medium">Certificate PDF</span>
        <input type="file" name="pdf" accept="application/pdf,.pdf" className="text-sm" />
      </label>
      <div>
        <Button type="submit" disabled={state.kind === "checking"}>
          {state.kind === "checking" ? "Checking…" : "Check this PDF"}
        </Button>
      </div>
      <div aria-live="polite">
        {state.kind === "error" && (
          <Notice tone="problem" role="alert">
            {state.message}
          </Notice>
        )}
        {state.kind === "done" && <CheckResult fileName={state.fileName} check={state.check} />}
      </div>
    </form>
  );
}

function CheckResult({ fileName, check }: { fileName: string; check: CheckAnswer }) {
  const genuine = check.byteIdentical && check.signature.valid && check.signature.signedByLab;
  const sig = check.signature;
  const signatureWords = !sig.present
    ? "has no embedded digital signature."
    : sig.valid && sig.signedByLab
      ? `verifies: signed by ${sig.signer ?? "this laboratory"}${sig.signedAt ? ` on ${sig.signedAt}` : ""}, and the signed bytes are unchanged.`
      : sig.valid
        ? `verifies, but it was made with a key that is not this laboratory's (${sig.signer ?? "unknown signer"}).`
        : `does not verify: ${sig.reason}`;
  return (
    <Notice tone={genuine ? "done" : "problem"} title={genuine ? "Genuine: this is the certificate as issued" : "Not the certificate as issued"} role="status">
      <ul className="list-disc pl-5" data-testid="check-result">
        <li>
          {fileName} is {check.byteIdentical ? "byte-identical to" : "not identical to"} the issued PDF.
        </li>
        <li>Its digital signature {signatureWords}</li>
      </ul>
    </Notice>
  );
}
