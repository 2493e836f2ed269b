import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { VersionComparison } from "@/components/procedures/version-comparison";
import { StatusBadge } from "@/components/procedures/status-badge";
import { SignatureManifestation } from "@/components/signatures/signature-manifestation";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { getProcedureVersion, listProcedureVersions } from "@/db/procedures";
import { requirePageAccess } from "@/lib/auth/guards";
import { versionParamsSchema } from "@/lib/procedures/version-params";
import { listReleaseSignatures, SIGNATURE_MEANING_WORDS } from "@/lib/signatures/sign-record";
import { describeCautionCode } from "@/protocols";
import { releaseAction } from "../../../actions";
import { ReleaseVersionForm } from "./release-version-form";

export const metadata: Metadata = { title: "Release a procedure version" };

const fmt = (d: Date) => d.toISOString().slice(0, 16).replace("T", " ");

/**
 * Before a second engineer signs a version as approved for use, the page shows what they approve:
 * every caution acknowledged on it (set-points beyond the cell's rating on purpose) and what changed
 * since the version before.
 */
export default async function ReleaseVersionPage({ params }: { params: Promise<{ id: string; n: string }> }) {
  const user = await requirePageAccess("/procedures/[id]/versions/[n]/release");
  const parsed = versionParamsSchema.safeParse(await params);
  if (!parsed.success) notFound();
  const v = await getProcedureVersion(getDb(), parsed.data.id, parsed.data.n);
  if (!v) notFound();
  const previous = (await listProcedureVersions(getDb(), v.procedureId)).filter((o) => o.number < v.number).sort((a, b) => b.number - a.number)[0];
  const wroteIt = v.author.id === user.id || v.submittedBy?.id === user.id;
  const signature = (await listReleaseSignatures(getDb(), [v.id])).get(v.id);
  return (
    <>
      <PageHeader
        title={`Release ${v.code} version ${v.number}`}
        lead={
          <>
            {v.title} <StatusBadge status={v.status} /> · written by {v.author.name}, last saved {fmt(v.updatedAt)} UTC
            {v.submittedBy && <> · submitted by {v.submittedBy.name}</>}
          </>
        }
        actions={
          <TextLink href={`/procedures/${v.procedureId}/versions/${v.number}`} className="text-sm">
            Read version {v.number} in full
          </TextLink>
        }
      />
      <section aria-labelledby="acknowledged" className="mb-6 rounded border-l-4 border-copper bg-copper-wash p-4">
        <h2 id="acknowledged" className="mb-2 text-lg font-bold">
          <span aria-hidden="true">⚠ </span>Cautions acknowledged on this version
        </h2>
        {v.acknowledgedCautions.length === 0 ? (
          <p className="text-sm">None: no set-point of this version was accepted beyond a cell&apos;s rating.</p>
        ) : (
          <>
            <p className="mb-1 text-sm">The author accepted these set-points beyond the cell&apos;s rating on purpose. By releasing you approve them too:</p>
            <ul className="list-inside list-disc text-sm" data-testid="release-cautions">
              {v.acknowledgedCautions.map((code) => (
                <li key={code}>{describeCautionCode(code, v.definition.steps)}</li>
              ))}
            </ul>
          </>
        )}
      </section>
      <section aria-labelledby="changes" className="mb-6">
        <h2 id="changes" className="mb-2 text-lg font-bold">
          {previous ? `What changed since version ${previous.number}` : "First version"}
        </h2>
        {previous ? (
          <VersionComparison before={previous} after={v} />
        ) : (
          <p className="text-sm">There is no earlier version to compare with: read this one in full before you sign.</p>
        )}
      </section>
      <section aria-labelledby="sign" className="max-w-2xl">
        <h2 id="sign" className="mb-2 text-lg font-bold">
          Sign the release
        </h2>
        {v.status !== "in_review" ? (
          <div className="flex flex-col gap-2 text-sm" role="status">
            {signature ? (
              <p>
                <SignatureManifestation signature={signature} />
              </p>
            ) : (
              <p>Version {v.number} is not in review, so there is nothing to release.</p>
            )}
            <TextLink href={`/procedures/${v.procedureId}`}>
              All versions of {v.code}
            </TextLink>
          </div>
        ) : wroteIt ? (
          <p className="text-sm" role="note">
            A second engineer must release this version: you wrote or submitted it.
          </p>
        ) : (
          <ReleaseVersionForm
            action={releaseAction}
            versionId={v.id}
            number={v.number}
            code={v.code}
            signerName={user.displayName}
            meaningWords={SIGNATURE_MEANING_WORDS.released}
            procedureHref={`/procedures/${v.procedureId}`}
          />
        )}
      </section>
    </>
  );
}
