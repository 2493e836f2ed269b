import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { z } from "zod";
import { SpecimenRuns } from "@/components/runs/specimen-runs";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { listRunsPage, RUN_SORTS } from "@/db/runs";
import { getSpecimen } from "@/db/specimens";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { keptParams, PAGE_SIZE, parseListParams, type RawSearchParams } from "@/lib/lists/list-params";

export const metadata: Metadata = { title: "Specimen" };

export default async function SpecimenPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<RawSearchParams> }) {
  const user = await requirePageAccess("/specimens/[id]");
  const id = z.uuid().safeParse((await params).id);
  const specimen = id.success ? await getSpecimen(getDb(), id.data) : null;
  if (!specimen) notFound();
  const raw = await searchParams;
  const list = parseListParams(raw, { sorts: RUN_SORTS, defaultSort: "planned", defaultDirection: "desc" });
  const runs = await listRunsPage(getDb(), { specimenId: specimen.id }, { ...list, pageSize: PAGE_SIZE });
  const { specification: spec, lot } = specimen;
  return (
    <>
      <PageHeader
        title={`Specimen ${specimen.identifier}`}
        lead={`${spec.maker} ${spec.model}, received on ${specimen.receivedOn}`}
        actions={
          can(user.role, "specimen.manage") && (
            <Link href={`/specimens/${specimen.id}/edit`} className="rounded border border-rule bg-white px-3 py-1.5 text-sm hover:border-copper">
              Edit specimen
            </Link>
          )
        }
      />
      <dl className="grid max-w-3xl gap-x-6 gap-y-1 text-sm sm:grid-cols-[12rem_1fr]">
        <dt className="border-b border-rule py-1 text-ink-soft">Cell specification</dt>
        <dd className="border-b border-rule py-1">
          <TextLink href={`/specs/${spec.id}`}>
            {spec.maker} {spec.model}
          </TextLink>{" "}
          <span className="font-mono text-xs">{spec.designation}</span>
        </dd>
        <dt className="border-b border-rule py-1 text-ink-soft">Lot</dt>
        <dd className="border-b border-rule py-1">
          {lot ? (
            <TextLink href={`/lots/${lot.id}`}>
              {lot.identifier}
            </TextLink>
          ) : (
            "none: a loose specimen"
          )}
        </dd>
        {lot && (
          <>
            <dt className="border-b border-rule py-1 text-ink-soft">Tray position in the lot</dt>
            <dd className="figures border-b border-rule py-1">{specimen.lotPosition ?? "not recorded"}</dd>
          </>
        )}
        <dt className="border-b border-rule py-1 text-ink-soft">Received on</dt>
        <dd className="figures border-b border-rule py-1">{specimen.receivedOn}</dd>
        <dt className="border-b border-rule py-1 text-ink-soft">Condition on receipt</dt>
        <dd className="border-b border-rule py-1">{specimen.conditionOnReceipt}</dd>
        <dt className="py-1 text-ink-soft">Notes</dt>
        <dd className="py-1 whitespace-pre-line">{specimen.notes ?? "none"}</dd>
      </dl>
      <p className="mt-6 text-sm">
        <TextLink href={`/specimens/${specimen.id}/rate-capability`}>
          Rate capability: its reviewed discharges at each current
        </TextLink>
      </p>
      <SpecimenRuns runs={runs} path={`/specimens/${specimen.id}`} kept={keptParams(raw)} sort={{ key: list.sort, direction: list.direction }} />
    </>
  );
}
