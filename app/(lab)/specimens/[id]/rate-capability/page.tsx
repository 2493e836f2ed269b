import type { Metadata } from "next";
import { RateCapabilityTableView } from "@/components/lot-results/rate-capability-table";
import { ResultsBasisNote } from "@/components/lot-results/results-basis-note";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { requirePageAccess } from "@/lib/auth/guards";
import { formatCompareHref, pickOneSpecimenAtSeveralCurrents } from "@/lib/lots/results/compare-selection";
import { readOrNotFound } from "@/lib/read-or-not-found";
import { readSpecimenResults } from "@/lib/lots/results/read-results";
import { formatNumber } from "@/protocols";
import { HoverPrefetchLink } from "@/components/ui/hover-prefetch-link";

export const metadata: Metadata = { title: "Rate capability" };

export default async function SpecimenRateCapabilityPage({ params }: { params: Promise<{ id: string }> }) {
  await requirePageAccess("/specimens/[id]/rate-capability");
  const { specimen, specification, results, rateCapability } = await readOrNotFound((await params).id, readSpecimenResults);
  const overlay = pickOneSpecimenAtSeveralCurrents(results, specimen.id);
  return (
    <>
      <PageHeader
        title={`Specimen ${specimen.identifier}: rate capability`}
        lead={
          <>
            <TextLink href={`/specimens/${specimen.id}`}>
              Specimen {specimen.identifier}
            </TextLink>
            , {specification.maker} {specification.model} (It = {formatNumber(specification.data.ratedCapacityMah / 1000, { maxDecimals: 4 })} A, maximum continuous discharge current{" "}
            {formatNumber(specification.data.maxContinuousDischargeCurrentA, { maxDecimals: 3 })} A).
          </>
        }
        actions={
          overlay.length > 1 && (
            <HoverPrefetchLink href={formatCompareHref({ specimenId: specimen.id, chosen: overlay })} className="rounded border border-rule bg-white px-3 py-1.5 text-sm hover:border-copper">
              Overlay its discharges
            </HoverPrefetchLink>
          )
        }
      />
      <div className="flex flex-col gap-6">
        <ResultsBasisNote />
        <RateCapabilityTableView table={rateCapability} emptyWords="This specimen has no reviewed discharge result yet." />
        {results.length > 0 && (
          <section aria-labelledby="discharges-heading">
            <h2 id="discharges-heading" className="mb-2 text-lg font-bold">
              The discharges behind the table
            </h2>
            <ul className="list-disc pl-5 text-sm">
              {results.map((r) => (
                <li key={`${r.runId}-${r.stepId}-${r.cycle}`}>
                  <TextLink href={`/runs/${r.runId}/results`}>
                    Run {r.runNumber}
                  </TextLink>{" "}
                  ({r.procedureCode}, {r.runStatus}): {r.stepLabel}
                  {r.cycle > 1 ? ` (cycle ${r.cycle})` : ""}, {formatNumber(r.currentA, { minDecimals: 3, maxDecimals: 3 })} A,{" "}
                  {formatNumber(r.capacityAh * 1000, { maxDecimals: 0 })} mAh
                </li>
              ))}
            </ul>
          </section>
        )}
      </div>
    </>
  );
}
