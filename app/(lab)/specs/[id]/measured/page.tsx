import type { Metadata } from "next";
import { DatasheetComparisonTable } from "@/components/lot-results/datasheet-comparison-table";
import { ResultsBasisNote } from "@/components/lot-results/results-basis-note";
import { StatisticsByCurrent } from "@/components/lot-results/statistics-by-current";
import { PageHeader } from "@/components/ui/page-header";
import { PlainLink, TextLink } from "@/components/ui/text-link";
import { requirePageAccess } from "@/lib/auth/guards";
import { formatCompareHref } from "@/lib/lots/results/compare-selection";
import { readOrNotFound } from "@/lib/read-or-not-found";
import { readSpecificationResults } from "@/lib/lots/results/read-results";

export const metadata: Metadata = { title: "Measured against the datasheet" };

export default async function SpecMeasuredPage({ params }: { params: Promise<{ id: string }> }) {
  await requirePageAccess("/specs/[id]/measured");
  const { specification, results, statistics, comparison } = await readOrNotFound((await params).id, readSpecificationResults);
  const lots = new Set(results.flatMap((r) => (r.lotIdentifier ? [r.lotIdentifier] : []))).size;
  return (
    <>
      <PageHeader
        title={`${specification.maker} ${specification.model}: measured against the datasheet`}
        lead={
          <>
            <TextLink href={`/specs/${specification.id}`}>
              The cell specification
            </TextLink>{" "}
            beside every reviewed result of its cells: {statistics.resultCount} discharge result{statistics.resultCount === 1 ? "" : "s"} from {statistics.specimenCount} specimen
            {statistics.specimenCount === 1 ? "" : "s"} in {lots} lot{lots === 1 ? "" : "s"}.
          </>
        }
        actions={
          <p className="text-sm">
            <PlainLink href={`/api/specs/${specification.id}/summary`}>
              Summary as JSON
            </PlainLink>
            {results.length > 0 && (
              <>
                {" "}
                ·{" "}
                <TextLink href={formatCompareHref({ specificationId: specification.id, chosen: [] })}>
                  Overlay its discharges
                </TextLink>
              </>
            )}
          </p>
        }
      />
      <div className="flex flex-col gap-8">
        <ResultsBasisNote />
        <section aria-labelledby="datasheet-heading">
          <h2 id="datasheet-heading" className="mb-3 text-lg font-bold">
            Datasheet against measured
          </h2>
          <DatasheetComparisonTable comparison={comparison} />
        </section>
        <section aria-labelledby="statistics-heading">
          <h2 id="statistics-heading" className="mb-3 text-lg font-bold">
            Capacity and energy at each test current
          </h2>
          <StatisticsByCurrent summary={statistics} />
        </section>
      </div>
    </>
  );
}
