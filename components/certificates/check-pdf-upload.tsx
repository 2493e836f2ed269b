"use client";

import { useEffect, useRef, useState, type FormEvent, type ReactNode } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";

interface CheckAnswer {
  known: boolean;
  byteIdentical: boolean;
  signature: { present: boolean; valid: boolean; signedByLab: boolean; reason: string; signer?: string; signedAt?: string };
}

type State = { kind: "idle" } | { kind: "checking" } | { kind: "error"; message: string } | { kind: "done"; fileName: string; check: CheckAnswer };

/**
 * The public check of one certificate: its status banner at the top, then its details, then the upload.
 * Once a PDF is checked, the verdict for that file takes the banner's place at the top, so the page
 * never says "valid" above "not the certificate as issued".
 */
export function CertificateCheck({
  number,
  status,
  banner,
  details,
  uploadIntro,
}: {
  number: string;
  status: "valid" | "superseded" | "revoked";
  banner: ReactNode;
  details: ReactNode;
  uploadIntro: ReactNode;
}) {
  const [state, setState] = useState<State>({ kind: "idle" });
  const verdict = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (state.kind === "done") {
      verdict.current?.scrollIntoView({ block: "start" });
      verdict.current?.focus();
    }
  }, [state]);
  return (
    <>
      <div ref={verdict} tabIndex={-1} className="focus:outline-none" data-testid="check-top">
        {state.kind === "done" ? <CheckResult fileName={state.fileName} check={state.check} number={number} status={status} /> : banner}
      </div>
      {details}
      <section aria-labelledby="upload-heading" className="rounded border border-rule bg-white p-4">
        {uploadIntro}
        <CheckPdfUpload number={number} state={state} setState={setState} />
      </section>
    </>
  );
}

function CheckPdfUpload({ number, state, setState }: { number: string; state: State; setState: (s: State) => void }) {
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
        {state.kind === "done" && (
          <p className="text-sm" role="status">
            Checked {state.fileName}: the verdict is at the top of the page.
          </p>
        )}
      </div>
    </form>
  );
}

function CheckResult({ fileName, check, number, status }: { fileName: string; check: CheckAnswer; number: string; status: "valid" | "superseded" | "revoked" }) {
  const genuine = check.byteIdentical && check.signature.valid && check.signature.signedByLab;
  const title = !genuine
    ? `Not the certificate as issued: do not rely on ${fileName}`
    : status === "valid"
      ? `Genuine and valid: ${fileName} is certificate ${number} as issued`
      : `${fileName} is certificate ${number} as issued, but the certificate is ${status}: do not rely on it`;
  const sig = check.signature;
  const signatureWords = !sig.present
    ? "has no embedded digital signature."
    : sig.valid && sig.signedByLab
      ? `verifies: signed by ${sig.signer ?? "this laboratory"}${sig.signedAt ? ` on ${sig.signedAt}` : ""}, and the signed bytes are unchanged.`
      : sig.valid
        ? `verifies, but it was made with a key that is not this laboratory's (${sig.signer ?? "unknown signer"}).`
        : `does not verify: ${sig.reason}`;
  return (
    <Notice tone={genuine && status === "valid" ? "done" : "problem"} title={title} role="status">
      <ul className="list-disc pl-5" data-testid="check-result">
        <li>
          {fileName} is {check.byteIdentical ? "byte-identical to" : "not identical to"} the issued PDF.
        </li>
        <li>Its digital signature {signatureWords}</li>
        {status !== "valid" && <li>Certificate {number} itself is {status}: see its details below.</li>}
      </ul>
    </Notice>
  );
}
