import type { Metadata } from "next";
import Link from "next/link";
import { z } from "zod";
import { ActionLink } from "@/components/ui/action-link";
import { TextSearch } from "@/components/ui/text-search";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { listCellSpecifications } from "@/db/cell-specifications";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { formatNumber } from "@/protocols";

export const metadata: Metadata = { title: "Cell specifications" };

export default async function SpecsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageAccess("/specs");
  const q = z.string().trim().max(100).optional().catch(undefined).parse((await searchParams).q);
  const specs = await listCellSpecifications(getDb(), { q: q || undefined });
  return (
    <>
      <PageHeader
        title="Cell specifications"
        lead="Datasheet values of each cell type the lab tests. Procedures resolve their currents and voltages from these."
        actions={
          can(user.role, "spec.manage") && (
            <ActionLink href="/specs/new">
              New specification
            </ActionLink>
          )
        }
      />
      <TextSearch label="Maker, model or designation" value={q} />
      <div className="overflow-x-auto">
        <table className="figures w-full border-collapse text-sm">
          <thead>
            <tr className="border-b border-rule text-left">
              <th className="py-2 pr-3">Maker and model</th>
              <th className="py-2 pr-3">Designation</th>
              <th className="py-2 pr-3">Chemistry</th>
              <th className="py-2 pr-3 text-right">Rated capacity</th>
              <th className="py-2 pr-3 text-right">Charge voltage</th>
              <th className="py-2 pr-3 text-right">End-of-discharge</th>
              <th className="py-2 pr-3 text-right">Max. discharge</th>
              <th className="py-2">Datasheet</th>
            </tr>
          </thead>
          <tbody>
            {specs.map((s) => (
              <tr key={s.id} className="border-b border-rule">
                <td className="py-2 pr-3">
                  <Link href={`/specs/${s.id}`} className="font-medium text-copper-deep underline">
                    {s.maker} {s.model}
                  </Link>
                </td>
                <td className="py-2 pr-3 font-mono">{s.designation}</td>
                <td className="py-2 pr-3">{s.data.chemistry.label}</td>
                <td className="py-2 pr-3 text-right">{formatNumber(s.data.ratedCapacityMah)} mAh</td>
                <td className="py-2 pr-3 text-right">{formatNumber(s.data.chargeVoltageV, { minDecimals: 2 })} V</td>
                <td className="py-2 pr-3 text-right">{formatNumber(s.data.endOfDischargeVoltageV, { minDecimals: 2 })} V</td>
                <td className="py-2 pr-3 text-right">{formatNumber(s.data.maxContinuousDischargeCurrentA)} A</td>
                <td className="py-2">{s.datasheet ? "PDF on file" : "none"}</td>
              </tr>
            ))}
          </tbody>
        </table>
        {specs.length === 0 && <p className="py-6 text-ink-soft">No specifications match.</p>}
      </div>
    </>
  );
}
