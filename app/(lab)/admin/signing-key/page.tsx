import type { Metadata } from "next";
import { Notice } from "@/components/ui/notice";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageAccess } from "@/lib/auth/guards";
import { describeLabSigningKey } from "@/lib/certificates/lab-signing-key";
import { formatDate } from "@/lib/format-date-time";
import { addDays } from "@/lib/instruments/calendar-date";
import { readLabToday } from "@/lib/instruments/lab-today";

export const metadata: Metadata = { title: "Signing key" };

const rowClass = "border-b border-rule py-1.5";

/** The key every certificate is signed with: what an assessor's PDF tool will show as the signer. */
export default async function SigningKeyPage() {
  await requirePageAccess("/admin/signing-key");
  const key = await describeLabSigningKey();
  // Dates as YYYY-MM-DD compare as text.
  const expiresSoon = formatDate(key.validTo) < addDays(readLabToday(), 60);
  return (
    <>
      <PageHeader
        title="Signing key"
        lead="Every certificate carries a PKCS#7 signature made with this key. A PDF tool (for example pdfsig) shows its subject as the signer; the public check page compares the fingerprint."
      />
      {key.source === "generated" && (
        <div className="mb-4">
          <Notice tone="caution" title="A key made by this installation">
            This key was created on first use and its certificate is self-signed, so PDF readers report the issuer as unknown even when the signature is intact. A lab that
            signs for customers sets <code>CELLWRIGHT_SIGNING_P12</code> and <code>CELLWRIGHT_SIGNING_PASSPHRASE</code> to a key issued by a certification authority it
            trusts. Certificates signed with a key that is later replaced still verify byte for byte, but the check page no longer calls
            them signed with the lab&apos;s current key.
            It is kept in the database, encrypted with the key in the server setting <code>CELLWRIGHT_SIGNING_KEY_ENCRYPTION_KEY</code>: keep a copy of that key
            safe and apart from the database backups, as a restore without it cannot sign with this key again.
          </Notice>
        </div>
      )}
      {expiresSoon && (
        <div className="mb-4">
          <Notice tone="problem" title="Expiring">
            The signing certificate expires on {formatDate(key.validTo)}. Arrange a new one before then.
          </Notice>
        </div>
      )}
      <dl className="figures grid max-w-4xl gap-x-6 text-sm sm:grid-cols-[14rem_1fr]">
        <dt className={`${rowClass} text-ink-soft`}>Signer (common name)</dt>
        <dd className={rowClass}>{key.commonName}</dd>
        <dt className={`${rowClass} text-ink-soft`}>Subject</dt>
        <dd className={rowClass}>{key.subject}</dd>
        <dt className={`${rowClass} text-ink-soft`}>SHA-256 fingerprint</dt>
        <dd className={`${rowClass} font-mono text-xs break-all`} data-testid="signing-fingerprint">
          {key.fingerprintSha256}
        </dd>
        <dt className={`${rowClass} text-ink-soft`}>Valid</dt>
        <dd className={rowClass}>
          {formatDate(key.validFrom)} to {formatDate(key.validTo)}
        </dd>
        <dt className="py-1.5 text-ink-soft">Where it comes from</dt>
        <dd className="py-1.5">
          {key.source === "configured"
            ? "configured by the lab: the key file named in the server's settings"
            : "created by this installation on first use, kept in the database and shared by every app server, encrypted with the key in the servers' settings"}
        </dd>
      </dl>
    </>
  );
}
