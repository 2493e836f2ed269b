import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { CertificateStatusWords } from "@/components/certificates/certificate-status";
import { CertificateCheck } from "@/components/certificates/check-pdf-upload";
import { VerdictWords } from "@/components/certificates/verdict-words";
import { Notice } from "@/components/ui/notice";
import { getDb } from "@/db";
import { getCertificateByNumber } from "@/db/certificates";
import { requirePageAccess } from "@/lib/auth/guards";
import { certificateNumberSchema } from "@/lib/certificate-list/certificate-number";
import { toPublicCertificate } from "@/lib/certificate-list/public-certificate";
import { formatDate, formatDateTime } from "@/lib/format-date-time";
import { SIGNATURE_MEANING_WORDS } from "@/lib/signatures/sign-record";

export const dynamic = "force-dynamic";

export async function generateMetadata({ params }: { params: Promise<{ number: string }> }): Promise<Metadata> {
  return { title: `Check certificate ${(await params).number}`, robots: { index: false } };
}

const rowClass = "border-b border-rule py-1.5";

export default async function CheckCertificatePage({ params }: { params: Promise<{ number: string }> }) {
  await requirePageAccess("/check/[number]");
  const parsed = certificateNumberSchema.safeParse((await params).number);
  const found = parsed.success ? await getCertificateByNumber(getDb(), parsed.data) : null;
  if (!found) notFound();
  const c = toPublicCertificate(found);
  return (
    <>
      <h1 className="mb-4 text-2xl font-bold">
        Certificate <span className="font-mono">{c.number}</span> is <CertificateStatusWords status={c.status} />
      </h1>
      <CertificateCheck
        number={c.number}
        status={c.status}
        banner={
          <>
            {c.status === "valid" && (
              <Notice tone="done" title="Valid">
                Issued by this laboratory and neither replaced nor revoked.
              </Notice>
            )}
            {c.status === "superseded" && (
              <Notice tone="caution" title="Superseded">
                This certificate was replaced by certificate <span className="font-mono">{c.replacedBy}</span>. Ask for the replacement; do not rely on this one.
              </Notice>
            )}
            {c.status === "revoked" && c.revoked && (
              <Notice tone="problem" title="Revoked">
                Revoked on {formatDate(c.revoked.at)}: {c.revoked.reason}. Do not rely on this certificate.
              </Notice>
            )}
          </>
        }
        details={
          <dl className="figures my-6 grid gap-x-6 gap-y-0 text-sm sm:grid-cols-[13rem_1fr]">
            <dt className={`${rowClass} text-ink-soft`}>Issued</dt>
            <dd className={rowClass}>{formatDate(c.issuedAt)}</dd>
            <dt className={`${rowClass} text-ink-soft`}>Laboratory</dt>
            <dd className={rowClass}>{c.lab}</dd>
            {c.specimen && (
              <>
                <dt className={`${rowClass} text-ink-soft`}>Specimen</dt>
                <dd className={rowClass}>{c.specimen}</dd>
              </>
            )}
            {c.lot && (
              <>
                <dt className={`${rowClass} text-ink-soft`}>Lot</dt>
                <dd className={rowClass}>{c.lot}</dd>
              </>
            )}
            <dt className={`${rowClass} text-ink-soft`}>Cell</dt>
            <dd className={rowClass}>{c.cell}</dd>
            <dt className={`${rowClass} text-ink-soft`}>Statement of conformity</dt>
            <dd className={rowClass}>
              <VerdictWords verdict={c.verdict} />
            </dd>
            <dt className={`${rowClass} text-ink-soft`}>Signed</dt>
            <dd className={rowClass}>
              {c.signedBy.printedName}, {formatDateTime(c.signedBy.signedAt)} — {SIGNATURE_MEANING_WORDS[c.signedBy.meaning]}
            </dd>
            {c.replaces && (
              <>
                <dt className={`${rowClass} text-ink-soft`}>Replaces</dt>
                <dd className={`${rowClass} font-mono`}>{c.replaces}</dd>
              </>
            )}
            <dt className="py-1.5 text-ink-soft">SHA-256 of the PDF as issued</dt>
            <dd className="py-1.5 font-mono text-xs break-all" data-testid="issued-sha256">
              {c.pdfSha256}
            </dd>
          </dl>
        }
        uploadIntro={
          <>
            <h2 id="upload-heading" className="mb-1 text-lg font-bold">
              Check the PDF you were given
            </h2>
            <p className="mb-3 text-sm text-ink-soft">
              The file is compared with the issued one byte for byte, and its embedded digital signature is verified. Nothing is stored.
            </p>
          </>
        }
      />
    </>
  );
}
