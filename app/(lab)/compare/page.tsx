import type { Metadata } from "next";
import { preload } from "react-dom";
import { DischargeChooser } from "@/components/lot-results/discharge-chooser";
import { OverlayChart } from "@/components/lot-results/overlay-chart-lazy";
import { OverlayLegend } from "@/components/lot-results/overlay-legend";
import { OverlayPresets } from "@/components/lot-results/overlay-presets";
import { Notice } from "@/components/ui/notice";
import { PageHeader } from "@/components/ui/page-header";
import { PlainLink } from "@/components/ui/text-link";
import { getDb } from "@/db";
import { listCellSpecifications } from "@/db/cell-specifications";
import { listDischargeResults } from "@/lib/lots/results/list-discharge-results";
import { listLots } from "@/db/lots";
import { requirePageAccess } from "@/lib/auth/guards";
import { formatDischargeKey, isAtMultiple, readCompareQuery } from "@/lib/lots/results/compare-selection";
import { pickOverlayStyle, type OverlayStyle } from "@/lib/lots/results/overlay-style";
import { findChosenDischarges } from "@/lib/lots/results/read-overlay-series";
import { formatOverlaySeriesUrl } from "@/lib/lots/results/overlay-series-url";

export const metadata: Metadata = { title: "Compare discharges" };

export default async function ComparePage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  await requirePageAccess("/compare");
  const query = readCompareQuery(await searchParams);
  const [specifications, lots, pool, chosen] = await Promise.all([
    listCellSpecifications(getDb()),
    listLots(getDb(), query.specificationId ? { specificationId: query.specificationId } : {}),
    listDischargeResults(getDb(), { cellSpecificationId: query.specificationId, lotId: query.lotId, specimenId: query.specimenId }),
    query.chosen.length > 0 ? findChosenDischarges(query.chosen) : Promise.resolve({ found: [], missing: [] }),
  ]);
  const listed = query.multipleOfIt === undefined ? pool : pool.filter((r) => isAtMultiple(r, query.multipleOfIt!));
  const rows = chosen.found.map((f) => f.row);
  const styles: Record<string, OverlayStyle> = Object.fromEntries(rows.map((r, k) => [formatDischargeKey(r), pickOverlayStyle(k)]));
  const keys = rows.map(formatDischargeKey);
  const csv = new URLSearchParams(keys.map((k) => ["d", k])).toString();
  // The browser starts on the curves while the page's scripts load; the chart's own request then finds them.
  if (keys.length > 0) preload(formatOverlaySeriesUrl(keys), { as: "fetch", crossOrigin: "anonymous" });
  return (
    <>
      <PageHeader
        title="Compare discharges"
        lead="Voltage against capacity delivered, for reviewed discharges side by side: one specimen at several currents, or several specimens or cells at one current. The address holds the choice, so it can be shared."
      />
      <div className="flex flex-col gap-8">
        {query.ignored.length > 0 && (
          <Notice tone="caution" title="Part of the address was not understood">
            Left out: {query.ignored.join("; ")}.
          </Notice>
        )}
        <OverlayPresets query={query} pool={pool} />
        <section aria-labelledby="overlay-heading" className="flex flex-col gap-3">
          <div className="flex flex-wrap items-end justify-between gap-3">
            <h2 id="overlay-heading" className="text-lg font-bold">
              Overlay
            </h2>
            {rows.length > 0 && (
              <PlainLink href={`/api/compare/results.csv?${csv}`} className="text-sm">
                These discharges as CSV
              </PlainLink>
            )}
          </div>
          {chosen.missing.length > 0 && (
            <Notice tone="caution" title="Not found">
              {chosen.missing.map(formatDischargeKey).join(", ")}: no capacity discharge of a reviewed run has {chosen.missing.length === 1 ? "this name" : "these names"}.
            </Notice>
          )}
          {rows.length === 0 ? (
            <Notice>Nothing chosen yet: take one of the quick choices above, or tick discharges in the list below and press “Overlay the ticked discharges”.</Notice>
          ) : (
            <>
              <OverlayChart keys={keys} styles={styles} />
              <OverlayLegend rows={rows} styles={styles} />
            </>
          )}
        </section>
        <DischargeChooser query={query} specifications={specifications} lots={lots} pool={pool} listed={listed} chosenKeys={keys} />
      </div>
    </>
  );
}
