import { SignatureManifestation } from "@/components/signatures/signature-manifestation";
import { Notice } from "@/components/ui/notice";
import { TextLink } from "@/components/ui/text-link";
import type { RunReviewView } from "@/lib/reviews/run-reviews";
import type { RunView } from "@/db/runs";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { formatDateTime } from "@/lib/format-date-time";
import { SIGNATURE_MEANING_WORDS } from "@/lib/signatures/sign-record";
import { issueCertificateAction } from "./actions";
import { IssueCertificateForm } from "./issue-certificate-form";

/** An accepted (or certified) run: the reviewer's signature and notes, then its certificate. */
export function AcceptedView({
  run,
  user,
  acceptance,
  certificates,
  mayIssue,
}: {
  run: RunView;
  user: SignedInUser;
  acceptance: RunReviewView | null;
  certificates: { number: string; issuedAt: Date; revoked: boolean }[];
  mayIssue: boolean;
}) {
  return (
    <div className="flex max-w-4xl flex-col gap-8">
      <section aria-labelledby="accepted-heading">
        <h2 id="accepted-heading" className="mb-2 text-lg font-semibold">
          Accepted
        </h2>
        {acceptance?.signature && (
          <p className="text-sm" data-testid="acceptance-signature">
            <SignatureManifestation signature={acceptance.signature} />
          </p>
        )}
        {acceptance && acceptance.acknowledgedDeviations.length > 0 && (
          <>
            <h3 className="mb-1 mt-4 font-semibold">The reviewer&apos;s notes on the deviations</h3>
            <ul className="list-disc pl-5 text-sm">
              {acceptance.acknowledgedDeviations.map((a) => (
                <li key={a.findingId}>
                  <strong>{a.findingTitle ?? a.findingId}</strong> — {a.note}
                </li>
              ))}
            </ul>
          </>
        )}
      </section>
      <section aria-labelledby="certificate-heading" className="flex flex-col gap-3">
        <h2 id="certificate-heading" className="text-lg font-semibold">
          Certificate
        </h2>
        {certificates.length > 0 && (
          <ul className="text-sm">
            {certificates.map((c) => (
              <li key={c.number}>
                <TextLink href={`/certificates/${c.number}`} className="font-mono">
                  {c.number}
                </TextLink>{" "}
                issued {formatDateTime(c.issuedAt)}
                {c.revoked ? " (revoked)" : ""}
              </li>
            ))}
          </ul>
        )}
        {mayIssue ? (
          <>
            {certificates.length === 0 && (
              <p className="text-sm">The run is accepted; its certificate is not issued yet. Issuing it signs it once more, with the meaning below.</p>
            )}
            <IssueCertificateForm
              action={issueCertificateAction}
              runId={run.id}
              runNumber={run.number}
              signerName={user.displayName}
              meaningWords={SIGNATURE_MEANING_WORDS.approved}
            />
          </>
        ) : (
          run.status === "accepted" && <Notice>The certificate of run {run.number} has not been issued yet. An engineer signs it to issue it.</Notice>
        )}
      </section>
    </div>
  );
}
