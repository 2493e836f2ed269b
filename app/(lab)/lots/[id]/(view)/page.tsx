import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { z } from "zod";
import { SpecimensTable } from "@/components/specimens/specimens-table";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { getLot } from "@/db/lots";
import { listSpecimens } from "@/db/specimens";
import { requirePagePermission } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { formatNumber } from "@/protocols";

export const metadata: Metadata = { title: "Lot" };

export default async function LotPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePagePermission("run.read");
  const id = z.uuid().safeParse((await params).id);
  const [lot, specimens] = id.success ? await Promise.all([getLot(getDb(), id.data), listSpecimens(getDb(), { lotId: id.data })]) : [null, []];
  if (!lot) notFound();
  const manage = can(user.role, "specimen.manage");
  const full = lot.specimenCount >= lot.quantityReceived;
  return (
    <>
      <PageHeader
        title={`Lot ${lot.identifier}`}
        lead={
          <>
            <Link href={`/specs/${lot.specification.id}`} className="text-copper-deep underline">
              {lot.specification.maker} {lot.specification.model}
            </Link>{" "}
            (<span className="font-mono">{lot.specification.designation}</span>) from {lot.supplier}
          </>
        }
        actions={
          manage && (
            <Link href={`/lots/${lot.id}/edit`} className="rounded border border-rule bg-white px-3 py-1.5 text-sm hover:border-copper">
              Edit lot
            </Link>
          )
        }
      />
      <dl className="figures mb-8 grid max-w-3xl gap-x-6 gap-y-1 text-sm sm:grid-cols-[12rem_1fr]">
        <dt className="border-b border-rule py-1 text-ink-soft">Quantity received</dt>
        <dd className="border-b border-rule py-1">{formatNumber(lot.quantityReceived)} cells</dd>
        <dt className="border-b border-rule py-1 text-ink-soft">Specimens registered</dt>
        <dd className="border-b border-rule py-1" data-testid="specimen-count">
          {formatNumber(lot.specimenCount)}
        </dd>
        <dt className="border-b border-rule py-1 text-ink-soft">Received on</dt>
        <dd className="border-b border-rule py-1">{lot.receivedOn}</dd>
        <dt className="py-1 text-ink-soft">Notes</dt>
        <dd className="py-1 whitespace-pre-line">{lot.notes ?? "none"}</dd>
      </dl>
      <section aria-labelledby="specimens-heading">
        <div className="mb-2 flex flex-wrap items-end justify-between gap-3">
          <h2 id="specimens-heading" className="text-lg font-bold">
            Specimens of this lot
          </h2>
          {manage && !full && (
            <Link href={`/specimens/new?lot=${lot.id}`} className="rounded border border-copper bg-copper px-3 py-1.5 text-sm font-medium text-paper hover:bg-copper-deep">
              Register a specimen of this lot
            </Link>
          )}
        </div>
        <SpecimensTable specimens={specimens} showLot={false} />
      </section>
    </>
  );
}
