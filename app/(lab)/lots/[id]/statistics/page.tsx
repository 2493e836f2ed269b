import type { Metadata } from "next";
import { RateCapabilityTableView } from "@/components/lot-results/rate-capability-table";
import { ResultsBasisNote } from "@/components/lot-results/results-basis-note";
import { StatisticsByCurrent } from "@/components/lot-results/statistics-by-current";
import { PageHeader } from "@/components/ui/page-header";
import { PlainLink, TextLink } from "@/components/ui/text-link";
import { requirePageAccess } from "@/lib/auth/guards";
import { formatCompareHref } from "@/lib/lots/results/compare-selection";
import { readOrNotFound } from "@/lib/read-or-not-found";
import { readLotResults } from "@/lib/lots/results/read-results";

export const metadata: Metadata = { title: "Lot statistics" };

export default async function LotStatisticsPage({ params }: { params: Promise<{ id: string }> }) {
  await requirePageAccess("/lots/[id]/statistics");
  const { lot, specification, results, statistics, rateCapability } = await readOrNotFound((await params).id, readLotResults);
  return (
    <>
      <PageHeader
        title={`Lot ${lot.identifier}: statistics`}
        lead={
          <>
            <TextLink href={`/lots/${lot.id}`}>
              Lot {lot.identifier}
            </TextLink>{" "}
            of{" "}
            <TextLink href={`/specs/${specification.id}`}>
              {specification.maker} {specification.model}
            </TextLink>
            : {statistics.resultCount} reviewed discharge result{statistics.resultCount === 1 ? "" : "s"} from {statistics.specimenCount} specimen
            {statistics.specimenCount === 1 ? "" : "s"}.
          </>
        }
        actions={
          <p className="text-sm" data-testid="exports">
            Download:{" "}
            <PlainLink href={`/api/lots/${lot.id}/results.csv`}>
              results as CSV
            </PlainLink>{" "}
            ·{" "}
            <PlainLink href={`/api/lots/${lot.id}/results.json`}>
              as JSON
            </PlainLink>{" "}
            ·{" "}
            <PlainLink href={`/api/lots/${lot.id}/summary`}>
              summary (JSON)
            </PlainLink>
          </p>
        }
      />
      <div className="flex flex-col gap-8">
        <ResultsBasisNote />
        <section aria-labelledby="statistics-heading">
          <h2 id="statistics-heading" className="mb-3 text-lg font-bold">
            Capacity and energy at each test current
          </h2>
          <StatisticsByCurrent summary={statistics} />
        </section>
        <section aria-labelledby="rate-heading">
          <div className="mb-2 flex flex-wrap items-end justify-between gap-3">
            <h2 id="rate-heading" className="text-lg font-bold">
              Rate capability of the lot
            </h2>
            {results.length > 0 && (
              <TextLink href={formatCompareHref({ lotId: lot.id, chosen: [] })} className="text-sm">
                Overlay this lot&apos;s discharges
              </TextLink>
            )}
          </div>
          <RateCapabilityTableView table={rateCapability} emptyWords="No reviewed discharge results in this lot yet: the table fills in as runs are accepted." />
        </section>
      </div>
    </>
  );
}
