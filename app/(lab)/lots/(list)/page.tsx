import type { Metadata } from "next";
import Link from "next/link";
import { z } from "zod";
import { ActionLink } from "@/components/ui/action-link";
import { TextSearch } from "@/components/ui/text-search";
import { PageHeader } from "@/components/ui/page-header";
import { getDb } from "@/db";
import { listLots } from "@/db/lots";
import { requirePageAccess } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { formatNumber } from "@/protocols";

export const metadata: Metadata = { title: "Lots" };

export default async function LotsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageAccess("/lots");
  const q = z.string().trim().max(100).optional().catch(undefined).parse((await searchParams).q);
  const lots = await listLots(getDb(), { q: q || undefined });
  return (
    <>
      <PageHeader
        title="Lots"
        lead="Cells received together from one supplier. The specimens drawn from a lot for testing are registered under it."
        actions={
          can(user.role, "specimen.manage") && (
            <ActionLink href="/lots/new">
              Register a lot
            </ActionLink>
          )
        }
      />
      <TextSearch label="Lot, supplier, maker or model" value={q} />
      <div className="overflow-x-auto">
        <table className="figures w-full border-collapse text-sm">
          <thead>
            <tr className="border-b border-rule text-left">
              <th className="py-2 pr-3">Lot</th>
              <th className="py-2 pr-3">Cell</th>
              <th className="py-2 pr-3">Supplier</th>
              <th className="py-2 pr-3 text-right">Cells received</th>
              <th className="py-2 pr-3 text-right">Specimens registered</th>
              <th className="py-2">Date received</th>
            </tr>
          </thead>
          <tbody>
            {lots.map((l) => (
              <tr key={l.id} className="border-b border-rule">
                <td className="py-2 pr-3">
                  <Link href={`/lots/${l.id}`} className="font-medium text-copper-deep underline">
                    {l.identifier}
                  </Link>
                </td>
                <td className="py-2 pr-3">
                  {l.specification.maker} {l.specification.model} <span className="font-mono text-xs text-ink-soft">{l.specification.designation}</span>
                </td>
                <td className="py-2 pr-3">{l.supplier}</td>
                <td className="py-2 pr-3 text-right">{formatNumber(l.quantityReceived)} cells</td>
                <td className="py-2 pr-3 text-right">{formatNumber(l.specimenCount)}</td>
                <td className="py-2 whitespace-nowrap">{l.receivedOn}</td>
              </tr>
            ))}
          </tbody>
        </table>
        {lots.length === 0 && <p className="py-6 text-ink-soft">No lots match.</p>}
      </div>
    </>
  );
}
