import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { z } from "zod";
import { StatusBadge } from "@/components/procedures/status-badge";
import { SignatureManifestation } from "@/components/signatures/signature-manifestation";
import { VersionActionForm } from "@/components/procedures/version-actions";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { listProcedureVersions, type ProcedureVersionView } from "@/db/procedures";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import type { SignedInUser } from "@/lib/auth/signed-in-user";
import { canSeeVersion } from "@/lib/procedures/read-access";
import { listReleaseSignatures } from "@/lib/signatures/sign-record";
import { describeStatus } from "@/lib/procedures/lifecycle";
import { returnToDraftAction, startNewDraftAction, submitForReviewAction, withdrawAction } from "../actions";
import { SelectField } from "@/components/ui/select-field";

export const metadata: Metadata = { title: "Procedure" };

const fmt = (d: Date) => d.toISOString().slice(0, 16).replace("T", " ");

export default async function ProcedurePage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageAccess("/procedures/[id]");
  const id = z.uuid().safeParse((await params).id);
  if (!id.success) notFound();
  const versions = (await listProcedureVersions(getDb(), id.data)).filter((v) => canSeeVersion(user, v.status));
  const newest = versions[0];
  if (!newest) notFound();
  const releaseSignatures = await listReleaseSignatures(getDb(), versions.map((v) => v.id));
  const hasOpen = versions.some((v) => v.status === "draft" || v.status === "in_review");
  return (
    <>
      <PageHeader
        title={newest.title}
        lead={
          <>
            <span className="font-mono">{newest.code}</span> · {newest.definition.header.standard}, clause {newest.definition.header.clause}
          </>
        }
      />
      <h2 className="mb-2 text-lg font-bold">Versions</h2>
      <ol className="flex flex-col gap-3">
        {versions.map((v) => (
          <li key={v.id} className="rounded border border-rule bg-paper p-4" data-testid={`version-${v.number}`}>
            <div className="flex flex-wrap items-baseline gap-3">
              <TextLink href={`/procedures/${v.procedureId}/versions/${v.number}`} className="font-serif text-lg font-bold">
                Version {v.number}
              </TextLink>
              <StatusBadge status={v.status} />
              <span className="text-sm text-ink-soft">{v.title}</span>
            </div>
            <VersionHistory v={v} />
            {releaseSignatures.get(v.id) && (
              <p className="mt-1 text-sm">
                <SignatureManifestation signature={releaseSignatures.get(v.id)!} />
              </p>
            )}
            {can(user.role, "procedure.author") && <LifecycleControls user={user} v={v} hasOpen={hasOpen} />}
          </li>
        ))}
      </ol>
      {versions.length > 1 && (
        <form action={`/procedures/${newest.procedureId}/compare`} className="mt-6 flex flex-wrap items-end gap-2">
          <h2 className="w-full text-lg font-bold">Compare two versions</h2>
          <VersionSelect name="a" label="Earlier" versions={versions} defaultValue={versions[1]!.number} />
          <VersionSelect name="b" label="Later" versions={versions} defaultValue={versions[0]!.number} />
          <button type="submit" className="rounded border border-rule bg-white px-3 py-1.5 text-sm hover:border-copper">
            Compare
          </button>
        </form>
      )}
    </>
  );
}

function VersionHistory({ v }: { v: ProcedureVersionView }) {
  return (
    <ul className="mt-1 text-sm text-ink-soft">
      <li>Written by {v.author.name}, last saved {fmt(v.updatedAt)} UTC</li>
      {v.submittedBy && <li>Submitted for review by {v.submittedBy.name}, {fmt(v.submittedBy.at)} UTC</li>}
      {v.releasedBy && <li>Released by {v.releasedBy.name}, {fmt(v.releasedBy.at)} UTC</li>}
      {v.withdrawn && (
        <li>
          Withdrawn by {v.withdrawn.by}, {fmt(v.withdrawn.at)} UTC: {v.withdrawn.reason}
        </li>
      )}
    </ul>
  );
}

function LifecycleControls({ user, v, hasOpen }: { user: SignedInUser; v: ProcedureVersionView; hasOpen: boolean }) {
  const wroteIt = v.author.id === user.id || v.submittedBy?.id === user.id;
  return (
    <div className="mt-3 flex flex-wrap gap-3">
      {v.status === "draft" && (
        <>
          <Link href={`/procedures/${v.procedureId}/versions/${v.number}/edit`} className="self-start rounded border border-copper bg-copper px-3 py-1.5 text-sm font-medium text-paper">
            Edit draft
          </Link>
          <VersionActionForm action={submitForReviewAction} versionId={v.id} label="Submit for review" />
        </>
      )}
      {v.status === "in_review" && (
        <>
          {wroteIt ? (
            <p className="text-sm text-ink-soft">Waiting for a second engineer: you cannot release a version you wrote or submitted.</p>
          ) : (
            <Link
              href={`/procedures/${v.procedureId}/versions/${v.number}/release`}
              className="self-start rounded border border-copper bg-copper px-3 py-1.5 text-sm font-medium text-paper"
            >
              Release version {v.number}…
            </Link>
          )}
          <VersionActionForm action={returnToDraftAction} versionId={v.id} label="Return to draft" reasonLabel="Comment for the author" />
        </>
      )}
      {v.status === "released" && (
        <>
          {!hasOpen && <VersionActionForm action={startNewDraftAction} versionId={v.id} label="Start a new draft from this version" />}
          <VersionActionForm action={withdrawAction} versionId={v.id} label="Withdraw" variant="danger" reasonLabel="Reason for withdrawal" />
        </>
      )}
    </div>
  );
}

function VersionSelect({ name, label, versions, defaultValue }: { name: string; label: string; versions: ProcedureVersionView[]; defaultValue: number }) {
  return (
    <SelectField filter label={label} name={name} defaultValue={defaultValue}>
      {versions.map((v) => (
        <option key={v.id} value={v.number}>
          version {v.number} ({describeStatus(v.status)})
        </option>
      ))}
    </SelectField>
  );
}
