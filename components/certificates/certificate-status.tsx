import clsx from "clsx";
import type { CertificateStatus } from "@/db/certificates";

const WORDS: Record<CertificateStatus, { words: string; mark: string; tone: string }> = {
  valid: { words: "valid", mark: "✓", tone: "text-meets" },
  superseded: { words: "superseded", mark: "↷", tone: "text-unassessed" },
  revoked: { words: "revoked", mark: "✕", tone: "text-deviates" },
};

/** A certificate's state in words first; the mark and colour only support them. */
export function CertificateStatusWords({ status, className }: { status: CertificateStatus; className?: string }) {
  const w = WORDS[status];
  return (
    <span className={clsx("font-medium", w.tone, className)} data-status={status}>
      <span aria-hidden="true">{w.mark} </span>
      {w.words}
    </span>
  );
}
