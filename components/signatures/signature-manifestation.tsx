import type { SignatureMeaning } from "@/db/schema";
import { formatDateTime } from "@/lib/format-date-time";
import { SIGNATURE_MEANING_WORDS } from "@/lib/signatures/sign-record";

const SIGNED_AS: Record<SignatureMeaning, string> = { reviewed: "Reviewed", approved: "Approved", released: "Released" };

/**
 * A signature as every human-readable form of a signed record shows it (21 CFR 11.50): the signer's
 * printed name, the date and time, and what the signature means.
 */
export function SignatureManifestation({
  signature,
  subject,
}: {
  signature: { printedName: string; signedAt: Date; meaning: SignatureMeaning };
  /** What was signed, when it is not the record on screen: "certificate C-00003". */
  subject?: string;
}) {
  return (
    <span data-testid="signature-manifestation" data-meaning={signature.meaning}>
      <span aria-hidden="true">✍ </span>
      <strong className="font-semibold">
        {SIGNED_AS[signature.meaning]}
        {subject ? ` (${subject})` : ""} by {signature.printedName}
      </strong>
      , <span className="figures whitespace-nowrap">{formatDateTime(signature.signedAt)}</span> — meaning: {SIGNATURE_MEANING_WORDS[signature.meaning]}
    </span>
  );
}

/** The signatures of a record, one per line, oldest first; nothing when it carries none. */
export function SignatureList({
  signatures,
  className,
}: {
  signatures: readonly { id: string; printedName: string; signedAt: Date; meaning: SignatureMeaning; certificateNumber?: string | null }[];
  className?: string;
}) {
  if (signatures.length === 0) return null;
  return (
    <ul className={className} aria-label="Electronic signatures">
      {signatures.map((s) => (
        <li key={s.id}>
          <SignatureManifestation signature={s} subject={s.certificateNumber ? `certificate ${s.certificateNumber}` : undefined} />
        </li>
      ))}
    </ul>
  );
}
