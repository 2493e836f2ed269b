import type { DischargeResultRow } from "@/db/discharge-results";
import {
  computeMultipleOfIt,
  formatCompareHref,
  formatDischargeKey,
  pickOneSpecimenAtSeveralCurrents,
  pickSpecimensAtOneCurrent,
  type CompareQuery,
  type DischargeKey,
} from "@/lib/lots/results/compare-selection";
import { formatNumber } from "@/protocols";
import { HoverPrefetchLink } from "@/components/ui/hover-prefetch-link";

const it = (m: number) => `${formatNumber(m, { maxDecimals: 2 })} It`;

function Preset({ title, description, href, testId }: { title: string; description: string; href: string | null; testId: string }) {
  return (
    <li className="rounded border border-rule bg-white p-3" data-testid={testId}>
      <p className="font-semibold">{title}</p>
      <p className="mb-2 text-sm text-ink-soft">{description}</p>
      {href ? (
        <HoverPrefetchLink href={href} className="rounded border border-copper bg-copper px-3 py-1 text-sm font-medium text-paper hover:bg-copper-deep">
          Overlay these
        </HoverPrefetchLink>
      ) : (
        <p className="text-sm">Not enough reviewed discharges for this among the ones listed.</p>
      )}
    </li>
  );
}

/** The two usual comparisons, worked out from the discharges the filters allow. */
export function OverlayPresets({ query, pool }: { query: CompareQuery; pool: DischargeResultRow[] }) {
  const byKey = new Map(pool.map((r) => [formatDischargeKey(r), r]));
  const rowsOf = (keys: DischargeKey[]) => keys.map((k) => byKey.get(formatDischargeKey(k))!);
  const filters = { specificationId: query.specificationId, lotId: query.lotId, specimenId: query.specimenId };

  const oneSpecimen = rowsOf(pickOneSpecimenAtSeveralCurrents(pool, query.specimenId));
  const specimen = oneSpecimen[0]?.specimenIdentifier;
  const multiple = query.multipleOfIt ?? 0.2;
  const atOneCurrent = rowsOf(pickSpecimensAtOneCurrent(pool, multiple));
  const hrefOf = (rows: DischargeResultRow[], extra: Partial<CompareQuery>) =>
    rows.length >= 2 ? formatCompareHref({ ...filters, ...extra, chosen: rows.map((r) => ({ runNumber: r.runNumber, stepId: r.stepId, cycle: r.cycle })) }) : null;
  return (
    <section aria-labelledby="presets-heading">
      <h2 id="presets-heading" className="mb-2 text-lg font-bold">
        Quick choices
      </h2>
      <ul className="grid gap-3 md:grid-cols-2">
        <Preset
          testId="preset-one-specimen"
          title="One specimen at several currents"
          description={
            oneSpecimen.length >= 2
              ? `${specimen}: ${oneSpecimen.map((r) => it(computeMultipleOfIt(r))).join(", ")}.`
              : "A specimen with reviewed discharges at two or more currents."
          }
          href={hrefOf(oneSpecimen, { multipleOfIt: undefined })}
        />
        <Preset
          testId="preset-one-current"
          title={`Several specimens at one current (${it(multiple)})`}
          description={
            atOneCurrent.length >= 2
              ? `${atOneCurrent.length} specimens from the lowest capacity to the highest: ${atOneCurrent.map((r) => r.specimenIdentifier).join(", ")}. Choose another current below to change it.`
              : `Two or more specimens with a reviewed discharge at ${it(multiple)}.`
          }
          href={hrefOf(atOneCurrent, { multipleOfIt: multiple })}
        />
      </ul>
    </section>
  );
}
