import { CertificateStatusWords } from "@/components/certificates/certificate-status";
import { Notice } from "@/components/ui/notice";
import { PlainLink, TextLink } from "@/components/ui/text-link";
import type { CertificateStatus } from "@/db/certificates";
import type { ActionState } from "@/lib/forms/action-state";
import { formatDateTime } from "@/lib/format-date-time";
import type { LotVerdict } from "@/lib/lots/sampling";
import { IssueLotCertificateForm } from "./issue-lot-certificate-form";

interface Props {
  lot: { id: string; identifier: string };
  verdict: LotVerdict | null;
  certificates: { number: string; issuedAt: Date; status: CertificateStatus }[];
  /** Set for an engineer who may sign now: no valid certificate, a decision, and no sampled run of their own. */
  signer: { name: string; meaningWords: string } | null;
  /** The sampled runs this engineer operated: they may not sign the lot's certificate. */
  operatedRuns: string[];
  mayAmend: boolean;
  action: (prev: ActionState, form: FormData) => Promise<ActionState>;
}

const DECISION_WORDS: Record<Exclude<LotVerdict, "pending">, string> = { accept: "lot accepted", reject: "lot rejected" };

/** The lot page's certificate: issued ones with their PDF, or the form that signs and issues one once the lot is decided. */
export function LotCertificateSection({ lot, verdict, certificates, signer, operatedRuns, mayAmend, action }: Props) {
  const valid = certificates.find((c) => c.status === "valid");
  const decided = verdict === "accept" || verdict === "reject";
  return (
    <section aria-labelledby="lot-certificate-heading" className="mb-10">
      <h2 id="lot-certificate-heading" className="mb-3 text-lg font-bold">
        Lot certificate
      </h2>
      {certificates.length > 0 && (
        <ul className="mb-3 flex flex-col gap-1 text-sm" data-testid="lot-certificates">
          {certificates.map((c) => (
            <li key={c.number} className="flex flex-wrap items-baseline gap-x-3">
              <TextLink href={`/certificates/${c.number}`} className="font-mono font-medium">
                {c.number}
              </TextLink>
              <CertificateStatusWords status={c.status} />
              <span className="text-ink-soft">issued {formatDateTime(c.issuedAt)}</span>
              <PlainLink href={`/api/certificates/${c.number}/pdf`} download>
                Download the PDF of {c.number}
              </PlainLink>
            </li>
          ))}
        </ul>
      )}
      {valid ? (
        mayAmend && <p className="max-w-3xl text-sm text-ink-soft">To correct it, amend it from its page: a lot is certified once, and a correction is a new certificate that names the old one.</p>
      ) : !decided ? (
        <p className="max-w-3xl text-sm text-ink-soft">The lot certificate is issued once the sample has decided the lot (accept or reject); the decision is not made yet.</p>
      ) : signer ? (
        <IssueLotCertificateForm action={action} lotId={lot.id} lotIdentifier={lot.identifier} decisionWords={DECISION_WORDS[verdict]} signerName={signer.name} meaningWords={signer.meaningWords} />
      ) : operatedRuns.length > 0 ? (
        <Notice tone="caution" title="Another engineer signs this one">
          You operated {operatedRuns.length === 1 ? "run" : "runs"} {operatedRuns.join(", ")} of this lot&apos;s sample, so the lot certificate must be signed by an engineer who ran none of them.
        </Notice>
      ) : (
        <Notice>The lot is decided ({DECISION_WORDS[verdict]}); its certificate has not been issued yet. An engineer signs it to issue it.</Notice>
      )}
    </section>
  );
}
