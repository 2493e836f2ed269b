import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { CertificateChangeForms } from "@/components/certificates/certificate-change-forms";
import { CertificateStatusWords } from "@/components/certificates/certificate-status";
import { VerdictWords } from "@/components/certificates/verdict-words";
import { Notice } from "@/components/ui/notice";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { getCertificateByNumber } from "@/db/certificates";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { certificateNumberSchema } from "@/lib/certificate-list/certificate-number";
import { formatDateTime } from "@/lib/format-date-time";
import { SIGNATURE_MEANING_WORDS } from "@/lib/signatures/sign-record";
import { amendCertificateAction, revokeCertificateAction } from "../actions";

export async function generateMetadata({ params }: { params: Promise<{ number: string }> }): Promise<Metadata> {
  return { title: `Certificate ${(await params).number}` };
}

const rowClass = "border-b border-rule py-1";

export default async function CertificatePage({ params }: { params: Promise<{ number: string }> }) {
  const user = await requirePageAccess("/certificates/[number]");
  const number = certificateNumberSchema.safeParse((await params).number);
  const c = number.success ? await getCertificateByNumber(getDb(), number.data) : null;
  if (!c) notFound();
  const mayChange = can(user.role, "certificate.sign") && c.status === "valid";
  return (
    <>
      <PageHeader
        title={`Certificate ${c.number}`}
        lead={
          <>
            <CertificateStatusWords status={c.status} /> · <VerdictWords verdict={c.verdict} /> · {c.cellLabel}, {c.specimenIdentifier ? `specimen ${c.specimenIdentifier}` : `lot ${c.lotIdentifier}`}
          </>
        }
        actions={
          <div className="flex flex-wrap gap-2">
            <a href={`/api/certificates/${c.number}/pdf`} className="rounded border border-copper bg-copper px-3 py-1.5 text-sm font-medium text-paper hover:bg-copper-deep">
              Download the PDF
            </a>
            {(c.runId || c.lotId) && (
              <a href={`/api/certificates/${c.number}/evidence`} className="rounded border border-rule bg-white px-3 py-1.5 text-sm hover:border-copper">
                Download the evidence bundle (zip)
              </a>
            )}
          </div>
        }
      />
      <div className="mb-6 flex flex-col gap-3">
        {c.status === "superseded" && (
          <Notice tone="caution" title="Superseded">
            Replaced by{" "}
            <TextLink href={`/certificates/${c.replacedByNumber}`} className="font-mono">
              {c.replacedByNumber}
            </TextLink>
            . Rely on the replacement, not on this certificate.
          </Notice>
        )}
        {c.status === "revoked" && (
          <Notice tone="problem" title="Revoked">
            Revoked {c.revokedAt && formatDateTime(c.revokedAt)} by {c.revokedByName}: {c.revocationReason}
          </Notice>
        )}
        {c.replacesNumber && (
          <Notice title="Amendment">
            Replaces{" "}
            <TextLink href={`/certificates/${c.replacesNumber}`} className="font-mono">
              {c.replacesNumber}
            </TextLink>
            : {c.amendmentReason}
          </Notice>
        )}
      </div>
      <dl className="figures mb-8 grid max-w-4xl gap-x-6 gap-y-1 text-sm sm:grid-cols-[14rem_1fr]">
        <dt className={`${rowClass} text-ink-soft`}>Issued</dt>
        <dd className={rowClass}>
          {formatDateTime(c.issuedAt)} by {c.issuedByName}
        </dd>
        <dt className={`${rowClass} text-ink-soft`}>Signature</dt>
        <dd className={rowClass} data-testid="certificate-signature">
          {c.signature.printedName}, {formatDateTime(c.signature.signedAt)} — meaning: {SIGNATURE_MEANING_WORDS[c.signature.meaning]}
        </dd>
        {c.runId && (
          <>
            <dt className={`${rowClass} text-ink-soft`}>Run</dt>
            <dd className={rowClass}>
              <TextLink href={`/runs/${c.runId}/results`}>
                {c.runNumber}
              </TextLink>{" "}
              (findings, results and plots, read-only) ·{" "}
              <TextLink href={`/runs/${c.runId}/history`}>
                its review and audit trail
              </TextLink>
            </dd>
          </>
        )}
        {c.lotIdentifier && (
          <>
            <dt className={`${rowClass} text-ink-soft`}>Lot</dt>
            <dd className={rowClass}>
              <TextLink href={`/lots/${c.lotId}`}>
                {c.lotIdentifier}
              </TextLink>
            </dd>
          </>
        )}
        <dt className={`${rowClass} text-ink-soft`}>SHA-256 of the PDF</dt>
        <dd className={`${rowClass} font-mono text-xs break-all`} data-testid="pdf-sha256">
          {c.pdfSha256}
        </dd>
        <dt className={`${rowClass} text-ink-soft`}>SHA-256 of what it states</dt>
        <dd className={`${rowClass} font-mono text-xs break-all`}>{c.payloadSha256}</dd>
        <dt className="py-1 text-ink-soft">Public check page</dt>
        <dd className="py-1">
          <TextLink href={`/check/${c.number}`}>
            /check/{c.number}
          </TextLink>{" "}
          — anyone holding the PDF can confirm it there without signing in.
        </dd>
      </dl>
      {mayChange && (
        <section aria-labelledby="change-heading">
          <h2 id="change-heading" className="mb-2 text-lg font-bold">
            Amend or revoke
          </h2>
          <CertificateChangeForms number={c.number} amend={amendCertificateAction} revoke={revokeCertificateAction} />
        </section>
      )}
    </>
  );
}
