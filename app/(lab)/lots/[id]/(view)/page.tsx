import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { z } from "zod";
import { LotCertificateSection } from "@/components/lots/lot-certificate-section";
import { LotSamplingSections } from "@/components/lots/lot-sampling-sections";
import { LotSpecimensTable } from "@/components/lots/lot-specimens-table";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { listLotCertificates } from "@/db/certificates";
import { getLotSampling } from "@/lib/lots/sampling/read-lot-sampling";
import { getLot } from "@/db/lots";
import { listProcedures } from "@/db/procedures";
import { listSpecimens } from "@/db/specimens";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { findSampledRunsOperatedBy } from "@/lib/certificates/lot-certificate-basis";
import { offeredAqlColumns } from "@/lib/lots/sampling";
import { SIGNATURE_MEANING_WORDS } from "@/lib/signatures/sign-record";
import { formatNumber } from "@/protocols";
import { drawSampleAction, issueLotCertificateAction, setSamplingPlanAction } from "../actions";

export const metadata: Metadata = { title: "Lot" };

const linkClass = "rounded border border-rule bg-white px-3 py-1.5 text-sm hover:border-copper";

export default async function LotPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageAccess("/lots/[id]");
  const id = z.uuid().safeParse((await params).id);
  if (!id.success) notFound();
  const db = getDb();
  const [lot, specimens, sampling] = await Promise.all([getLot(db, id.data), listSpecimens(db, { lotId: id.data }), getLotSampling(db, id.data)]);
  if (!lot || !sampling) notFound();
  const manage = can(user.role, "specimen.manage");
  const planner = can(user.role, "lot.sample");
  const procedures = planner && !sampling.draw ? await listProcedures(db, { releasedOnly: true }) : [];
  const full = lot.specimenCount >= lot.quantityReceived;
  const signs = can(user.role, "certificate.sign");
  const [lotCertificates, operatedRuns] = await Promise.all([listLotCertificates(db, lot.id), signs ? findSampledRunsOperatedBy(db, lot.id, user.id) : Promise.resolve([])]);
  const mayIssue = signs && operatedRuns.length === 0 && !lotCertificates.some((c) => c.status === "valid");
  const row = "border-b border-rule py-1";
  return (
    <>
      <PageHeader
        title={`Lot ${lot.identifier}`}
        lead={
          <>
            <TextLink href={`/specs/${lot.specification.id}`}>
              {lot.specification.maker} {lot.specification.model}
            </TextLink>{" "}
            (<span className="font-mono">{lot.specification.designation}</span>) from {lot.supplier}
          </>
        }
        actions={
          <div className="flex flex-wrap gap-2">
            <Link href={`/lots/${lot.id}/statistics`} className={linkClass}>
              Statistics and rate capability
            </Link>
            {manage && (
              <Link href={`/lots/${lot.id}/edit`} className={linkClass}>
                Edit lot
              </Link>
            )}
          </div>
        }
      />
      <dl className="figures mb-8 grid max-w-3xl gap-x-6 gap-y-1 text-sm sm:grid-cols-[12rem_1fr]">
        <dt className={`${row} text-ink-soft`}>Quantity received</dt>
        <dd className={row}>{formatNumber(lot.quantityReceived)} cells (tray positions 1 to {formatNumber(lot.quantityReceived)})</dd>
        <dt className={`${row} text-ink-soft`}>Specimens registered</dt>
        <dd className={row} data-testid="specimen-count">
          {formatNumber(lot.specimenCount)}
        </dd>
        <dt className={`${row} text-ink-soft`}>Customer</dt>
        <dd className={row}>{lot.customer ?? "none: in-house work of the laboratory"}</dd>
        <dt className={`${row} text-ink-soft`}>Received on</dt>
        <dd className={row}>{lot.receivedOn}</dd>
        <dt className="py-1 text-ink-soft">Notes</dt>
        <dd className="py-1 whitespace-pre-line">{lot.notes ?? "none"}</dd>
      </dl>
      <LotSamplingSections
        lot={lot}
        sampling={sampling}
        can={{ plan: planner, register: manage && !full }}
        procedures={procedures.map((p) => ({ id: p.id, code: p.code, title: p.title }))}
        aqlLabels={offeredAqlColumns.map((c) => c.label)}
        actions={{ setPlan: setSamplingPlanAction, draw: drawSampleAction }}
      />
      <LotCertificateSection
        lot={lot}
        verdict={sampling.decision?.verdict ?? null}
        certificates={lotCertificates}
        signer={mayIssue ? { name: user.displayName, meaningWords: SIGNATURE_MEANING_WORDS.approved } : null}
        operatedRuns={operatedRuns}
        mayAmend={signs}
        action={issueLotCertificateAction}
      />
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
        <LotSpecimensTable specimens={specimens} drawnPositions={sampling.draw?.positions ?? null} />
      </section>
    </>
  );
}
